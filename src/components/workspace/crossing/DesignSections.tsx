import type { CrossingSummaryView, DesignedCrossingView } from '../../../lib/schemas/crossing-view';
import { FloodSection } from './FloodSection';
import { LayoutSection } from './LayoutSection';
import { MaterialsSection } from './MaterialsSection';
import { ProfileChart } from './ProfileChart';
import { DesignWarnings } from './WarningsAndCautions';
import { WireAndLoadsSection } from './WireAndLoadsSection';

type Props = {
  design: DesignedCrossingView;
  /** Where the crossing is on its fence: the profile chart measures from it and names the fence. */
  crossing: Pick<CrossingSummaryView, 'chainageM' | 'fenceName'>;
  onEditInputs?: () => void;
};

/** A designed crossing, in the order a builder reads it: ground, flood, layout, checks, materials, warnings. */
export function DesignSections({ design, crossing, onEditInputs }: Props) {
  return (
    <>
      {design.provisional && (
        <p className="mt-4 rounded-lg border border-clay-600 bg-clay-100 p-3 text-sm text-bark-900" role="status">
          <strong>Provisional:</strong> the flood spreads past the ground known here, or an end strainer could not be proven to stand on dry ground. Check
          the place on foot, in dry weather, before building.
        </p>
      )}
      {design.profile && design.profile.length > 1 && <ProfileChart design={design} crossingChainageM={crossing.chainageM} fenceName={crossing.fenceName} />}
      <FloodSection floods={design.floods} onEditInputs={onEditInputs} />
      <LayoutSection layout={design.layout} />
      <WireAndLoadsSection wireCheck={design.wireCheck} loads={design.loads} />
      <MaterialsSection materials={design.materials} />
      <DesignWarnings warnings={design.warnings} />
    </>
  );
}
