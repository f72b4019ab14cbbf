/**
 * A line of `[lon, lat]` positions (WGS84 degrees) with its geodesic chainage, for locating
 * points and directions along it. Segments are straight in degrees between vertices; a point at
 * parameter t of segment k has chainage `cumulative[k] + t × length(k)`, which differs from the
 * geodesic distance to that point by far less than a millimetre on segments of fence scale
 * (kilometres or less). Segment lengths are GeographicLib geodesics (Karney 2013), computed once,
 * on first use.
 */
import { cumulativeLengthsM } from './geodesic-length';
import { bearingOfDeg, localFrameAt } from './local-frame';
import type { Position } from './types';

/** A place on a line: segment k (vertex k to k + 1) and the fraction t ∈ [0, 1] along it. */
export interface LinePlace {
  readonly segment: number;
  readonly t: number;
}

/** A line of `[lon, lat]` positions with lazily computed geodesic chainage (see the module comment). */
export class MeasuredLine {
  readonly coordinates: readonly Position[];
  #cumulative: Float64Array | null = null;

  /** @param coordinates - at least two positions, already checked; kept by reference, never modified */
  constructor(coordinates: readonly Position[]) {
    this.coordinates = coordinates;
  }

  /** Geodesic length from vertex 0 to each vertex, metres. */
  get cumulativeM(): Float64Array {
    this.#cumulative ??= cumulativeLengthsM(this.coordinates);
    return this.#cumulative;
  }

  get lengthM(): number {
    const cumulative = this.cumulativeM;
    return cumulative[cumulative.length - 1]!;
  }

  /** Chainage in metres of the point at fraction t of a segment. */
  chainageM(segment: number, t: number): number {
    const cumulative = this.cumulativeM;
    return cumulative[segment]! + t * (cumulative[segment + 1]! - cumulative[segment]!);
  }

  /** The segment and fraction at a chainage (clamped to the line). At a vertex, the segment starting there. */
  locate(chainageM: number): LinePlace {
    const cumulative = this.cumulativeM;
    const last = cumulative.length - 2;
    const s = Math.min(Math.max(chainageM, 0), cumulative[last + 1]!);
    let lo = 0;
    let hi = last;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (cumulative[mid]! <= s) lo = mid;
      else hi = mid - 1;
    }
    const lengthM = cumulative[lo + 1]! - cumulative[lo]!;
    return { segment: lo, t: lengthM > 0 ? Math.min(1, (s - cumulative[lo]!) / lengthM) : 0 };
  }

  /** `[lon, lat]` of the point at fraction t of a segment. */
  pointOn(segment: number, t: number): [number, number] {
    const a = this.coordinates[segment]!;
    const b = this.coordinates[segment + 1]!;
    return [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
  }

  /** `[lon, lat]` of the point at a chainage (clamped to the line). */
  pointAt(chainageM: number): [number, number] {
    const { segment, t } = this.locate(chainageM);
    return this.pointOn(segment, t);
  }

  /**
   * Direction of the line at a chainage, degrees clockwise from north, towards increasing chainage.
   *
   * With `windowM` > 0: the chord from the point `windowM` before to the point `windowM` after
   * (each clamped to the line's ends), in the local frame at the point. In a plane, the chord of a
   * polyline equals the sum of its segment vectors, so this is exactly the length-weighted
   * average of the unit vectors of the segments (clipped to the window) — steps shorter than the
   * window, such as cell-by-cell zigzags, cancel out. With `windowM` = 0 (or a chord shorter than
   * 1 mm, as on a line that doubles back): the segment at the point; at a vertex, the sum of the
   * unit vectors of the two segments meeting there.
   */
  bearingAtDeg(chainageM: number, windowM: number): number {
    const [lon, lat] = this.pointAt(chainageM);
    const { kx, ky } = localFrameAt(lon, lat);
    if (windowM > 0) {
      const a = this.pointAt(chainageM - windowM);
      const b = this.pointAt(chainageM + windowM);
      const east = (b[0] - a[0]) * kx;
      const north = (b[1] - a[1]) * ky;
      if (Math.hypot(east, north) >= 1e-3) return bearingOfDeg(east, north);
    }
    const { segment, t } = this.locate(chainageM);
    const [east, north] = this.#unitVector(segment, kx, ky);
    if (t === 0 && segment > 0) {
      const [eastBefore, northBefore] = this.#unitVector(segment - 1, kx, ky);
      if (Math.hypot(east + eastBefore, north + northBefore) > 1e-9) {
        return bearingOfDeg(east + eastBefore, north + northBefore);
      }
    }
    return bearingOfDeg(east, north);
  }

  #unitVector(segment: number, kx: number, ky: number): [number, number] {
    const a = this.coordinates[segment]!;
    const b = this.coordinates[segment + 1]!;
    const east = (b[0] - a[0]) * kx;
    const north = (b[1] - a[1]) * ky;
    const length = Math.hypot(east, north);
    return [east / length, north / length];
  }
}
