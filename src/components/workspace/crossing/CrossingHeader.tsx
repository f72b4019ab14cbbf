import type { RefObject } from 'react';
import type { CrossingSummaryView } from '../../../lib/schemas/crossing-view';
import { AngleBadge } from './AngleBadge';
import { formatChainage } from './format';
import { ANGLE_CLASS_LABEL, DESIGN_STATUS_LABEL } from './labels';

type Props = {
  summary: CrossingSummaryView;
  /** Focused when the detail is brought into view. */
  headingRef: RefObject<HTMLHeadingElement | null>;
  onClose: () => void;
  notice: string | null;
};

/** Which crossing this is, what just happened to it, and its angle, class and design status. */
export function CrossingHeader({ summary, headingRef, onClose, notice }: Props) {
  return (
    <>
      <div className="flex items-start justify-between gap-2">
        <div>
          <h2 id="crossing-detail-heading" ref={headingRef} tabIndex={-1} className="font-bold focus:outline-none">
            Crossing on {summary.fenceName}
          </h2>
          <p className="text-sm text-bark-700">
            {formatChainage(summary.chainageM)} along the fence
            {summary.streamOrder !== null ? ` · stream order ${summary.streamOrder}` : ''}
          </p>
        </div>
        <button type="button" className="btn-quiet shrink-0 px-3" onClick={onClose}>
          Close
        </button>
      </div>

      {/* Always in the page, so screen readers announce a notice when one arrives. */}
      <p role="status" className={notice ? 'mt-3 rounded-lg border border-saltbush-500 bg-saltbush-100 p-3 text-sm font-semibold text-bark-900' : 'sr-only'}>
        {notice}
      </p>
      <AngleSummary summary={summary} />
    </>
  );
}

function AngleSummary({ summary }: { summary: CrossingSummaryView }) {
  const { angleDeg, angleClass } = summary;
  return (
    <div className="mt-3 rounded-lg bg-sand-100 p-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <AngleBadge crossing={summary} />
        <span className="text-sm font-semibold text-bark-700">{DESIGN_STATUS_LABEL[summary.designStatus] ?? summary.designStatus}</span>
      </div>
      <p className="mt-2 text-sm text-bark-900" data-testid="crossing-angle">
        {angleDeg === null
          ? 'No crossing angle: the fence does not cross this drainage line.'
          : `Crosses the flow at ${Math.round(angleDeg)}°, ${Math.round(Math.abs(90 - angleDeg))}° off square: ${angleClass ? ANGLE_CLASS_LABEL[angleClass].toLowerCase() : 'unclassed'}.`}
      </p>
      <p className="mt-1 text-xs text-bark-700">90° is square to the flow, where a floodgate is shortest and floods do fences least harm.</p>
    </div>
  );
}
