/**
 * Exact arc length of a parabolic cable span.
 */
import { checkNumber } from './check-number';
import { parabolaExtraLengthM } from './parabola-extra-length';

/**
 * Length of wire in a parabolic span of horizontal length `spanM` with mid-span sag `sagM`, the
 * exact arc length of y = 4 f x (l − x) / l²:
 *
 *   L = (l² / 8f) · [s √(1 + s²) + asinh s],  s = 4f / l (the slope at the supports),
 *
 * evaluated as l + {@link parabolaExtraLengthM} to stay exact for small sags.
 *
 * A parabola is the shape of a cable under a load spread evenly along the span (Beer & Johnston,
 * *Vector Mechanics for Engineers: Statics*, cables with distributed loads); its length series
 * l [1 + (8/3)(f/l)² − (32/5)(f/l)⁴ + …] is the expansion of this closed form.
 *
 * @param spanM - horizontal distance between the supports, metres, > 0
 * @param sagM - mid-span sag (or sideways deflection) measured from the chord, metres, ≥ 0
 * @returns the length of the curved wire, metres (equal to `spanM` when the sag is 0)
 * @throws RangeError when the span is not a positive number or the sag is negative
 */
export function parabolaArcLengthM(spanM: number, sagM: number): number {
  const l = checkNumber(spanM, { name: 'spanM', what: 'the span', unit: 'm', min: 0, minExclusive: true });
  return l + parabolaExtraLengthM(l, sagM);
}
