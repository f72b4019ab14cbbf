/**
 * Shared raster types of the terrain core: the elevation grid, its cell sizes, and the D8 flow
 * direction encoding. Rasters are flat row-major typed arrays, `data[row * width + col]`, with
 * row 0 the northmost row and column 0 the westmost column (the GeoTIFF order). Decoding files
 * and georeferencing are kept out of the core.
 */

/**
 * A grid of ground heights.
 *
 * Cell sizes are in metres along the ground. A projected model has the same cell width on every
 * row; a geographic model (degrees) has cells that narrow towards the pole, so the west–east cell
 * width is given per row while the north–south cell height is one number.
 */
export interface ElevationGrid {
  /** Number of columns, west to east. A positive integer. */
  readonly width: number;
  /** Number of rows, north to south. A positive integer. */
  readonly height: number;
  /** Ground height in metres, row-major `data[row * width + col]`, row 0 northmost; NaN = nodata. */
  readonly data: Float32Array | Float64Array;
  /** West–east cell size in metres for each row (length `height`, row 0 northmost). */
  readonly cellWidthM: Float64Array;
  /** North–south cell size in metres, the same on every row. */
  readonly cellHeightM: number;
}

/** The cell-size part of an {@link ElevationGrid}. */
export interface CellSize {
  /** West–east cell size in metres for each row. */
  readonly cellWidthM: Float64Array;
  /** North–south cell size in metres. */
  readonly cellHeightM: number;
}

/**
 * D8 flow directions (O'Callaghan & Mark 1984, "The extraction of drainage networks from digital
 * elevation data", Computer Vision, Graphics, and Image Processing 28:323–344), one byte per
 * cell. Codes 0..7 run clockwise on the map starting from east:
 *
 * ```
 *   5 NW   6 N   7 NE
 *   4 W     ·    0 E
 *   3 SW   2 S   1 SE
 * ```
 *
 * A cell with code `d` drains into the cell at column `col + D8_DX[d]`, row `row + D8_DY[d]`
 * (rows grow southward). The opposite direction is `(d + 4) & 7`. {@link D8_NONE} (255) marks a
 * cell with no downstream cell in the model: a valid cell that drains out of the model (over the
 * grid's edge or into nodata), or a nodata cell itself; tell them apart by the grid's data.
 */
export const D8_EAST = 0;
/** D8 code: south-east. See {@link D8_EAST} for the encoding. */
export const D8_SOUTH_EAST = 1;
/** D8 code: south. See {@link D8_EAST} for the encoding. */
export const D8_SOUTH = 2;
/** D8 code: south-west. See {@link D8_EAST} for the encoding. */
export const D8_SOUTH_WEST = 3;
/** D8 code: west. See {@link D8_EAST} for the encoding. */
export const D8_WEST = 4;
/** D8 code: north-west. See {@link D8_EAST} for the encoding. */
export const D8_NORTH_WEST = 5;
/** D8 code: north. See {@link D8_EAST} for the encoding. */
export const D8_NORTH = 6;
/** D8 code: north-east. See {@link D8_EAST} for the encoding. */
export const D8_NORTH_EAST = 7;
/** D8 code: no downstream cell in the model (outlet or nodata). See {@link D8_EAST}. */
export const D8_NONE = 255;

/** Column step (cells, eastward positive) of each D8 code 0..7. */
export const D8_DX = [1, 1, 0, -1, -1, -1, 0, 1] as const;
/** Row step (cells, southward positive since rows run north to south) of each D8 code 0..7. */
export const D8_DY = [0, 1, 1, 1, 0, -1, -1, -1] as const;

/**
 * Cell sizes for a grid whose cells are all `sizeM` × `sizeM` metres (a projected model).
 *
 * @param width - number of columns, a positive integer
 * @param height - number of rows, a positive integer
 * @param sizeM - cell size in metres, finite and positive
 * @returns `cellWidthM` (length `height`, every entry `sizeM`) and `cellHeightM = sizeM`
 * @throws RangeError when a dimension is not a positive integer or the size is not positive
 */
export function uniformCellSize(width: number, height: number, sizeM: number): CellSize {
  checkDimensions(width, height);
  if (!(Number.isFinite(sizeM) && sizeM > 0)) {
    throw new RangeError(`cell size must be a finite number of metres > 0, got ${sizeM}`);
  }
  return { cellWidthM: new Float64Array(height).fill(sizeM), cellHeightM: sizeM };
}

/**
 * Checks the shape of an elevation grid once, at the entry of each core function.
 *
 * @param grid - the grid to check
 * @throws RangeError when the dimensions are not positive integers, `data` does not hold
 *   `width × height` values, `cellWidthM` does not hold `height` values, or a cell size is not a
 *   finite positive number of metres
 */
export function checkElevationGrid(grid: ElevationGrid): void {
  const { width, height, data, cellWidthM, cellHeightM } = grid;
  checkDimensions(width, height);
  if (!(data instanceof Float32Array || data instanceof Float64Array)) {
    throw new RangeError('elevation data must be a Float32Array or Float64Array');
  }
  if (data.length !== width * height) {
    throw new RangeError(
      `elevation data holds ${data.length} values, expected width × height = ${width * height}`,
    );
  }
  if (!(cellWidthM instanceof Float64Array) || cellWidthM.length !== height) {
    throw new RangeError(`cellWidthM must be a Float64Array of one width per row (${height})`);
  }
  for (let row = 0; row < height; row++) {
    const w = cellWidthM[row]!;
    if (!(Number.isFinite(w) && w > 0)) {
      throw new RangeError(`cellWidthM[${row}] must be a finite number of metres > 0, got ${w}`);
    }
  }
  if (!(Number.isFinite(cellHeightM) && cellHeightM > 0)) {
    throw new RangeError(`cellHeightM must be a finite number of metres > 0, got ${cellHeightM}`);
  }
}

function checkDimensions(width: number, height: number): void {
  if (!(Number.isInteger(width) && width > 0 && Number.isInteger(height) && height > 0)) {
    throw new RangeError(`grid width and height must be positive integers, got ${width} × ${height}`);
  }
  // Cell indices are kept in Int32Arrays by the core.
  if (width * height > 0x7fffffff) {
    throw new RangeError(`grid of ${width} × ${height} cells is too large (at most 2^31 − 1 cells)`);
  }
}
