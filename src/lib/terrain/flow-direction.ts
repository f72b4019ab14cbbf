import { checkElevationGrid, D8_NONE, type ElevationGrid } from './raster';
import { D8_UNRESOLVED } from './flat-codes';
import { resolveFlats } from './resolve-flats';

/**
 * D8 flow directions over a depression-filled surface: each valid cell drains to the one of its
 * eight neighbours with the steepest descent, drop divided by the centre-to-centre distance, so
 * diagonal drops count over the diagonal (per row: √(((w_row + w_next) / 2)² + h²) with the rows'
 * cell widths w and the cell height h, which is √2 × cell size on a uniform grid).
 *
 * Cells on the grid's edge or next to nodata drain to their steepest lower neighbour like any
 * other cell, and out of the model ({@link D8_NONE}) only where they have none. Flats (level
 * cells with no lower neighbour, such as filled depressions) are drained towards lower ground and
 * away from higher ground. Following the directions from any valid cell reaches a cell marked
 * {@link D8_NONE} on the edge or next to nodata, without cycles.
 *
 * Method: D8 (O'Callaghan & Mark 1984, "The extraction of drainage networks from digital elevation
 * data", Computer Vision, Graphics, and Image Processing 28:323–344); flats resolved after Barnes,
 * Lehman & Mulla (2014), "An efficient assignment of drainage direction over flat surfaces in
 * raster digital elevation models", Computers & Geosciences 62:128–135. Ties go to the first
 * direction in code order (east, then clockwise).
 *
 * @param filled - heights in metres, row-major like `grid.data`, NaN = nodata, with every
 *   depression filled (the output of `fillDepressions`); never mutated
 * @param grid - the grid's shape and cell sizes (its `data` is not read)
 * @returns a new Uint8Array of D8 codes (see `D8_EAST` for the encoding), 255 at outlets and nodata
 * @throws RangeError when the grid is invalid, `filled` has the wrong length, or a cell has no
 *   downslope path out of the model (the surface was not depression-filled)
 */
export function computeFlowDirections(filled: Float64Array, grid: ElevationGrid): Uint8Array {
  checkElevationGrid(grid);
  const { width, height, cellWidthM, cellHeightM } = grid;
  const n = width * height;
  if (!(filled instanceof Float64Array) || filled.length !== n) {
    throw new RangeError(`filled surface must be a Float64Array of width × height = ${n} values`);
  }
  const directions = new Uint8Array(n);
  const offsets = new Int32Array([1, width + 1, width, width - 1, -1, -width - 1, -width, -width + 1]);
  const dxs = new Int32Array([1, 1, 0, -1, -1, -1, 0, 1]);
  const dys = new Int32Array([0, 1, 1, 1, 0, -1, -1, -1]);
  // Inverse centre-to-centre distance per direction for the current row.
  const inv = new Float64Array(8);
  const invH = 1 / cellHeightM;
  let unresolved = 0;

  for (let y = 0; y < height; y++) {
    const w = cellWidthM[y]!;
    const wNorth = cellWidthM[y > 0 ? y - 1 : y]!;
    const wSouth = cellWidthM[y < height - 1 ? y + 1 : y]!;
    const invSouthDiag = 1 / Math.hypot((w + wSouth) / 2, cellHeightM);
    const invNorthDiag = 1 / Math.hypot((w + wNorth) / 2, cellHeightM);
    inv[0] = inv[4] = 1 / w;
    inv[2] = inv[6] = invH;
    inv[1] = inv[3] = invSouthDiag;
    inv[5] = inv[7] = invNorthDiag;
    const interiorRow = y > 0 && y < height - 1;
    for (let x = 0; x < width; x++) {
      const c = y * width + x;
      const zc = filled[c]!;
      if (zc !== zc) {
        directions[c] = D8_NONE;
        continue;
      }
      let best = D8_NONE;
      let bestSlope = 0;
      if (interiorRow && x > 0 && x < width - 1) {
        for (let k = 0; k < 8; k++) {
          // A NaN neighbour gives a NaN slope, which never compares greater.
          const slope = (zc - filled[c + offsets[k]!]!) * inv[k]!;
          if (slope > bestSlope) {
            bestSlope = slope;
            best = k;
          }
        }
      } else {
        for (let k = 0; k < 8; k++) {
          const nx = x + dxs[k]!;
          const ny = y + dys[k]!;
          if (nx < 0 || ny < 0 || nx >= width || ny >= height) continue;
          const slope = (zc - filled[ny * width + nx]!) * inv[k]!;
          if (slope > bestSlope) {
            bestSlope = slope;
            best = k;
          }
        }
      }
      if (best === D8_NONE && !isOutlet(filled, width, height, x, y, offsets)) {
        best = D8_UNRESOLVED;
        unresolved++;
      }
      directions[c] = best;
    }
  }
  if (unresolved > 0) resolveFlats(filled, width, height, directions, unresolved);
  return directions;
}

/** True when the cell lies on the grid's edge or next to a nodata cell (8-neighbourhood). */
function isOutlet(filled: Float64Array, width: number, height: number, x: number, y: number, offsets: Int32Array): boolean {
  if (x === 0 || y === 0 || x === width - 1 || y === height - 1) return true;
  const c = y * width + x;
  for (let k = 0; k < 8; k++) {
    if (Number.isNaN(filled[c + offsets[k]!]!)) return true;
  }
  return false;
}
