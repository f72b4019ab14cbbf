/**
 * The wire a parabolic span holds beyond its straight length, computed without cancellation.
 */
import { checkNumber } from './check-number';

/**
 * Extra wire L − l in a parabolic span of horizontal length `spanM` with mid-span sag `sagM`, where
 * L is the exact arc length of y = 4 f x (l − x) / l²:
 *
 *   L = (l / 2) · [√(1 + s²) + asinh(s) / s],  s = 4f / l (the slope at the supports), so
 *   L − l = (l / 2) · [s² / (√(1 + s²) + 1) + (asinh(s) / s − 1)].
 *
 * For a small slope, asinh(s)/s − 1 is taken from its series −s²/6 + 3s⁴/40 − 5s⁶/112 so that a
 * tiny sag gives a tiny, positive extra length instead of rounding noise. To first order
 * L − l ≈ 8f² / 3l, the series L = l [1 + (8/3)(f/l)² − (32/5)(f/l)⁴ + …] of Beer & Johnston,
 * *Vector Mechanics for Engineers: Statics*, cables (parabolic cable).
 *
 * @param spanM - horizontal distance between the supports, metres, > 0
 * @param sagM - mid-span sag (or sideways deflection) from the chord, metres, ≥ 0
 * @returns the extra length, metres, ≥ 0 (0 when the sag is 0)
 * @throws RangeError when the span is not a positive number or the sag is negative
 */
export function parabolaExtraLengthM(spanM: number, sagM: number): number {
  const l = checkNumber(spanM, { name: 'spanM', what: 'the span', unit: 'm', min: 0, minExclusive: true });
  const f = checkNumber(sagM, { name: 'sagM', what: 'the sag', unit: 'm', min: 0 });
  const s = (4 * f) / l;
  // A sag so small that the slope underflows leaves the wire straight.
  if (s === 0) return 0;
  const s2 = s * s;
  const asinhOverSMinusOne = s < 1e-2 ? s2 * (-1 / 6 + s2 * (3 / 40 - (5 / 112) * s2)) : Math.asinh(s) / s - 1;
  return (l / 2) * (s2 / (Math.sqrt(1 + s2) + 1) + asinhOverSMinusOne);
}
