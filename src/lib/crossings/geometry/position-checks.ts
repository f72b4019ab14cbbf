/** Checks of single positions and of the gap between two, shared by the entry checks and `checkFenceLine`. */
import { localFrameAt } from './local-frame';

/** Vertices closer than this (metres) count as repeated: a segment must be longer. */
export const MIN_SEGMENT_M = 0.01;

/**
 * What is wrong with a value meant to be a `[lon, lat]` position in WGS84 degrees, in words, or
 * null when it is a valid position. A third element (height) is allowed and ignored.
 */
export function describePositionProblem(value: unknown): string | null {
  if (!Array.isArray(value) || value.length < 2 || value.length > 3) {
    return 'expected a position [lon, lat] in degrees';
  }
  const [lon, lat] = value as unknown[];
  if (typeof lon !== 'number' || typeof lat !== 'number' || !Number.isFinite(lon) || !Number.isFinite(lat)) {
    return 'expected finite numbers [lon, lat] in degrees';
  }
  if (Math.abs(lon) > 180) return `longitude ${lon} is outside −180…180 degrees (is the order [lon, lat]?)`;
  if (Math.abs(lat) > 90) return `latitude ${lat} is outside −90…90 degrees (is the order [lon, lat]?)`;
  return null;
}

/**
 * Approximate distance in metres between two valid positions close together (local
 * equirectangular frame at the first; used only to compare with small tolerances).
 */
export function nearDistanceM(a: readonly number[], b: readonly number[]): number {
  const { kx, ky } = localFrameAt(a[0]!, a[1]!);
  return Math.hypot((b[0]! - a[0]!) * kx, (b[1]! - a[1]!) * ky);
}
