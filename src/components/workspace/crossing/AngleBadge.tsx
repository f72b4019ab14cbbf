import type { CSSProperties } from 'react';
import type { AngleClass, CrossingSummaryView } from '../../../lib/schemas/crossing-view';
import { PLAN_COLOURS } from '../../map/plan-layers';
import { CrossingSymbol } from './CrossingSymbol';
import { ANGLE_CLASS_LABEL } from './labels';

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
function badgeStyle(angleClass: AngleClass): CSSProperties {
  const colour = PLAN_COLOURS.angle[angleClass];
  return { borderColor: colour, backgroundColor: `${colour}26`, color: '#2b211a' };
}
