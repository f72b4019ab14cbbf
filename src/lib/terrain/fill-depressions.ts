import { CellPriorityQueue } from './priority-queue';
import { checkElevationGrid, type ElevationGrid } from './raster';

/**
 * Fills every depression of an elevation grid to its spill level, so that each valid cell has a
 * path of non-increasing height to the grid's edge or to nodata.
 *
 * The filled surface is the lowest surface not below the input with that property: each cell is
 * raised to the lowest "highest point" over all paths from it to an outlet. Cells on the grid's
 * edge and valid cells next to nodata (8-neighbourhood) are the outlets and keep their heights.
 * Filled depressions become exactly level (equal float64 values), ready for flat resolution.
 *
 * Method: Priority-Flood with a plain queue for the cells inside depressions (Barnes, Lehman &
 * Mulla 2014, "Priority-Flood: an optimal depression-filling and watershed-labeling algorithm for
 * digital elevation models", Computers & Geosciences 62:117–127, Algorithm 2), and slope cells
 * traced upward without the priority queue while no lower open cell is next to them (after Zhou,
 * Sun & Fu 2016, "An efficient variant of the Priority-Flood algorithm for filling depressions in
 * raster digital elevation models", Computers & Geosciences 90:87–96). O(n log n) time at worst.
 *
 * @param grid - heights in metres, row-major, row 0 northmost, NaN = nodata; never mutated
 * @returns a new Float64Array of `width × height` filled heights in metres, NaN where the input is
 *   nodata
 * @throws RangeError when the grid's shape or cell sizes are invalid (see `checkElevationGrid`)
 */
export function fillDepressions(grid: ElevationGrid): Float64Array {
  checkElevationGrid(grid);
  const { width, height, data } = grid;
  const n = width * height;
  const filled = new Float64Array(n);
  filled.set(data);
  // closed[i] = 1 once cell i has been given its final height (or is nodata).
  const closed = new Uint8Array(n);
  const open = new CellPriorityQueue(Math.min(n, Math.max(1024, 4 * (width + height))));
  // Two stacks sharing one array, each cell entering at most once overall: depression cells
  // (raised to the level of the cell that reached them) grow up from 0, slope cells (higher than
  // that level, so already final) grow down from n.
  const stack = new Int32Array(n);
  let pitTop = 0;
  let slopeBottom = n;

  let nodataCount = 0;
  for (let i = 0; i < n; i++) {
    if (Number.isNaN(filled[i]!)) {
      closed[i] = 1;
      nodataCount++;
    }
  }
  const seed = (i: number): void => {
    if (closed[i] === 0) {
      closed[i] = 1;
      open.push(i, filled[i]!);
    }
  };
  for (let x = 0; x < width; x++) {
    seed(x);
    seed((height - 1) * width + x);
  }
  for (let y = 1; y < height - 1; y++) {
    seed(y * width);
    seed(y * width + width - 1);
  }
  if (nodataCount > 0) {
    for (let y = 0; y < height; y++) {
      for (let x = 0; x < width; x++) {
        if (!Number.isNaN(filled[y * width + x]!)) continue;
        for (let ny = Math.max(0, y - 1); ny <= Math.min(height - 1, y + 1); ny++) {
          for (let nx = Math.max(0, x - 1); nx <= Math.min(width - 1, x + 1); nx++) {
            seed(ny * width + nx);
          }
        }
      }
    }
  }

  const offsets = new Int32Array([1, width + 1, width, width - 1, -1, -width - 1, -width, -width + 1]);
  const dxs = new Int32Array([1, 1, 0, -1, -1, -1, 0, 1]);
  const dys = new Int32Array([0, 1, 1, 1, 0, -1, -1, -1]);
  for (;;) {
    let c: number;
    // Whether c was reached on a slope: its own height is final, but it stands above the current
    // water level, so it may raise nothing (its neighbours all go on the slope stack).
    let onSlope = false;
    if (pitTop > 0) {
      c = stack[--pitTop]!;
    } else if (slopeBottom < n) {
      c = stack[slopeBottom++]!;
      // It may be expanded at once unless a lower cell next to it is still open: that cell's
      // spill level is not known yet, so the slope cell waits in the priority queue.
      if (hasLowerOpenNeighbour(c, filled, closed, width, height, offsets, dxs, dys)) {
        open.push(c, filled[c]!);
        continue;
      }
      onSlope = true;
    } else if (open.size > 0) {
      c = open.pop();
    } else {
      break;
    }
    const zc = filled[c]!;
    const x = c % width;
    const y = (c - x) / width;
    const interior = x > 0 && y > 0 && x < width - 1 && y < height - 1;
    for (let k = 0; k < 8; k++) {
      let nb: number;
      if (interior) {
        nb = c + offsets[k]!;
      } else {
        const nx = x + dxs[k]!;
        const ny = y + dys[k]!;
        if (nx < 0 || ny < 0 || nx >= width || ny >= height) continue;
        nb = ny * width + nx;
      }
      if (closed[nb] !== 0) continue;
      closed[nb] = 1;
      if (onSlope || filled[nb]! > zc) {
        // Not below the level of a cell next to it: its filled height is its own height.
        stack[--slopeBottom] = nb;
      } else {
        filled[nb] = zc;
        stack[pitTop++] = nb;
      }
    }
  }
  return filled;
}

function hasLowerOpenNeighbour(
  c: number,
  filled: Float64Array,
  closed: Uint8Array,
  width: number,
  height: number,
  offsets: Int32Array,
  dxs: Int32Array,
  dys: Int32Array,
): boolean {
  const zc = filled[c]!;
  const x = c % width;
  const y = (c - x) / width;
  const interior = x > 0 && y > 0 && x < width - 1 && y < height - 1;
  for (let k = 0; k < 8; k++) {
    let nb: number;
    if (interior) {
      nb = c + offsets[k]!;
    } else {
      const nx = x + dxs[k]!;
      const ny = y + dys[k]!;
      if (nx < 0 || ny < 0 || nx >= width || ny >= height) continue;
      nb = ny * width + nx;
    }
    if (closed[nb] === 0 && filled[nb]! < zc) return true;
  }
  return false;
}
