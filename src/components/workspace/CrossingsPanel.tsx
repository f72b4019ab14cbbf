import { useMemo, useState } from 'react';
import type { AngleClass, CrossingSummaryView, DesignStatus } from '../../lib/schemas/crossing-view';
import type { FenceLine } from '../../lib/schemas/plan';
import { PLAN_COLOURS } from '../map/plan-layers';

// ---- shared with the crossing detail and the map key ---------------------------------------

export const ANGLE_CLASS_LABEL: Record<AngleClass, string> = { good: 'Good', fair: 'Fair', poor: 'Poor' };

export const DESIGN_STATUS_LABEL: Record<DesignStatus, string> = {
  designed: 'Designed',
  'needs-input': 'Needs a flood mark',
  'no-channel': 'No defined channel',
  failed: 'Could not be designed',
  touch: 'Only touches a drainage line',
  'runs-along': 'Runs along a drainage line',
  'no-terrain': 'No terrain under it yet',
};

const numberFormat = new Intl.NumberFormat('en-AU', { maximumFractionDigits: 0 });

/** Metres along a fence line, e.g. "1,241 m". */
export function formatChainage(chainageM: number): string {
  return `${numberFormat.format(chainageM)} m`;
}

/** A number with a fixed count of decimals and its unit, or a dash when unknown. */
export function formatValue(value: number | null | undefined, digits: number, unit: string): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  return `${value.toLocaleString('en-AU', { minimumFractionDigits: digits, maximumFractionDigits: digits })}${unit ? ` ${unit}` : ''}`;
}

/** Upstream area: whole hectares from 10 ha, one decimal below. */
export function formatArea(areaHa: number | null | undefined): string {
  if (areaHa === null || areaHa === undefined) return '—';
  return formatValue(areaHa, areaHa >= 10 ? 0 : 1, 'ha');
}

/**
 * The crossing's map symbol, for the key and the list: a dot in the class colour (white rim),
 * with a dark ring for fair and poor and a "!" for poor; hollow when not designed.
 */
export function CrossingSymbol({ angleClass, designed, size = 24 }: { angleClass: AngleClass | null; designed: boolean; size?: number }) {
  const colour = angleClass ? PLAN_COLOURS.angle[angleClass] : PLAN_COLOURS.angleNone;
  const ringed = angleClass === 'fair' || angleClass === 'poor';
  return (
    <svg aria-hidden="true" width={size} height={size} viewBox="0 0 24 24" className="shrink-0">
      {ringed && <circle cx="12" cy="12" r="10.5" fill="none" stroke={PLAN_COLOURS.ink} strokeWidth="2" />}
      <circle
        cx="12"
        cy="12"
        r={designed ? 7.5 : 6.5}
        fill={designed ? colour : PLAN_COLOURS.casing}
        stroke={designed ? PLAN_COLOURS.casing : colour}
        strokeWidth={designed ? 2 : 3.5}
      />
      {angleClass === 'poor' && (
        <text
          x="12"
          y="16.6"
          textAnchor="middle"
          fontSize="13"
          fontWeight="700"
          fill={designed ? '#ffffff' : PLAN_COLOURS.ink}
          stroke={designed ? PLAN_COLOURS.ink : 'none'}
          strokeWidth="0.6"
        >
          !
        </text>
      )}
    </svg>
  );
}

/** The crossing angle with its class in words and symbol, e.g. "88° · Good". */
export function AngleBadge({ crossing }: { crossing: Pick<CrossingSummaryView, 'angleDeg' | 'angleClass' | 'designStatus'> }) {
  const { angleDeg, angleClass } = crossing;
  return (
    <span className="inline-flex items-center gap-1.5 font-semibold tabular-nums">
      <CrossingSymbol angleClass={angleClass} designed={crossing.designStatus === 'designed'} size={22} />
      {angleDeg === null ? 'No angle' : `${Math.round(angleDeg)}°`}
      {angleClass && (
        <span className="rounded-md border px-1.5 text-xs uppercase tracking-wide" style={badgeStyle(angleClass)}>
          {ANGLE_CLASS_LABEL[angleClass]}
        </span>
      )}
    </span>
  );
}

/** Badge colours: the class colour as a border and a light wash, with dark text that reads in sun. */
function badgeStyle(angleClass: AngleClass): React.CSSProperties {
  const colour = PLAN_COLOURS.angle[angleClass];
  return { borderColor: colour, backgroundColor: `${colour}26`, color: '#2b211a' };
}

// ---- the list ------------------------------------------------------------------------------

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
            <ul className="mt-3 flex flex-col gap-2" aria-label="Crossings">
              {shown.map((crossing) => (
                <li key={crossing.id}>
                  <CrossingRow crossing={crossing} selected={crossing.id === selectedId} onSelect={onSelect} />
                </li>
              ))}
            </ul>
          )}
        </>
      )}
    </section>
  );
}

function CrossingRow({ crossing, selected, onSelect }: { crossing: CrossingSummaryView; selected: boolean; onSelect: (id: number) => void }) {
  const status = DESIGN_STATUS_LABEL[crossing.designStatus] ?? crossing.designStatus;
  const notes = [
    crossing.kind === 'crosses-twice' ? 'crosses more than once here' : null,
    crossing.designStatus === 'designed' && crossing.provisional ? 'provisional' : null,
  ].filter(Boolean);
  return (
    <button
      type="button"
      data-testid="crossing-row"
      aria-pressed={selected}
      onClick={() => onSelect(crossing.id)}
      className={`flex min-h-11 w-full flex-col gap-1 rounded-lg border px-3 py-2 text-left transition-colors hover:bg-sand-100 ${
        selected ? 'border-bark-900 bg-sand-100 ring-2 ring-bark-900' : 'border-sand-300 bg-white'
      }`}
    >
      <span className="flex w-full items-baseline justify-between gap-2">
        <span className="font-semibold text-bark-900">{crossing.fenceName}</span>
        <span className="shrink-0 text-sm tabular-nums text-bark-700">at {formatChainage(crossing.chainageM)}</span>
      </span>
      <span className="flex w-full flex-wrap items-center justify-between gap-x-3 gap-y-1 text-sm">
        <AngleBadge crossing={crossing} />
        <span className="text-bark-700">
          {crossing.upstreamAreaHa !== null && <span className="tabular-nums">{formatArea(crossing.upstreamAreaHa)} · </span>}
          <span className={crossing.designStatus === 'designed' ? 'font-semibold text-saltbush-700' : ''}>{status}</span>
        </span>
      </span>
      {notes.length > 0 && <span className="text-xs text-bark-500">{notes.join(' · ')}</span>}
    </button>
  );
}
