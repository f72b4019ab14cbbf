/**
 * A local east–north plane around one point of the WGS84 ellipsoid, for the short-range planar
 * work of the crossing core (segment intersection, directions, buffers).
 *
 * Method: an equirectangular frame at the reference latitude φ0, x = (λ − λ0) N(φ0) cos φ0 and
 * y = (φ − φ0) M(φ0) (angles in radians), with M and N the meridian and prime-vertical radii of
 * curvature (J. P. Snyder 1987, *Map Projections — A Working Manual*, USGS PP 1395, §3; see
 * `src/lib/geo/ellipsoid-cell-size.ts`). Its scale drifts from true by a relative
 * |tan φ0 · Δφ| + O(Δφ²) at Δφ radians from the reference: below 1e-4 within 1 km at 60° of
 * latitude. The map is affine in (λ, φ), so whether two straight-in-degrees segments meet, and
 * where along them, does not depend on the frame; only lengths and angles do.
 */
import { radiiOfCurvatureM } from '../../geo/ellipsoid-cell-size';

/** WGS84 ellipsoid (EPSG:7030): a = 6378137 m, 1/f = 298.257223563. */
export const WGS84 = { a: 6378137, f: 1 / 298.257223563 } as const;

const DEG = Math.PI / 180;

/** Metres per degree of longitude (`kx`) and of latitude (`ky`) at a reference point. */
export interface LocalFrame {
  readonly lon0: number;
  readonly lat0: number;
  readonly kx: number;
  readonly ky: number;
}

/**
 * The local frame at `[lon0, lat0]` (degrees, WGS84).
 * @throws RangeError when the latitude is outside −90…90 (from the radii of curvature)
 */
export function localFrameAt(lon0: number, lat0: number): LocalFrame {
  const { meridianM, primeVerticalM } = radiiOfCurvatureM(lat0, WGS84);
  return { lon0, lat0, kx: primeVerticalM * Math.cos(lat0 * DEG) * DEG, ky: meridianM * DEG };
}

/** Bearing of the vector (east, north) in degrees clockwise from north, 0 ≤ b < 360. */
export function bearingOfDeg(eastM: number, northM: number): number {
  const deg = Math.atan2(eastM, northM) / DEG;
  return deg < 0 ? deg + 360 : deg >= 360 ? deg - 360 : deg;
}

/** Acute angle between two undirected lines given by their bearings, 0–90 degrees. */
export function acuteAngleDeg(bearingADeg: number, bearingBDeg: number): number {
  const d = Math.abs(bearingADeg - bearingBDeg) % 180;
  return Math.min(d, 180 - d);
}
