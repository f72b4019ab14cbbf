import type { LoadsView, WireCheckView } from '../../../lib/schemas/crossing-view';
import { Facts } from './Facts';
import { formatKilonewtons, formatMetres, formatValue } from './format';
import { Section } from './Section';
import { Why } from './Why';

/** What the flood does to the fence: the wire check on the flex runs, and the loads on the wires and end strainers. */
export function WireAndLoadsSection({ wireCheck, loads }: { wireCheck: WireCheckView | null; loads: LoadsView | null }) {
  return (
    <>
      {wireCheck && (
        <Section title="Wire check">
          <Facts
            rows={[
              ['Flex run each side', formatMetres(wireCheck.flexRunEachSideM, 0)],
              ['Set by', wireCheck.governedBy],
              ['Extra wire when pushed by the flood', formatMetres(wireCheck.extraLengthM, 3)],
              ['Tension rise', formatKilonewtons(wireCheck.tensionIncreaseN)],
              ['Wire tension, flood on it', formatKilonewtons(wireCheck.totalTensionN)],
              ['Allowed tension', formatKilonewtons(wireCheck.allowedTensionN)],
            ]}
          />
          <Why reasons={wireCheck.reasons} summary="Working and method">
            <p className="mb-2 text-bark-700">{wireCheck.method}</p>
          </Why>
        </Section>
      )}
      {loads && (
        <Section title="Flood loads">
          <Facts
            rows={[
              ['On the bare wires', formatValue(loads.bareWiresKn, 2, 'kN')],
              ['On a debris mat', formatValue(loads.debrisMatKn, 2, 'kN')],
              ['Total downstream', formatValue(loads.totalKn, 2, 'kN')],
              ['At each end strainer', formatValue(loads.eachEndStrainerKn, 2, 'kN')],
            ]}
          />
          <p className="mt-2 rounded-lg border border-ochre-600 bg-sand-100 p-2 text-sm font-semibold text-bark-900">{loads.caution}</p>
          <Why reasons={loads.reasons} summary="Working and method">
            <p className="mb-2 text-bark-700">{loads.method}</p>
          </Why>
        </Section>
      )}
    </>
  );
}
