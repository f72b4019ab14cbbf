/**
 * Georeferencing of a north-up grid: where its cells lie in the grid's own coordinate reference
 * system (CRS). Kept apart from the `ElevationGrid`, whose cell sizes are in metres along the
 * ground, because a geographic model's CRS units are degrees.
 */
/**
 * A north-up affine grid transform (the GeoTIFF / GDAL geotransform without rotation terms).
 *
 * `originX`, `originY` are the CRS coordinates (x east, y north) of the north-west corner of the
 * north-west cell; `cellSizeX` is the west–east cell size and `cellSizeY` the north–south cell
 * size, both positive in CRS units (metres for a projected CRS), rows running south. GDAL's
 * geotransform `[originX, cellSizeX, 0, originY, 0, -cellSizeY]` is the same thing.
 */
export interface GridTransform {
  /** CRS x (east) of the west edge of column 0. */
  readonly originX: number;
  /** CRS y (north) of the north edge of row 0. */
  readonly originY: number;
  /** West–east cell size in CRS units, > 0. */
  readonly cellSizeX: number;
  /** North–south cell size in CRS units, > 0 (rows go south). */
  readonly cellSizeY: number;
}

/**
 * CRS coordinates of a cell centre, or of any fractional position in cell-centre units.
 *
 * @param transform - the grid's georeferencing
 * @param col - column, west to east; integers are cell centres, so `col = -0.5` is the west edge
 * @param row - row, north to south; integers are cell centres, so `row = -0.5` is the north edge
 * @returns `[x, y]` in the grid's CRS (x east, y north)
 */
export function cellCentre(transform: GridTransform, col: number, row: number): [x: number, y: number] {
  return [
    transform.originX + (col + 0.5) * transform.cellSizeX,
    transform.originY - (row + 0.5) * transform.cellSizeY,
  ];
}

/**
 * Fractional cell-centre position of a CRS point: the inverse of {@link cellCentre}.
 *
 * `(0, 0)` is the centre of the north-west cell; the cell that contains the point is
 * `(Math.round(col), Math.round(row))`, and the point lies on the model when
 * `-0.5 ≤ col ≤ width − 0.5` and `-0.5 ≤ row ≤ height − 0.5`.
 *
 * @param transform - the grid's georeferencing
 * @param x - CRS easting
 * @param y - CRS northing
 * @returns `[col, row]` in cell-centre units (fractional), row growing southward
 */
export function toCell(transform: GridTransform, x: number, y: number): [col: number, row: number] {
  return [(x - transform.originX) / transform.cellSizeX - 0.5, (transform.originY - y) / transform.cellSizeY - 0.5];
}

/**
 * Checks a transform once, at the entry of a core function.
 *
 * @param transform - the transform to check
 * @throws RangeError when the origin is not finite or a cell size is not a finite positive number
 */
export function checkGridTransform(transform: GridTransform): void {
  const { originX, originY, cellSizeX, cellSizeY } = transform;
  if (!(Number.isFinite(originX) && Number.isFinite(originY))) {
    throw new RangeError(`grid origin must be finite CRS coordinates, got (${originX}, ${originY})`);
  }
  if (!(Number.isFinite(cellSizeX) && cellSizeX > 0 && Number.isFinite(cellSizeY) && cellSizeY > 0)) {
    throw new RangeError(
      'grid cell sizes must be finite and > 0 in CRS units (cellSizeY positive, rows going south), ' +
        `got ${cellSizeX} × ${cellSizeY}`,
    );
  }
}
