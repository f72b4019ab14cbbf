import { useMemo, useState } from 'react';
import type { AngleClass, CrossingSummaryView } from '../../lib/schemas/crossing-view';
import type { FenceLine } from '../../lib/schemas/plan';
import { CrossingRow } from './crossing/CrossingRow';
import { CrossingSymbol } from './crossing/CrossingSymbol';
import { useFirstRows } from './ShowMore';

// The map key (LayerToggles) draws its crossing symbols with this.
export { CrossingSymbol };

type SortKey = 'fence' | 'angle' | 'area';
type ClassFilter = AngleClass | 'none';

const SORTS: { key: SortKey; label: string }[] = [
  { key: 'fence', label: 'Fence, then chainage' },
  { key: 'angle', label: 'Worst angle first' },
  { key: 'area', label: 'Largest catchment first' },
];

const CLASS_FILTERS: { key: ClassFilter; label: string }[] = [
  { key: 'poor', label: 'Poor' },
  { key: 'fair', label: 'Fair' },
  { key: 'good', label: 'Good' },
  { key: 'none', label: 'No angle' },
];

/** How far from square a crossing is, degrees; crossings without an angle sort last. */
const offSquare = (crossing: CrossingSummaryView) => (crossing.angleDeg === null ? -1 : Math.abs(90 - crossing.angleDeg));

type Props = {
  crossings: CrossingSummaryView[];
  fenceLines: FenceLine[];
  loading: boolean;
  error: Error | null;
  /** A finished terrain run exists: without one there are no drainage lines to cross. */
  hasTerrain: boolean;
  selectedId: number | null;
  onSelect: (crossingId: number) => void;
};

/** Every place a fence line meets a drainage line: sortable, filterable, each a button that opens its design. */
export default function CrossingsPanel({ crossings, fenceLines, loading, error, hasTerrain, selectedId, onSelect }: Props) {
  const [sort, setSort] = useState<SortKey>('fence');
  const [classes, setClasses] = useState<ReadonlySet<ClassFilter>>(() => new Set<ClassFilter>(['poor', 'fair', 'good', 'none']));
  const [fenceId, setFenceId] = useState<number | 'all'>('all');

  const counts = useMemo(() => {
    const result: Record<ClassFilter, number> = { good: 0, fair: 0, poor: 0, none: 0 };
    for (const crossing of crossings) result[crossing.angleClass ?? 'none'] += 1;
    return result;
  }, [crossings]);

  const shown = useMemo(() => {
    const fenceOrder = new Map(fenceLines.map((fence, index) => [fence.id, index]));
    const kept = crossings.filter((c) => classes.has(c.angleClass ?? 'none') && (fenceId === 'all' || c.fenceLineId === fenceId));
    const byFence = (a: CrossingSummaryView, b: CrossingSummaryView) =>
      (fenceOrder.get(a.fenceLineId) ?? 0) - (fenceOrder.get(b.fenceLineId) ?? 0) || a.fenceName.localeCompare(b.fenceName) || a.chainageM - b.chainageM;
    const compare: Record<SortKey, (a: CrossingSummaryView, b: CrossingSummaryView) => number> = {
      fence: byFence,
      angle: (a, b) => offSquare(b) - offSquare(a) || byFence(a, b),
      area: (a, b) => (b.upstreamAreaHa ?? -1) - (a.upstreamAreaHa ?? -1) || byFence(a, b),
    };
    return [...kept].sort(compare[sort]);
  }, [crossings, fenceLines, classes, fenceId, sort]);
  const rows = useFirstRows(shown.length);

  const toggleClass = (key: ClassFilter) =>
    setClasses((current) => {
      const next = new Set(current);
      if (next.has(key)) next.delete(key);
      else next.add(key);
      return next;
    });

  const fencesWithCrossings = fenceLines.filter((fence) => crossings.some((c) => c.fenceLineId === fence.id));

  return (
    <section className="card p-4" aria-labelledby="crossings-heading" data-testid="crossings-panel">
      <h2 id="crossings-heading" className="font-bold">Crossings</h2>
      {loading ? (
        <p className="mt-1 text-sm text-bark-700">Loading crossings…</p>
      ) : error ? (
        <p className="alert-error mt-2 text-sm" role="alert">The crossings could not be loaded: {error.message}</p>
      ) : crossings.length === 0 ? (
        <p className="mt-1 text-sm text-bark-700">
          {fenceLines.length === 0
            ? 'No fence lines yet. Every place a fence line meets a drainage line will be listed here with its crossing angle and design.'
            : hasTerrain
              ? 'None of the fence lines meets a drainage line.'
              : 'Crossings are found once a terrain run has drawn the drainage lines.'}
        </p>
      ) : (
        <>
          <p className="mt-1 text-sm text-bark-700">
            {crossings.length} {crossings.length === 1 ? 'place' : 'places'} where a fence meets a drainage line: {counts.poor} poor, {counts.fair} fair,{' '}
            {counts.good} good{counts.none ? `, ${counts.none} without an angle` : ''}. Cross as near square to the flow as the country allows.
          </p>

          <div className="mt-3 flex flex-col gap-3">
            <fieldset>
              <legend className="text-sm font-semibold text-bark-700">Show angle classes</legend>
              <div className="mt-1 flex flex-wrap gap-2">
                {CLASS_FILTERS.filter((filter) => filter.key !== 'none' || counts.none > 0).map((filter) => (
                  <button
                    key={filter.key}
                    type="button"
                    aria-pressed={classes.has(filter.key)}
                    onClick={() => toggleClass(filter.key)}
                    className="btn-quiet min-h-11 gap-1.5 px-3 text-sm aria-pressed:border-bark-700 aria-pressed:bg-sand-100 aria-[pressed=false]:text-bark-500 aria-[pressed=false]:line-through"
                  >
                    <CrossingSymbol angleClass={filter.key === 'none' ? null : filter.key} designed size={20} />
                    {filter.label} ({counts[filter.key]})
                  </button>
                ))}
              </div>
            </fieldset>
            <div className="grid grid-cols-1 gap-3 sm:grid-cols-2 md:grid-cols-1 lg:grid-cols-2">
              <div className="field">
                <label htmlFor="crossing-fence-filter">Fence line</label>
                <select
                  id="crossing-fence-filter"
                  value={fenceId}
                  onChange={(event) => setFenceId(event.target.value === 'all' ? 'all' : Number(event.target.value))}
                >
                  <option value="all">All fence lines</option>
                  {fencesWithCrossings.map((fence) => (
                    <option key={fence.id} value={fence.id}>
                      {fence.name}
                    </option>
                  ))}
                </select>
              </div>
              <div className="field">
                <label htmlFor="crossing-sort">Sort by</label>
                <select id="crossing-sort" value={sort} onChange={(event) => setSort(event.target.value as SortKey)}>
                  {SORTS.map((option) => (
                    <option key={option.key} value={option.key}>
                      {option.label}
                    </option>
                  ))}
                </select>
              </div>
            </div>
          </div>

          {shown.length === 0 ? (
            <p className="mt-3 text-sm text-bark-700">No crossings match these filters.</p>
          ) : (
            <>
              <ul className="mt-3 flex flex-col gap-2" aria-label="Crossings">
                {shown.slice(0, rows.limit).map((crossing) => (
                  <li key={crossing.id}>
                    <CrossingRow crossing={crossing} selected={crossing.id === selectedId} onSelect={onSelect} />
                  </li>
                ))}
              </ul>
              {rows.more}
            </>
          )}
        </>
      )}
    </section>
  );
}
