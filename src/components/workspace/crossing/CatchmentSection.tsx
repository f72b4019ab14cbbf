import type { CrossingDetailView } from '../../../lib/schemas/crossing-view';
import { Facts, type Fact } from './Facts';
import { formatArea, formatMetres, formatValue } from './format';
import { Section } from './Section';

/** The drainage line's upstream area and, when traced, the catchment that feeds the crossing. */
export function CatchmentSection({ crossing }: { crossing: CrossingDetailView }) {
  const catchment = crossing.design?.catchment ?? null;
  if (!catchment && crossing.upstreamAreaHa === null) return null;
  const rows: Fact[] = [];
  if (crossing.upstreamAreaHa !== null) rows.push(['Upstream area of the drainage line', formatArea(crossing.upstreamAreaHa)]);
  if (catchment) {
    const { longestFlowPathM } = catchment;
    rows.push(
      ['Catchment traced to the crossing', formatArea(catchment.areaHa)],
      ['Longest flow path', longestFlowPathM >= 1000 ? formatValue(longestFlowPathM / 1000, 2, 'km') : formatMetres(longestFlowPathM, 0)],
      ['Equal-area slope', formatValue(catchment.equalAreaSlopeMPerKm, 1, 'm/km')],
    );
  }
  return (
    <Section title="Catchment">
      <Facts rows={rows} />
    </Section>
  );
}
