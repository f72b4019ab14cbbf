import type { DesignedCrossingView } from '../../../lib/schemas/crossing-view';
import { Section } from './Section';
import { Why } from './Why';

/** A unit as written after a quantity: nothing for a count, "rolls" for more than one roll. */
const unitOf = (unit: string, quantity: number) => (unit === 'each' ? '' : unit === 'roll' && quantity !== 1 ? 'rolls' : unit);

/** The bill of materials for this crossing, with how each item was counted. */
export function MaterialsSection({ materials }: { materials: DesignedCrossingView['materials'] }) {
  const { items, warnings } = materials;
  if (items.length === 0) return null;
  return (
    <Section title="Materials for this crossing">
      <div className="mt-2 overflow-x-auto">
        <table className="w-full text-left text-sm">
          <thead>
            <tr className="border-b border-sand-300 text-bark-700">
              <th className="py-1 pr-2 font-semibold">Item</th>
              <th className="py-1 text-right font-semibold">Quantity</th>
            </tr>
          </thead>
          <tbody>
            {items.map((item, index) => (
              <tr key={`${item.code}-${index}`} className="border-b border-sand-200 align-top">
                <td className="py-1.5 pr-2">{item.description}</td>
                <td className="py-1.5 text-right tabular-nums whitespace-nowrap">
                  {Number.isInteger(item.quantity) ? item.quantity : item.quantity.toFixed(1)} {unitOf(item.unit, item.quantity)}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <Why summary="How each was counted">
        <ul className="mb-2 list-disc space-y-1 pl-5 text-bark-700">
          {items.map((item, index) => (
            <li key={`${item.code}-${index}`}>
              <span className="font-semibold text-bark-900">{item.description}:</span> {item.reason}
            </li>
          ))}
        </ul>
      </Why>
      {warnings.map((warning) => (
        <p key={warning} className="mt-2 rounded-lg border-l-4 border-ochre-600 bg-sand-100 px-3 py-2 text-sm">
          {warning}
        </p>
      ))}
    </Section>
  );
}
