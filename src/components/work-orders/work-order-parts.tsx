import type { WorkOrderMaterials, WorkOrderProgress } from '../../lib/schemas/work-order';

const money = new Intl.NumberFormat('en-AU', { style: 'currency', currency: 'AUD' });
export const formatCents = (cents: number) => money.format(cents / 100);
export const formatDay = (isoDate: string) =>
  new Date(`${isoDate.slice(0, 10)}T00:00:00Z`).toLocaleDateString('en-AU', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });

/** Share of items done, as a bar with the counts in words beside it. */
export function ProgressBar({ progress, label }: { progress: WorkOrderProgress; label?: string }) {
  const words = [`${progress.done} of ${progress.total} done`, progress.started ? `${progress.started} started` : '', progress.blocked ? `${progress.blocked} blocked` : '']
    .filter(Boolean)
    .join(' · ');
  return (
    <div className="flex flex-col gap-1" data-testid="order-progress">
      <div
        role="progressbar"
        aria-label={label ?? 'Work done'}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={progress.percentDone}
        aria-valuetext={words}
        className="h-3 w-full overflow-hidden rounded-full bg-sand-200"
      >
        <div className="h-full rounded-full bg-saltbush-700" style={{ width: `${progress.percentDone}%` }} />
      </div>
      <p className="text-sm text-bark-700" data-testid="progress-words">
        {words}
      </p>
    </div>
  );
}

/** The order's materials: one line per item, the unpriced ones named, and the totals. */
export function MaterialsTable({ materials }: { materials: WorkOrderMaterials }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm" data-testid="materials">
        <thead>
          <tr className="border-b border-sand-300">
            <th className="py-1 pr-2">Item</th>
            <th className="py-1 pr-2 text-right">Quantity</th>
            <th className="py-1 text-right">Cost</th>
          </tr>
        </thead>
        <tbody>
          {materials.lines.map((line) => (
            <tr key={`${line.code}-${line.unit}-${line.unitPriceCents}`} className="border-b border-sand-200">
              <td className="py-1 pr-2">{line.description}</td>
              <td className="py-1 pr-2 text-right tabular-nums">
                {line.quantity} {line.unit}
              </td>
              <td className="py-1 text-right tabular-nums">{formatCents(line.totalCents)}</td>
            </tr>
          ))}
          {materials.unpriced.map((item) => (
            <tr key={`${item.code}-${item.unit}`} className="border-b border-sand-200">
              <td className="py-1 pr-2">{item.description}</td>
              <td className="py-1 pr-2 text-right tabular-nums">
                {item.quantity} {item.unit}
              </td>
              <td className="py-1 text-right">no price</td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          <tr>
            <td className="py-1 pr-2" colSpan={2}>
              Materials
            </td>
            <td className="py-1 text-right tabular-nums">{formatCents(materials.materialsCents)}</td>
          </tr>
          <tr>
            <td className="py-1 pr-2" colSpan={2}>
              Labour, {materials.labourDays.toFixed(1)} crew days
            </td>
            <td className="py-1 text-right tabular-nums">{formatCents(materials.labourCents)}</td>
          </tr>
          <tr className="font-bold">
            <td className="py-1 pr-2" colSpan={2}>
              Total{materials.complete ? '' : ' (some items have no price)'}
            </td>
            <td className="py-1 text-right tabular-nums" data-testid="order-total">
              {formatCents(materials.totalCents)}
            </td>
          </tr>
        </tfoot>
      </table>
    </div>
  );
}
