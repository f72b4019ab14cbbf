/**
 * Geodesic lengths on the WGS84 ellipsoid with GeographicLib's inverse solution (C. F. F. Karney
 * 2013, "Algorithms for geodesics", *Journal of Geodesy* 87:43–55; npm `geographiclib-geodesic`),
 * accurate to about 15 nm.
 */
import geographiclib from 'geographiclib-geodesic';
import type { Position } from './types';

const geodesic = geographiclib.Geodesic.WGS84;
const DISTANCE = geographiclib.Geodesic.DISTANCE;

/** Length in metres of the geodesic between two `[lon, lat]` positions (degrees, WGS84). */
export function geodesicDistanceM(from: Position, to: Position): number {
  return geodesic.Inverse(from[1], from[0], to[1], to[0], DISTANCE).s12 ?? Number.NaN;
}

/**
 * Cumulative geodesic length at every vertex of a line, metres: element k is the length from
 * vertex 0 to vertex k, each segment taken as the geodesic between its ends.
 */
export function cumulativeLengthsM(coordinates: readonly Position[]): Float64Array {
  const cumulative = new Float64Array(coordinates.length);
  for (let k = 1; k < coordinates.length; k++) {
    cumulative[k] = cumulative[k - 1]! + geodesicDistanceM(coordinates[k - 1]!, coordinates[k]!);
  }
  return cumulative;
}
