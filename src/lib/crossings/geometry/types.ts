/**
 * Plain-data types of the crossing geometry core. Positions are `[lon, lat]` in WGS84 degrees
 * (RFC 7946 order); lengths and chainages are metres along the WGS84 ellipsoid; bearings are
 * degrees clockwise from true north, 0 ≤ b < 360; angles are degrees.
 */

/** A position `[lon, lat]` in WGS84 degrees (RFC 7946 order). */
export type Position = readonly [lon: number, lat: number];

/** A planned or existing fence line, drawn from its start (chainage 0) to its end. */
export interface FenceLineInput {
  readonly id: string | number;
  /** At least two distinct positions, `[lon, lat]` degrees. */
  readonly coordinates: readonly Position[];
}

/** A drainage line from a terrain run, or drawn or imported by hand. */
export interface DrainageLineInput {
  readonly id: string | number;
  /** Positions `[lon, lat]` degrees, ordered from upstream to downstream. */
  readonly coordinates: readonly Position[];
  /** Strahler stream order (1 for a headwater line); null or absent when unknown (hand-drawn). */
  readonly streamOrder?: number | null;
  /** Upstream area at the first and at the last vertex, m²; null or absent when unknown. */
  readonly upstreamAreaStartM2?: number | null;
  readonly upstreamAreaEndM2?: number | null;
}

/** How square a crossing is: see `classifyCrossingAngle`. */
export type AngleClass = 'good' | 'fair' | 'poor';

/**
 * Why a meeting is a touch rather than a crossing:
 * - `fence-end`: the fence starts or ends on the drainage line;
 * - `drainage-end`: the drainage line starts or ends on the fence;
 * - `tangent`: the fence meets the line at a point (a vertex or tangent) and stays on one side;
 * - `along`: the fence runs exactly on the line for a stretch and leaves on the side it came from.
 */
export type TouchReason = 'fence-end' | 'drainage-end' | 'tangent' | 'along';

/** A flag on a crossing: `crosses-twice` when the same fence crosses the same line again nearby. */
export type CrossingFlag = 'crosses-twice';

/** One point where a fence line meets a drainage line. */
export interface Crossing {
  /** `crossing` when the fence passes from one side of the line to the other, else `touch`. */
  readonly kind: 'crossing' | 'touch';
  /** Set for touches only. */
  readonly touchReason: TouchReason | null;
  readonly flags: readonly CrossingFlag[];
  /** For `crosses-twice`: fence chainage of the nearest other crossing of the same line, metres. */
  readonly pairedChainageM: number | null;
  readonly fenceId: string | number;
  readonly drainageId: string | number;
  /** `[lon, lat]` degrees. */
  readonly position: [number, number];
  /** Metres from the fence's first vertex, along the fence on the ellipsoid. */
  readonly fenceChainageM: number;
  /** Index of the fence segment holding the point (segment k runs from vertex k to k + 1). */
  readonly fenceSegmentIndex: number;
  readonly drainageSegmentIndex: number;
  /** Metres from the drainage line's upstream end, along it on the ellipsoid. */
  readonly drainageChainageM: number;
  /** Upstream area interpolated linearly by length between the line's end values, m²; null when unknown. */
  readonly upstreamAreaM2: number | null;
  readonly streamOrder: number | null;
  /** Acute angle between the fence and the flow, 0–90 degrees; 90 is square. */
  readonly crossingAngleDeg: number;
  /** Downstream direction of the drainage line averaged over the flow window, degrees from north. */
  readonly flowBearingDeg: number;
  /** Direction of the fence towards increasing chainage, degrees from north. */
  readonly fenceBearingDeg: number;
  readonly angleClass: AngleClass;
}

/** A stretch of fence that runs close to and roughly parallel with a drainage line. */
export interface RunsAlong {
  readonly kind: 'runs-along';
  readonly fenceId: string | number;
  readonly drainageId: string | number;
  /** Fence chainage range of the stretch, metres. */
  readonly fromChainageM: number;
  readonly toChainageM: number;
  readonly lengthM: number;
}

/** Everything `findCrossings` reports. */
export interface CrossingsResult {
  /** Crossings and touches, by fence (input order), then chainage, then drainage id order. */
  readonly crossings: Crossing[];
  /** Runs-along stretches, by fence, then chainage. */
  readonly runsAlong: RunsAlong[];
}
