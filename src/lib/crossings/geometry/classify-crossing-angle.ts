import type { AngleClass } from './types';

/** Tolerances of the angle classes, degrees off square (0 ≤ good ≤ fair ≤ 90). */
export interface AngleTolerances {
  readonly goodWithinDeg: number;
  readonly fairWithinDeg: number;
}

/**
 * Classes a crossing angle by how far it is from square (90°): `good` when within
 * `goodWithinDeg` of square (inclusive), `fair` when within `fairWithinDeg` (inclusive), else
 * `poor`. Defaults in `findCrossings` are 20° and 45°. The aim of crossing as square as the
 * country allows is common practice (see DESIGN.md; WA Water and Rivers Commission, Water Note
 * WN19, 2000: "cross at right angles"); the tolerances are our choice, no published source.
 *
 * @param crossingAngleDeg - acute angle between fence and flow, 0…90 degrees
 * @throws RangeError when the angle is not a number between 0 and 90
 */
export function classifyCrossingAngle(crossingAngleDeg: number, tolerances: AngleTolerances): AngleClass {
  if (!(Number.isFinite(crossingAngleDeg) && crossingAngleDeg >= 0 && crossingAngleDeg <= 90)) {
    throw new RangeError(`crossing angle must be degrees between 0 and 90, got ${crossingAngleDeg}`);
  }
  const offSquareDeg = 90 - crossingAngleDeg;
  if (offSquareDeg <= tolerances.goodWithinDeg) return 'good';
  if (offSquareDeg <= tolerances.fairWithinDeg) return 'fair';
  return 'poor';
}
