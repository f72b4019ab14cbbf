/**
 * The planned paddock subdivision of Saltbush Rise (invented): three fence lines, each built to
 * cross one creek at a chosen angle to the flow, and the two paddocks they close off.
 */
import type { CreekCentreline, CreekId, CreekNetwork } from './creek-centrelines';
import { findPolylineCrossings } from './polyline-crossings';
import { EXTENT_SIZE_M, ORIGIN_X, type ProjectedPoint } from './scenario-constants';

/** A planned fence line and the crossing it was built around. */
export interface PlannedFenceLine {
  readonly id: string;
  readonly name: string;
  /** Vertices `[x, y]` in EPSG:7854, west end first. */
  readonly points: readonly ProjectedPoint[];
  readonly crossing: {
    readonly creekId: CreekId;
    /** Crossing point `[x, y]` in EPSG:7854: the midpoint of a creek segment. */
    readonly point: ProjectedPoint;
    /** Angle between the fence and the downstream flow direction there, degrees (90 = square). */
    readonly angleDeg: number;
    /** Index of the creek segment (vertex i to i + 1) whose direction is the flow direction. */
    readonly creekSegment: number;
  };
}

/** A planned paddock: an outer ring `[x, y]` in EPSG:7854, counter-clockwise, closed. */
export interface PlannedPaddock {
  readonly id: string;
  readonly name: string;
  readonly ring: readonly ProjectedPoint[];
  /** Plan area in hectares (shoelace formula in the projected CRS). */
  readonly areaHa: number;
}

/** The whole plan. */
export interface SubdivisionPlan {
  readonly fences: readonly PlannedFenceLine[];
  readonly paddocks: readonly PlannedPaddock[];
}

/** The old boundary fence stands this far inside the elevation model's edge, metres. */
export const BOUNDARY_INSET_M = 10;

type Vec = [number, number];

function creekById(network: CreekNetwork, id: CreekId): CreekCentreline {
  const creek = network.creeks.find((c) => c.id === id);
  if (!creek) throw new Error(`no creek ${id}`);
  return creek;
}

/** Midpoint of creek segment `i`, the downstream unit direction there, and the fence direction at `angleDeg` (turned by `turn`). */
function crossingFrame(creek: CreekCentreline, i: number, angleDeg: number, turn: 1 | -1): { m: Vec; d: Vec } {
  const a = creek.points[i]!;
  const b = creek.points[i + 1]!;
  const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
  const tx = (b[0] - a[0]) / len;
  const ty = (b[1] - a[1]) / len;
  const r = (turn * angleDeg * Math.PI) / 180;
  let d: Vec = [tx * Math.cos(r) - ty * Math.sin(r), tx * Math.sin(r) + ty * Math.cos(r)];
  // Fence vertices run west to east.
  if (d[0] < 0) d = [-d[0], -d[1]];
  return { m: [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2], d };
}

/** A fence straight through the crossing for `halfLengthM` each way, then due west and due east to the boundary fence. */
function crossFence(m: Vec, d: Vec, halfLengthM: number): ProjectedPoint[] {
  const westX = ORIGIN_X + BOUNDARY_INSET_M;
  const eastX = ORIGIN_X + EXTENT_SIZE_M - BOUNDARY_INSET_M;
  const w: Vec = [m[0] - d[0] * halfLengthM, m[1] - d[1] * halfLengthM];
  const e: Vec = [m[0] + d[0] * halfLengthM, m[1] + d[1] * halfLengthM];
  return [[westX, w[1]], w, e, [eastX, e[1]]];
}

function ringAreaHa(ring: readonly ProjectedPoint[]): number {
  let twice = 0;
  for (let i = 0; i < ring.length - 1; i++) twice += ring[i]![0] * ring[i + 1]![1] - ring[i + 1]![0] * ring[i]![1];
  return twice / 2 / 10_000;
}

/**
 * Build the planned subdivision around the creek network:
 * - North cross fence: square (90°) to the main creek, 550 m below the north edge;
 * - South cross fence: 35° to the main creek, 300 m above the south edge (a poor crossing, on purpose);
 * - East paddock fence: 60° to the east tributary, from the north cross fence to the south one.
 *
 * Checks that each fence crosses its own creek exactly once and no other creek.
 *
 * @param network - the creek network
 * @throws Error if the geometry does not come out as designed
 */
export function buildSubdivisionPlan(network: CreekNetwork): SubdivisionPlan {
  const main = creekById(network, 'main-creek');
  const east = creekById(network, 'east-tributary');
  // Main creek vertices are 5 m of northing apart from the north edge down.
  const mainSegmentAtNorth = (northM: number) => Math.round((EXTENT_SIZE_M - northM) / 5);

  const northSegment = mainSegmentAtNorth(2450);
  const north = crossingFrame(main, northSegment, 90, 1);
  const northPoints = crossFence(north.m, north.d, 200);
  const southSegment = mainSegmentAtNorth(300);
  const south = crossingFrame(main, southSegment, 35, 1);
  const southPoints = crossFence(south.m, south.d, 150);

  const eastSegment = Math.round(east.points.length * 0.45);
  const mid = crossingFrame(east, eastSegment, 60, 1);
  // Run the east paddock fence to the east (due east–west) legs of the two cross fences.
  const yTop = northPoints[3]![1];
  const yBottom = southPoints[3]![1];
  const at = (y: number): ProjectedPoint => [mid.m[0] + ((y - mid.m[1]) / mid.d[1]) * mid.d[0], y];
  const eastFencePoints = [at(yTop), at(yBottom)].sort((p, q) => p[0] - q[0]);
  const top = at(yTop);
  const bottom = at(yBottom);
  if (!(top[0] > northPoints[2]![0] && bottom[0] > southPoints[2]![0])) {
    throw new Error('east paddock fence does not meet the due-east legs of the cross fences');
  }

  const fences: PlannedFenceLine[] = [
    { id: 'north-cross-fence', name: 'North cross fence', points: northPoints, crossing: { creekId: 'main-creek', point: north.m, angleDeg: 90, creekSegment: northSegment } },
    { id: 'east-paddock-fence', name: 'East paddock fence', points: eastFencePoints, crossing: { creekId: 'east-tributary', point: mid.m, angleDeg: 60, creekSegment: eastSegment } },
    { id: 'south-cross-fence', name: 'South cross fence', points: southPoints, crossing: { creekId: 'main-creek', point: south.m, angleDeg: 35, creekSegment: southSegment } },
  ];
  for (const fence of fences) {
    for (const creek of network.creeks) {
      const n = findPolylineCrossings(fence.points, creek.points).length;
      const expected = creek.id === fence.crossing.creekId ? 1 : 0;
      if (n !== expected) throw new Error(`${fence.id} crosses ${creek.id} ${n} times, expected ${expected}`);
    }
  }

  const westX = ORIGIN_X + BOUNDARY_INSET_M;
  const eastX = ORIGIN_X + EXTENT_SIZE_M - BOUNDARY_INSET_M;
  const northY = main.points[0]![1] - BOUNDARY_INSET_M;
  const northRing: ProjectedPoint[] = [[westX, northY], ...northPoints, [eastX, northY], [westX, northY]];
  const eastRing: ProjectedPoint[] = [top, bottom, [eastX, yBottom], [eastX, yTop], top];
  const paddocks: PlannedPaddock[] = [
    { id: 'north-paddock', name: 'North paddock', ring: northRing, areaHa: ringAreaHa(northRing) },
    { id: 'east-paddock', name: 'East paddock', ring: eastRing, areaHa: ringAreaHa(eastRing) },
  ];
  return { fences, paddocks };
}
