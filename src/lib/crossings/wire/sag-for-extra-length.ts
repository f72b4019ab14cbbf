/**
 * The sag of a parabolic span that takes up a given extra length of wire.
 */
import { checkNumber } from './check-number';
import { parabolaExtraLengthM } from './parabola-extra-length';

/** The sag that makes a span's wire `extraLengthM` longer than the span, two ways, metres. */
export interface SagForExtraLength {
  readonly spanM: number;
  readonly extraLengthM: number;
  /** Sag at which the exact parabola is `spanM + extraLengthM` long (bisection). */
  readonly sagM: number;
  /** The small-sag approximation √(3 l Δ / 8), from the first term of the length series. */
  readonly smallSagApproximationM: number;
}

/**
 * Inverts the parabolic cable length: the mid-span sag f at which a span l holds l + Δ of wire.
 *
 * Keeping the first term of L = l [1 + (8/3)(f/l)² − …] gives f ≈ √(3 l Δ / 8) (Beer & Johnston,
 * *Vector Mechanics for Engineers: Statics*, cables: a cable of length l + Δ over a span l). The
 * exact value is found by bisection on the exact parabola's extra length ({@link parabolaExtraLengthM}),
 * which grows with f; it lies between 0 and the sag of two straight halves of total length l + Δ,
 * √((l + Δ)² − l²) / 2, since a curve is longer than its chords.
 *
 * @param spanM - horizontal distance between the supports, metres, > 0
 * @param extraLengthM - wire beyond the span, metres, ≥ 0
 * @returns the exact and approximate sags, metres
 * @throws RangeError when the span is not a positive number or the extra length is negative
 */
export function sagForExtraLength(spanM: number, extraLengthM: number): SagForExtraLength {
  const l = checkNumber(spanM, { name: 'spanM', what: 'the span', unit: 'm', min: 0, minExclusive: true });
  const delta = checkNumber(extraLengthM, { name: 'extraLengthM', what: 'the extra length of wire', unit: 'm', min: 0 });
  let lo = 0;
  // √((l + Δ)² − l²) / 2, written to avoid cancellation for a small Δ.
  let hi = Math.sqrt(delta * (2 * l + delta)) / 2;
  for (let i = 0; i < 200 && hi - lo > 1e-12 * hi; i++) {
    const mid = (lo + hi) / 2;
    if (parabolaExtraLengthM(l, mid) > delta) hi = mid;
    else lo = mid;
  }
  return {
    spanM: l,
    extraLengthM: delta,
    sagM: (lo + hi) / 2,
    smallSagApproximationM: Math.sqrt((3 * l * delta) / 8),
  };
}
