/**
 * Slope by Horn's method, with the window and edge rules of GDAL's `gdaldem slope`, and the Horn
 * differences it shares with the hillshade.
 */
import { checkElevationGrid, type ElevationGrid } from './raster';

/** Edge handling shared by {@link computeSlope} and the hillshade. */
export interface HornOptions {
  /**
   * Also compute cells on the grid's edge and next to nodata, as `gdaldem -compute_edges` does
   * (default false: such cells are nodata, as `gdaldem` without the flag).
   */
  readonly computeEdges?: boolean;
}

/**
 * The two weighted (1, 2, 1) differences of Horn's 3 × 3 window for every cell, in metres of
 * height, NaN where `gdaldem` writes nodata. Dividing by 8 × the cell size gives the gradient.
 */
export interface HornDifferences {
  /** `(z_NW + 2 z_W + z_SW) − (z_NE + 2 z_E + z_SE)` per cell, metres (positive when falling east). */
  readonly westMinusEastM: Float64Array;
  /** `(z_SW + 2 z_S + z_SE) − (z_NW + 2 z_N + z_NE)` per cell, metres (positive when falling north). */
  readonly southMinusNorthM: Float64Array;
}

/**
 * Horn's window differences for every cell of a grid, following `gdaldem` (GDAL 3.6,
 * `apps/gdaldem_lib.cpp`, `GDALGeneric3x3Processing`) cell for cell.
 *
 * Without `computeEdges`, a cell is nodata (NaN) when it is nodata, lies on the grid's edge, or has
 * a nodata neighbour. With it, a missing row or column beyond the grid's edge is extrapolated
 * linearly (`2 a − b`, gdaldem's `INTERPOL`), except that along the first and last rows the window
 * repeats the edge column instead, as gdaldem does, and a nodata neighbour takes the centre cell's
 * height. A grid narrower or shorter than 2 cells is all nodata, as in gdaldem. Arithmetic is in
 * double precision (gdaldem sums Float32 input in single precision; the difference is far below
 * a grey level or 0.01°).
 *
 * Method: Horn (1981), "Hill shading and the reflectance map", Proceedings of the IEEE 69(1):14–47.
 *
 * @param grid - heights in metres, row 0 northmost, NaN = nodata; not modified
 * @param options - `computeEdges`, see {@link HornOptions}
 * @returns new arrays of `width × height` differences, row-major
 * @throws RangeError when the grid's shape is inconsistent
 */
export function hornDifferences(grid: ElevationGrid, options: HornOptions = {}): HornDifferences {
  checkElevationGrid(grid);
  const { width, height } = grid;
  const computeEdges = options.computeEdges ?? false;
  const westMinusEastM = new Float64Array(width * height);
  const southMinusNorthM = new Float64Array(width * height);
  const win = new Float64Array(9);
  for (let row = 0; row < height; row++) {
    for (let col = 0; col < width; col++) {
      const i = row * width + col;
      if (!fillWindow(grid, col, row, computeEdges, win)) {
        westMinusEastM[i] = Number.NaN;
        southMinusNorthM[i] = Number.NaN;
        continue;
      }
      // Window cells 0 1 2 / 3 4 5 / 6 7 8, north row first, as in gdaldem.
      westMinusEastM[i] = win[0]! + win[3]! + win[3]! + win[6]! - (win[2]! + win[5]! + win[5]! + win[8]!);
      southMinusNorthM[i] = win[6]! + win[7]! + win[7]! + win[8]! - (win[0]! + win[1]! + win[1]! + win[2]!);
    }
  }
  return { westMinusEastM, southMinusNorthM };
}

/**
 * Slope of the ground in degrees from horizontal for every cell, by Horn's method, equal to
 * `gdaldem slope` (GDAL 3.6, Horn algorithm, degrees, scale 1) on a projected model.
 *
 * slope = atan(√(dx² + dy²) / 8) with dx, dy the {@link hornDifferences} divided by the cell's
 * west–east width (`cellWidthM[row]`, so a geographic model's narrowing cells are honoured, which
 * gdaldem's single `-s` scale does not do) and its north–south height (`cellHeightM`).
 *
 * Method: Horn (1981), "Hill shading and the reflectance map", Proceedings of the IEEE 69(1):14–47.
 *
 * @param grid - heights in metres, row 0 northmost, NaN = nodata; not modified
 * @param options - `computeEdges` as `gdaldem -compute_edges`, see {@link HornOptions}
 * @returns a new Float32Array of `width × height` slopes in degrees (0–90), row-major; NaN where
 *   gdaldem writes nodata (edges and cells next to nodata unless `computeEdges`)
 * @throws RangeError when the grid's shape is inconsistent
 */
export function computeSlope(grid: ElevationGrid, options: HornOptions = {}): Float32Array {
  const { westMinusEastM, southMinusNorthM } = hornDifferences(grid, options);
  const { width, height, cellWidthM, cellHeightM } = grid;
  const slopeDeg = new Float32Array(width * height);
  for (let row = 0; row < height; row++) {
    const ew = cellWidthM[row]!;
    for (let i = row * width; i < (row + 1) * width; i++) {
      const dx = westMinusEastM[i]! / ew;
      const dy = southMinusNorthM[i]! / cellHeightM;
      slopeDeg[i] = (Math.atan(Math.sqrt(dx * dx + dy * dy) / 8) * 180) / Math.PI;
    }
  }
  return slopeDeg;
}

/** gdaldem's `INTERPOL`: linear extrapolation one cell beyond `a`, away from `b`; NaN if either is. */
function interpol(a: number, b: number): number {
  return 2 * a - b;
}

/**
 * Fills the 3 × 3 window of one cell as gdaldem does; false when gdaldem writes nodata there.
 * Out-of-grid cells are only read when `computeEdges` is set and the grid is at least 2 × 2.
 */
function fillWindow(grid: ElevationGrid, col: number, row: number, computeEdges: boolean, win: Float64Array): boolean {
  const { width, height, data } = grid;
  const centre = data[row * width + col]!;
  if (Number.isNaN(centre) || width < 2 || height < 2) return false;
  const at = (c: number, r: number): number => data[r * width + c]!;
  const interior = col > 0 && row > 0 && col < width - 1 && row < height - 1;
  if (interior) {
    for (let k = 0; k < 9; k++) win[k] = at(col + (k % 3) - 1, row + Math.floor(k / 3) - 1);
  } else if (!computeEdges) {
    return false;
  } else if (row === 0 || row === height - 1) {
    // First and last rows: the west and east columns repeat the centre column at the corners.
    const cols = [col === 0 ? col : col - 1, col, col === width - 1 ? col : col + 1];
    for (let k = 0; k < 3; k++) {
      const c = cols[k]!;
      if (row === 0) {
        win[k] = interpol(at(c, 0), at(c, 1));
        win[3 + k] = at(c, 0);
        win[6 + k] = at(c, 1);
      } else {
        win[k] = at(c, row - 1);
        win[3 + k] = at(c, row);
        win[6 + k] = interpol(at(c, row), at(c, row - 1));
      }
    }
  } else {
    // West or east edge of an inner row: the missing column is extrapolated from the two inside.
    for (let k = 0; k < 3; k++) {
      const r = row + k - 1;
      if (col === 0) {
        win[3 * k] = interpol(at(0, r), at(1, r));
        win[3 * k + 1] = at(0, r);
        win[3 * k + 2] = at(1, r);
      } else {
        win[3 * k] = at(col - 1, r);
        win[3 * k + 1] = at(col, r);
        win[3 * k + 2] = interpol(at(col, r), at(col - 1, r));
      }
    }
  }
  for (let k = 0; k < 9; k++) {
    if (Number.isNaN(win[k]!)) {
      if (!computeEdges) return false;
      win[k] = centre;
    }
  }
  return true;
}
