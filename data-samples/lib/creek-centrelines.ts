/**
 * The analytic centrelines of Saltbush Rise's creeks (invented): a meandering main creek that runs
 * from the north edge to the south edge, and two tributaries that join it, one from the east and
 * one from the west. Vertices run upstream to downstream, about 5 m apart, in EPSG:7854.
 */
import { createMulberry32 } from './prng';
import { EXTENT_SIZE_M, localToProjected, type ProjectedPoint } from './scenario-constants';
import type { ChannelProfile } from './terrain-shape';

/** Which creek. */
export type CreekId = 'main-creek' | 'east-tributary' | 'west-tributary';

/** One creek's centreline and channel shape. */
export interface CreekCentreline {
  readonly id: CreekId;
  readonly name: string;
  /** Vertices `[x, y]` in EPSG:7854, upstream first. */
  readonly points: readonly ProjectedPoint[];
  /** Bed depth below the plain at the upstream end and at the downstream end, metres. */
  readonly depthUpstreamM: number;
  readonly depthDownstreamM: number;
  readonly profile: ChannelProfile;
}

/** The three creeks and the main creek's line as a function of northing. */
export interface CreekNetwork {
  readonly creeks: readonly [CreekCentreline, CreekCentreline, CreekCentreline];
  /** Local metres east of the main creek's centreline at a local northing (metres). */
  readonly mainCreekEastM: (northM: number) => number;
}

const VERTEX_SPACING_M = 5;
const MAIN_PROFILE: ChannelProfile = { bedHalfWidthM: 2.5, bankTopM: 8.5, floodFlatDepthM: 0.6, floodFlatHalfWidthM: 45, reachM: 75 };
const TRIBUTARY_PROFILE: ChannelProfile = { bedHalfWidthM: 1.5, bankTopM: 5.5, floodFlatDepthM: 0.3, floodFlatHalfWidthM: 20, reachM: 35 };
/** Local northings (metres) where the tributaries join; multiples of the spacing, so on a vertex. */
const EAST_JUNCTION_NORTH_M = 1250;
const WEST_JUNCTION_NORTH_M = 800;

/**
 * Sample a tributary: a quadratic Bézier from its source to its junction, with a small seeded
 * wiggle across it that fades out at both ends.
 */
function sampleTributary(
  start: readonly [number, number],
  control: readonly [number, number],
  end: readonly [number, number],
  wiggleAmplitudeM: number,
  wigglePhase: number,
): ProjectedPoint[] {
  const at = (t: number): [number, number] => {
    const a = (1 - t) ** 2;
    const b = 2 * (1 - t) * t;
    const c = t * t;
    const x = a * start[0] + b * control[0] + c * end[0];
    const y = a * start[1] + b * control[1] + c * end[1];
    // Tangent of the Bézier, for the sideways wiggle.
    const tx = 2 * (1 - t) * (control[0] - start[0]) + 2 * t * (end[0] - control[0]);
    const ty = 2 * (1 - t) * (control[1] - start[1]) + 2 * t * (end[1] - control[1]);
    const len = Math.hypot(tx, ty);
    const w = wiggleAmplitudeM * Math.sin(Math.PI * t) * Math.sin(3 * Math.PI * t + wigglePhase);
    return [x - (ty / len) * w, y + (tx / len) * w];
  };
  let lengthM = 0;
  let previous = at(0);
  for (let i = 1; i <= 200; i++) {
    const p = at(i / 200);
    lengthM += Math.hypot(p[0] - previous[0], p[1] - previous[1]);
    previous = p;
  }
  const steps = Math.ceil(lengthM / VERTEX_SPACING_M);
  const out: ProjectedPoint[] = [];
  for (let i = 0; i <= steps; i++) {
    const [e, n] = i === steps ? [end[0], end[1]] : at(i / steps);
    out.push(localToProjected(e, n));
  }
  return out;
}

/**
 * Build the creek network of the demo property from the seed.
 *
 * The main creek's line is `east = 1500 + 220 sin(2πn/1500 + φ1) + 60 sin(2πn/610 + φ2)` in
 * local metres (n north of the south edge), sampled every 5 m of northing from the north edge
 * (upstream) to the south edge; the phases come from the seed.
 *
 * @param seed - the scenario seed
 */
export function buildCreekNetwork(seed: number): CreekNetwork {
  const next = createMulberry32(seed);
  const phase1 = 2 * Math.PI * next();
  const phase2 = 2 * Math.PI * next();
  const eastWigglePhase = 2 * Math.PI * next();
  const westWigglePhase = 2 * Math.PI * next();
  const mainCreekEastM = (northM: number): number =>
    1500 + 220 * Math.sin((2 * Math.PI * northM) / 1500 + phase1) + 60 * Math.sin((2 * Math.PI * northM) / 610 + phase2);

  const mainPoints: ProjectedPoint[] = [];
  for (let northM = EXTENT_SIZE_M; northM >= 0; northM -= VERTEX_SPACING_M) {
    mainPoints.push(localToProjected(mainCreekEastM(northM), northM));
  }
  const eastJunction: [number, number] = [mainCreekEastM(EAST_JUNCTION_NORTH_M), EAST_JUNCTION_NORTH_M];
  const westJunction: [number, number] = [mainCreekEastM(WEST_JUNCTION_NORTH_M), WEST_JUNCTION_NORTH_M];
  const eastPoints = sampleTributary([EXTENT_SIZE_M, 2000], [2300, 1900], eastJunction, 25, eastWigglePhase);
  const westPoints = sampleTributary([0, 1500], [700, 1350], westJunction, 20, westWigglePhase);

  return {
    mainCreekEastM,
    creeks: [
      { id: 'main-creek', name: 'Main creek', points: mainPoints, depthUpstreamM: 2.4, depthDownstreamM: 3.6, profile: MAIN_PROFILE },
      { id: 'east-tributary', name: 'East tributary', points: eastPoints, depthUpstreamM: 0.8, depthDownstreamM: 1.8, profile: TRIBUTARY_PROFILE },
      { id: 'west-tributary', name: 'West tributary', points: westPoints, depthUpstreamM: 0.8, depthDownstreamM: 1.8, profile: TRIBUTARY_PROFILE },
    ],
  };
}
