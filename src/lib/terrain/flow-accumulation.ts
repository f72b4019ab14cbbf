import { checkElevationGrid, D8_NONE, type ElevationGrid } from './raster';

/** Upstream counts and areas of every cell, row-major like the grid. */
export interface FlowAccumulation {
  /** Number of valid cells draining through each cell, the cell itself included; 0 on nodata. */
  readonly cells: Uint32Array;
  /** Plan area draining through each cell in m² (sum of `cellWidthM[row] × cellHeightM`); 0 on nodata. */
  readonly areaM2: Float64Array;
}

/**
 * Accumulates flow down D8 directions: for every cell, the number of valid cells and the area
 * that drain through it, the cell itself included. Cell areas follow the per-row cell widths.
 *
 * Method: flow accumulation (Jenson & Domingue 1988, Photogrammetric Engineering & Remote Sensing
 * 54(11):1593–1600; citation from memory, as in shared/references.md) in linear time: cells are
 * visited in topological order by counting each cell's inflowing neighbours (Kahn 1962,
 * "Topological sorting of large networks", Communications of the ACM 5(11):558–562), each ready
 * cell followed downstream at once; no recursion, no queue.
 *
 * @param directions - D8 codes as from `computeFlowDirections` (see `D8_EAST`), 255 at outlets
 *   and nodata; never mutated
 * @param grid - the grid: shape, per-row cell sizes, and nodata (NaN in `grid.data`)
 * @returns new arrays `cells` (Uint32Array) and `areaM2` (Float64Array), row-major
 * @throws RangeError when the grid is invalid, `directions` has the wrong length, a code is not
 *   0..7 or 255, a nodata cell has a direction, a direction leaves the grid or enters nodata, or
 *   the directions form a cycle
 */
export function accumulateFlow(directions: Uint8Array, grid: ElevationGrid): FlowAccumulation {
  checkElevationGrid(grid);
  const { width, height, data, cellWidthM, cellHeightM } = grid;
  const n = width * height;
  if (!(directions instanceof Uint8Array) || directions.length !== n) {
    throw new RangeError(`directions must be a Uint8Array of width × height = ${n} codes`);
  }
  const offsets = new Int32Array([1, width + 1, width, width - 1, -1, -width - 1, -width, -width + 1]);
  const dxs = new Int32Array([1, 1, 0, -1, -1, -1, 0, 1]);
  const dys = new Int32Array([0, 1, 1, 1, 0, -1, -1, -1]);
  const cells = new Uint32Array(n);
  const areaM2 = new Float64Array(n);
  // Inflowing neighbours still to be added to each cell (at most 8).
  const inflows = new Uint8Array(n);
  let valid = 0;

  for (let y = 0; y < height; y++) {
    const cellAreaM2 = cellWidthM[y]! * cellHeightM;
    for (let x = 0; x < width; x++) {
      const c = y * width + x;
      const d = directions[c]!;
      if (Number.isNaN(data[c]!)) {
        if (d !== D8_NONE) throw new RangeError(`nodata cell (col ${x}, row ${y}) has direction ${d}`);
        continue;
      }
      valid++;
      cells[c] = 1;
      areaM2[c] = cellAreaM2;
      if (d === D8_NONE) continue;
      if (d > 7) throw new RangeError(`cell (col ${x}, row ${y}) has invalid direction code ${d}`);
      const nx = x + dxs[d]!;
      const ny = y + dys[d]!;
      if (nx < 0 || ny < 0 || nx >= width || ny >= height || Number.isNaN(data[c + offsets[d]!]!)) {
        throw new RangeError(
          `cell (col ${x}, row ${y}) drains out of the grid or into nodata; such cells must be 255`,
        );
      }
      inflows[c + offsets[d]!]!++;
    }
  }

  // Start a walk downstream from every cell nothing drains into, adding as it goes; the walk
  // goes on through a cell once all its inflows are in and stops at the first that waits for
  // more. Each valid cell is passed once, and marked DONE; cells on a cycle are never reached.
  let done = 0;
  for (let start = 0; start < n; start++) {
    if (inflows[start] !== 0 || cells[start] === 0) continue;
    let c = start;
    for (;;) {
      inflows[c] = DONE;
      done++;
      const d = directions[c]!;
      if (d === D8_NONE) break;
      const down = c + offsets[d]!;
      cells[down] = cells[down]! + cells[c]!;
      areaM2[down] = areaM2[down]! + areaM2[c]!;
      if (--inflows[down]! !== 0) break;
      c = down;
    }
  }
  if (done !== valid) {
    throw new RangeError(`directions form a cycle through ${valid - done} cells`);
  }
  return { cells, areaM2 };
}

/** Mark in `inflows` of a cell already passed (no cell has more than 8 inflows). */
const DONE = 255;
