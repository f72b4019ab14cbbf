import { useMemo } from 'react';
import type { CrossingSummaryView } from '../../lib/schemas/crossing-view';
import type { FenceLine } from '../../lib/schemas/plan';
import { FENCE_STATUS_STYLES } from '../map/plan-layers';
import { useFirstRows } from './ShowMore';

const kmFormat = new Intl.NumberFormat('en-AU', { minimumFractionDigits: 1, maximumFractionDigits: 1 });

/** How many fence lines, how long in all, and each with its status and crossings; a row opens the fence line. */
export function FenceLinesSummary({
  fenceLines,
  loading,
  error,
  crossings,
  onSelect,
}: {
  fenceLines: FenceLine[];
  loading: boolean;
  error: Error | null;
  crossings: CrossingSummaryView[];
  onSelect: (fenceLineId: number) => void;
}) {
  const totalKm = fenceLines.reduce((sum, fence) => sum + fence.lengthM, 0) / 1000;
  const rows = useFirstRows(fenceLines.length);
  // Counted once, not by scanning every crossing for each of a big station's fence lines.
  const crossingCounts = useMemo(() => {
    const counts = new Map<number, number>();
    for (const c of crossings) if (c.kind !== 'runs-along') counts.set(c.fenceLineId, (counts.get(c.fenceLineId) ?? 0) + 1);
    return counts;
  }, [crossings]);
  return (
    <section className="card p-4" aria-labelledby="fences-heading">
      <h2 id="fences-heading" className="font-bold">Fence lines</h2>
      {loading ? (
        <p className="mt-1 text-sm text-bark-700">Loading…</p>
      ) : error ? (
        <p className="alert-error mt-2 text-sm" role="alert">The fence lines could not be loaded: {error.message}</p>
      ) : fenceLines.length === 0 ? (
        <p className="mt-1 text-sm text-bark-700">No fence lines yet.</p>
      ) : (
        <>
          <p className="mt-1 text-sm text-bark-700">
            {fenceLines.length} {fenceLines.length === 1 ? 'fence line' : 'fence lines'}, {kmFormat.format(totalKm)} km in all.
          </p>
          <ul className="mt-2 flex flex-col divide-y divide-sand-200 text-sm">
            {fenceLines.slice(0, rows.limit).map((fence) => {
              const count = crossingCounts.get(fence.id) ?? 0;
              return (
                <li key={fence.id}>
                  <button
                    type="button"
                    className="flex min-h-11 w-full items-center justify-between gap-2 py-1.5 text-left hover:bg-sand-100"
                    onClick={() => onSelect(fence.id)}
                    data-testid="fence-row"
                  >
                    <span className="min-w-0">
                      <span className="block truncate font-semibold">{fence.name}</span>
                      <span className="text-bark-700">
                        {FENCE_STATUS_STYLES[fence.status].label} · {count} {count === 1 ? 'crossing' : 'crossings'}
                      </span>
                    </span>
                    <span className="shrink-0 tabular-nums">{kmFormat.format(fence.lengthM / 1000)} km</span>
                  </button>
                </li>
              );
            })}
          </ul>
          {rows.more}
        </>
      )}
    </section>
  );
}
