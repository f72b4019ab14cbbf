import type { AngleClass } from '../../../lib/schemas/crossing-view';
import { PLAN_COLOURS } from '../../map/plan-layers';

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
