/**
 * The shapes the invented Saltbush Rise terrain is built from, as small pure functions of
 * position in local metres (east of the property's west edge, north of its south edge). All
 * heights are metres; every number here is invented for the demo.
 */

/** Cross-section of an incised channel, by distance from its centreline (metres). */
export interface ChannelProfile {
  /** Half-width of the flat channel bed. */
  readonly bedHalfWidthM: number;
  /** Distance at which the steep bank meets the flood flat. */
  readonly bankTopM: number;
  /** Depth of the flood flat below the surrounding plain. */
  readonly floodFlatDepthM: number;
  /** Distance at which the flood flat starts to rise towards the plain. */
  readonly floodFlatHalfWidthM: number;
  /** Distance at which the ground is back on the plain (no incision beyond it). */
  readonly reachM: number;
}

/** An ellipse-shaped area that is levelled flat (a claypan or a terrace). */
export interface FlatArea {
  readonly name: string;
  /** Centre, local metres east and north. */
  readonly centreEastM: number;
  readonly centreNorthM: number;
  /** Semi-axes along east and north, metres. */
  readonly radiusEastM: number;
  readonly radiusNorthM: number;
  /** Level of the flat relative to the plain at its centre (negative = a shallow pan). */
  readonly levelOffsetM: number;
}

/** A low, rounded rise (a Gaussian bump). */
export interface LowRise {
  readonly name: string;
  readonly centreEastM: number;
  readonly centreNorthM: number;
  /** Height of the crest above the plain. */
  readonly heightM: number;
  /** Gaussian spread (one standard deviation), metres. */
  readonly spreadM: number;
}

/** Plain height at the property's south edge, on the main creek's line (invented). */
export const PLAIN_BASE_M = 148;
/** Plain rises northward by this much per metre: 2.2 m per km, so the country falls to the south. */
export const PLAIN_FALL_SOUTH_M_PER_M = 0.0022;
/** Plain rises away from the main creek by this much per metre: 1.5 m per km, a wide shallow valley. */
export const VALLEY_SIDE_SLOPE_M_PER_M = 0.0015;
/** Rounds the valley floor over about this half-width, metres, so the plain has no crease. */
const VALLEY_ROUNDING_M = 100;

/**
 * Cubic smoothstep: 0 at or below `edge0`, 1 at or above `edge1`, smooth between.
 *
 * @throws Error if `edge1` is not greater than `edge0`
 */
export function smoothstep(edge0: number, edge1: number, value: number): number {
  if (!(edge1 > edge0)) throw new Error(`smoothstep needs edge1 > edge0, got ${edge0} and ${edge1}`);
  const t = Math.min(1, Math.max(0, (value - edge0) / (edge1 - edge0)));
  return t * t * (3 - 2 * t);
}

/**
 * Height of the open plain before any channel, rise or flat: a gentle fall to the south plus a
 * shallow valley whose floor follows the main creek.
 *
 * @param northM - local metres north of the south edge
 * @param offsetFromMainCreekM - local east–west distance from the main creek's centreline, metres
 */
export function plainElevationM(northM: number, offsetFromMainCreekM: number): number {
  const valley = Math.hypot(offsetFromMainCreekM, VALLEY_ROUNDING_M) - VALLEY_ROUNDING_M;
  return PLAIN_BASE_M + PLAIN_FALL_SOUTH_M_PER_M * northM + VALLEY_SIDE_SLOPE_M_PER_M * valley;
}

/** Cross-fall of a flood flat towards its channel, m per m (1 in 100). */
export const FLOOD_FLAT_CROSS_FALL = 0.01;

/**
 * Depth of a channel below the plain at a distance from its centreline: a flat bed of full depth,
 * a steep bank up to the flood flat, a flood flat, and a smooth rise back to the plain.
 *
 * @param distanceM - distance from the centreline, metres, not negative
 * @param depthM - full depth of the bed below the plain, metres
 * @param profile - the cross-section shape
 * @returns depth below the plain in metres (0 beyond `profile.reachM`)
 */
export function channelIncisionM(distanceM: number, depthM: number, profile: ChannelProfile): number {
  const { bedHalfWidthM, bankTopM, floodFlatDepthM, floodFlatHalfWidthM, reachM } = profile;
  // The flood flat falls gently towards the bank, as real ones do, so it drains into the channel
  // instead of carrying parallel runs of its own.
  const flatDepthM = (d: number) => floodFlatDepthM + FLOOD_FLAT_CROSS_FALL * (floodFlatHalfWidthM - d);
  if (distanceM <= bedHalfWidthM) return depthM;
  if (distanceM <= bankTopM) {
    const t = (distanceM - bedHalfWidthM) / (bankTopM - bedHalfWidthM);
    return depthM + (flatDepthM(bankTopM) - depthM) * t;
  }
  if (distanceM <= floodFlatHalfWidthM) return flatDepthM(distanceM);
  return floodFlatDepthM * (1 - smoothstep(floodFlatHalfWidthM, reachM, distanceM));
}

/**
 * Height a low rise adds at a point.
 *
 * @param eastM - local metres east
 * @param northM - local metres north
 * @param rise - the rise
 */
export function riseHeightM(eastM: number, northM: number, rise: LowRise): number {
  const r2 = (eastM - rise.centreEastM) ** 2 + (northM - rise.centreNorthM) ** 2;
  return rise.heightM * Math.exp(-r2 / (2 * rise.spreadM ** 2));
}

/**
 * How much a flat replaces the ground at a point: 1 in the inner 75 % of its ellipse (exactly
 * level there), easing to 0 at its rim.
 *
 * @param eastM - local metres east
 * @param northM - local metres north
 * @param flat - the flat
 * @returns a weight in [0, 1]
 */
export function flatWeight(eastM: number, northM: number, flat: FlatArea): number {
  const r = Math.hypot((eastM - flat.centreEastM) / flat.radiusEastM, (northM - flat.centreNorthM) / flat.radiusNorthM);
  return 1 - smoothstep(0.75, 1, r);
}
