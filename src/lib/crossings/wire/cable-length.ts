/**
 * Length of a sagging cable span by the exact parabola, its textbook series, and the catenary.
 */
import { checkNumber } from './check-number';
import { parabolaArcLengthM } from './parabola-arc-length';

/** The length of one span of wire by each method, metres. */
export interface CableLength {
  readonly spanM: number;
  readonly sagM: number;
  /** Exact arc length of the parabola (the reference value; see {@link parabolaArcLengthM}). */
  readonly parabolaM: number;
  /** Two-term series l [1 + (8/3)(f/l)²]. */
  readonly seriesTwoTermM: number;
  /** Three-term series l [1 + (8/3)(f/l)² − (32/5)(f/l)⁴]. */
  readonly seriesThreeTermM: number;
  /** Catenary (a cable under its own weight) through the same supports with the same sag. */
  readonly catenaryM: number;
}

/**
 * Length of wire in a span `spanM` long that sags (or is pushed sideways) by `sagM` at mid-span.
 *
 * - Parabola, exact arc length, and its series L = l [1 + (8/3)(f/l)² − (32/5)(f/l)⁴ + …]: Beer &
 *   Johnston, *Vector Mechanics for Engineers: Statics*, cables with distributed loads (parabolic
 *   cable). The series converges only for f/l < 1/4 and is meant for shallow sags.
 * - Catenary y = c (cosh(x/c) − 1) with c solved from f = c (cosh(l / 2c) − 1) by bisection,
 *   length 2c sinh(l / 2c): same source, catenary section.
 *
 * @param spanM - horizontal distance between the supports, metres, > 0
 * @param sagM - mid-span sag from the chord, metres, ≥ 0
 * @returns the four lengths, metres
 * @throws RangeError when the span is not a positive number or the sag is negative
 */
export function cableLength(spanM: number, sagM: number): CableLength {
  const l = checkNumber(spanM, { name: 'spanM', what: 'the span', unit: 'm', min: 0, minExclusive: true });
  const f = checkNumber(sagM, { name: 'sagM', what: 'the sag', unit: 'm', min: 0 });
  const r = f / l;
  return {
    spanM: l,
    sagM: f,
    parabolaM: parabolaArcLengthM(l, f),
    seriesTwoTermM: l * (1 + (8 / 3) * r * r),
    seriesThreeTermM: l * (1 + (8 / 3) * r * r - (32 / 5) * r ** 4),
    catenaryM: catenaryLengthM(l, f),
  };
}

/** Catenary length through level supports `l` apart with mid-span sag `f` (both checked). */
function catenaryLengthM(l: number, f: number): number {
  if (f === 0) return l;
  const sagOf = (c: number): number => c * (Math.cosh(l / (2 * c)) - 1);
  // The sag falls as the catenary parameter c grows. Since cosh x − 1 > x²/2, the sag at
  // c = l²/(8f) exceeds f, so that is a lower bound; double it until the sag drops to f or below.
  let lo = (l * l) / (8 * f);
  let hi = 2 * lo;
  while (sagOf(hi) > f) {
    lo = hi;
    hi *= 2;
  }
  for (let i = 0; i < 200 && hi / lo - 1 > 1e-15; i++) {
    const c = Math.sqrt(lo * hi);
    if (sagOf(c) > f) lo = c;
    else hi = c;
  }
  const c = Math.sqrt(lo * hi);
  return 2 * c * Math.sinh(l / (2 * c));
}
