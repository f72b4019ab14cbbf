/**
 * Hand-checkable ground profiles and a floodgate input for the design and materials tests.
 * Invented shapes, not survey data.
 */
import type { FloodgateInput, GroundPoint } from '../../../../src/lib/crossings/design/index';

/** A V: bed at 0 m at chainage 100, sides rising 0.1 m per metre to 10 m at chainages 0 and 200. */
export const V_PROFILE: GroundPoint[] = [
  { chainageM: 0, elevationM: 10 },
  { chainageM: 100, elevationM: 0 },
  { chainageM: 200, elevationM: 10 },
];

/**
 * A trapezoid: a flat bed 6 m wide at 0 m (chainage 97–103), sides 1 : 2 (1 m up per 2 m along)
 * to a plain at 2 m from chainage 93 and 107 out to 0 and 200.
 */
export const TRAPEZOID_PROFILE: GroundPoint[] = [
  { chainageM: 0, elevationM: 2 },
  { chainageM: 93, elevationM: 2 },
  { chainageM: 97, elevationM: 0 },
  { chainageM: 103, elevationM: 0 },
  { chainageM: 107, elevationM: 2 },
  { chainageM: 200, elevationM: 2 },
];

/** Five wires, bottom plain, the rest barbed. */
export const FENCE_WIRES = { wireHeightsM: [0.2, 0.5, 0.8, 1.1, 1.4], wireKinds: ['plain', 'barbed', 'barbed', 'barbed', 'barbed'] } as const satisfies FloodgateInput['fence'];

/**
 * The V with a flood at 1.0 m and 0.2 m freeboard (level 1.2 m): wet zone 88–112 m, so 4 m posts
 * land at 88, 92, …, 112 with one on the bed at 100. n = 0.04 and S = 0.0016 make the local
 * velocity v = (1/0.04) d^(2/3) · 0.04 = d^(2/3) m/s.
 */
export const V_INPUT: FloodgateInput = {
  profile: V_PROFILE,
  crossingChainageM: 100,
  crossingAngleDeg: 90,
  floodLevelM: 1,
  meanVelocityMs: 1,
  energySlope: 0.0016,
  manningN: 0.04,
  style: 'continuous-floodgate',
  settings: { freeboardM: 0.2 },
  fence: { wireHeightsM: [...FENCE_WIRES.wireHeightsM], wireKinds: [...FENCE_WIRES.wireKinds] },
  flexRunEachSideM: 60,
};

/** Freezes an object and everything in it, so a test fails if the code under test writes to it. */
export function deepFreeze<T>(value: T): T {
  if (typeof value === 'object' && value !== null && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const v of Object.values(value)) deepFreeze(v);
  }
  return value;
}

/** Linear interpolation of a profile without gaps (test oracle, written apart from the code under test). */
export function groundAt(profile: readonly GroundPoint[], chainageM: number): number {
  for (let i = 1; i < profile.length; i++) {
    const a = profile[i - 1]!;
    const b = profile[i]!;
    if (chainageM >= a.chainageM && chainageM <= b.chainageM && b.chainageM > a.chainageM) {
      return a.elevationM! + ((chainageM - a.chainageM) / (b.chainageM - a.chainageM)) * (b.elevationM! - a.elevationM!);
    }
  }
  throw new Error(`chainage ${chainageM} is off the profile`);
}
