import type { CrossingSummaryView } from '../../../lib/schemas/crossing-view';
import { AngleBadge } from './AngleBadge';
import { formatArea, formatChainage } from './format';
import { DESIGN_STATUS_LABEL } from './labels';

/** One crossing in the list: a button showing its fence, chainage, angle, catchment and design status. */
export function CrossingRow({ crossing, selected, onSelect }: { crossing: CrossingSummaryView; selected: boolean; onSelect: (id: number) => void }) {
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
      {crossing.redesign && (
        <span data-testid="redesign-flag" className="self-start rounded border-2 border-[#7a1f6a] px-1.5 text-xs font-semibold text-[#7a1f6a]">
          Failed in two floods: reconsider its style
        </span>
      )}
    </button>
  );
}
