/**
 * Ground size in metres of the cells of a geographic grid (cells measured in degrees of longitude
 * and latitude), from the radii of curvature of the ellipsoid.
 *
 * Method: on an ellipsoid of revolution with semi-major axis a and flattening f
 * (e² = f (2 − f)), at geodetic latitude φ,
 *
 * - the meridian radius of curvature is M(φ) = a (1 − e²) / (1 − e² sin²φ)^(3/2),
 * - the prime-vertical radius of curvature is N(φ) = a / (1 − e² sin²φ)^(1/2),
 *
 * so a small step Δφ along a meridian is M Δφ long and a step Δλ along the parallel is
 * N cos φ Δλ long (angles in radians). These are the standard formulas of geometric geodesy, as
 * in J. P. Snyder (1987), *Map Projections — A Working Manual*, USGS Professional Paper 1395,
 * §3 (equation numbers from memory). The tests check them against GeographicLib's geodesics
 * (C. F. F. Karney 2013, "Algorithms for geodesics", Journal of Geodesy 87:43–55).
 */
import type { CellSize } from '../terrain/raster';

/** An ellipsoid of revolution: semi-major axis `a` in metres and flattening `f` (0 for a sphere). */
export interface Ellipsoid {
  readonly a: number;
  readonly f: number;
}

/** The radii of curvature at one latitude, in metres. */
export interface RadiiOfCurvature {
  /** M: radius of curvature of the meridian (north–south). */
  readonly meridianM: number;
  /** N: radius of curvature of the prime vertical (east–west, normal to the meridian). */
  readonly primeVerticalM: number;
}

const DEG = Math.PI / 180;

/**
 * Radii of curvature of the ellipsoid at a geodetic latitude.
 *
 * @param latitudeDeg - geodetic latitude in degrees, −90…90
 * @param ellipsoid - `a` in metres (> 0) and flattening `f` (0 ≤ f < 1)
 * @returns M (meridian) and N (prime vertical) in metres; see the module comment for the source
 * @throws RangeError when the latitude or the ellipsoid is out of range
 */
export function radiiOfCurvatureM(latitudeDeg: number, ellipsoid: Ellipsoid): RadiiOfCurvature {
  checkEllipsoid(ellipsoid);
  checkLatitude(latitudeDeg, 'latitude');
  return radii(latitudeDeg, ellipsoid);
}

/**
 * West–east cell width for each row and one north–south cell height, in metres along the ground,
 * for a grid whose cells are `cellWidthDeg` × `cellHeightDeg` degrees.
 *
 * - Row widths are the length of the parallel through the row's centre latitude across one cell,
 *   N(φ) cos φ Δλ. (The geodesic between the cell's west and east centre points is shorter than
 *   the parallel by a relative amount of order (Δλ sin φ)²/24, below 10⁻⁸ for cells under 0.01°.)
 * - The height is M(φm) Δφ at the grid's middle latitude φm, the mean of the first and last row
 *   centre latitudes, because an {@link CellSize} has one height for every row. M changes by a
 *   relative 1.5 e² sin 2φ Δφ across a span Δφ (radians), about 10⁻⁴ across a 1° tile, which is
 *   the error this takes on at the top and bottom rows.
 *
 * @param rowLatitudesDeg - geodetic latitude of each row's centre in degrees, row 0 northmost;
 *   each strictly between −90 and 90; at least one row. Not modified.
 * @param cellWidthDeg - west–east cell size in degrees of longitude, > 0
 * @param cellHeightDeg - north–south cell size in degrees of latitude, > 0
 * @param ellipsoid - the CRS's ellipsoid, e.g. GRS80 `{ a: 6378137, f: 1 / 298.257222101 }`
 * @returns `cellWidthM` (a new Float64Array, one per row) and `cellHeightM`
 * @throws RangeError when a latitude, a cell size or the ellipsoid is out of range
 */
export function geographicCellSizeM(
  rowLatitudesDeg: ArrayLike<number>,
  cellWidthDeg: number,
  cellHeightDeg: number,
  ellipsoid: Ellipsoid,
): CellSize {
  checkEllipsoid(ellipsoid);
  if (rowLatitudesDeg.length < 1) throw new RangeError('expected the latitude of at least one row');
  for (const [name, value] of [['cellWidthDeg', cellWidthDeg], ['cellHeightDeg', cellHeightDeg]] as const) {
    if (!(Number.isFinite(value) && value > 0 && value <= 180)) {
      throw new RangeError(`${name} must be a number of degrees > 0 and ≤ 180, got ${value}`);
    }
  }
  const cellWidthM = new Float64Array(rowLatitudesDeg.length);
  for (let row = 0; row < rowLatitudesDeg.length; row++) {
    const latitudeDeg = rowLatitudesDeg[row]!;
    checkLatitude(latitudeDeg, `rowLatitudesDeg[${row}]`);
    if (Math.abs(latitudeDeg) === 90) {
      throw new RangeError(`rowLatitudesDeg[${row}] is a pole, where a cell has no west–east width`);
    }
    cellWidthM[row] = radii(latitudeDeg, ellipsoid).primeVerticalM * Math.cos(latitudeDeg * DEG) * cellWidthDeg * DEG;
  }
  const middleDeg = (rowLatitudesDeg[0]! + rowLatitudesDeg[rowLatitudesDeg.length - 1]!) / 2;
  const cellHeightM = radii(middleDeg, ellipsoid).meridianM * cellHeightDeg * DEG;
  return { cellWidthM, cellHeightM };
}

function radii(latitudeDeg: number, { a, f }: Ellipsoid): RadiiOfCurvature {
  const e2 = f * (2 - f);
  const sin = Math.sin(latitudeDeg * DEG);
  const w2 = 1 - e2 * sin * sin;
  const primeVerticalM = a / Math.sqrt(w2);
  return { meridianM: (a * (1 - e2)) / (w2 * Math.sqrt(w2)), primeVerticalM };
}

function checkEllipsoid({ a, f }: Ellipsoid): void {
  if (!(Number.isFinite(a) && a > 0)) throw new RangeError(`ellipsoid semi-major axis must be metres > 0, got ${a}`);
  if (!(Number.isFinite(f) && f >= 0 && f < 1)) throw new RangeError(`ellipsoid flattening must be ≥ 0 and < 1, got ${f}`);
}

function checkLatitude(latitudeDeg: number, name: string): void {
  if (!(Number.isFinite(latitudeDeg) && Math.abs(latitudeDeg) <= 90)) {
    throw new RangeError(`${name} must be degrees between −90 and 90, got ${latitudeDeg}`);
  }
}
