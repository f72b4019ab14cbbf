/**
 * Geometry builders for the crossing tests, on the WGS84 ellipsoid with GeographicLib's direct
 * and inverse solutions (C. F. F. Karney 2013, "Algorithms for geodesics", Journal of Geodesy
 * 87:43–55; npm geographiclib-geodesic). Places are invented.
 */
import geographiclib from 'geographiclib-geodesic';

export const geodesic = geographiclib.Geodesic.WGS84;

/** An invented point in dry inland country, `[lon, lat]` degrees. */
export const ORIGIN: [number, number] = [142.5, -31.5];

/** The point `distanceM` from `from` along the geodesic leaving at `bearingDeg` (negative: backwards). */
export function destination(from: readonly number[], bearingDeg: number, distanceM: number): [number, number] {
  const r = geodesic.Direct(from[1]!, from[0]!, bearingDeg, distanceM);
  return [r.lon2!, r.lat2!];
}

/** Geodesic distance in metres (GeographicLib Inverse). */
export function inverseM(a: readonly number[], b: readonly number[]): number {
  return geodesic.Inverse(a[1]!, a[0]!, b[1]!, b[0]!).s12!;
}

/** Geodesic length of a polyline, metres. */
export function lineLengthM(coordinates: readonly (readonly number[])[]): number {
  let sum = 0;
  for (let k = 1; k < coordinates.length; k++) sum += inverseM(coordinates[k - 1]!, coordinates[k]!);
  return sum;
}

/** Points at the given distances (metres, may be negative) from `centre` along the geodesic at `bearingDeg`. */
export function alongBearing(centre: readonly number[], bearingDeg: number, distancesM: readonly number[]): [number, number][] {
  return distancesM.map((d) => destination(centre, bearingDeg, d));
}

/** Evenly spaced distances from `fromM` to `toM` inclusive. */
export function range(fromM: number, toM: number, stepM: number): number[] {
  const out: number[] = [];
  for (let d = fromM; d <= toM + 1e-9; d += stepM) out.push(d);
  return out;
}

/** A circular arc around `centre`: points at `radiusM` for each bearing from `fromDeg` to `toDeg` by `stepDeg`. */
export function arc(centre: readonly number[], radiusM: number, fromDeg: number, toDeg: number, stepDeg: number): [number, number][] {
  const out: [number, number][] = [];
  const n = Math.round((toDeg - fromDeg) / stepDeg);
  for (let k = 0; k <= n; k++) out.push(destination(centre, fromDeg + ((toDeg - fromDeg) * k) / n, radiusM));
  return out;
}

/** A staircase from `start`: `steps` steps of `stepM`, alternating bearings `bearingsDeg[0]`, `[1]`, … (cell-by-cell zigzag). */
export function staircase(start: readonly number[], bearingsDeg: readonly number[], stepM: number, steps: number): [number, number][] {
  const out: [number, number][] = [[start[0]!, start[1]!]];
  for (let k = 0; k < steps; k++) out.push(destination(out[k]!, bearingsDeg[k % bearingsDeg.length]!, stepM));
  return out;
}

/** Freezes a value and everything inside it, so that a write throws in strict mode. */
export function deepFreeze<T>(value: T): T {
  if (value !== null && typeof value === 'object') {
    for (const inner of Object.values(value)) deepFreeze(inner);
    Object.freeze(value);
  }
  return value;
}
