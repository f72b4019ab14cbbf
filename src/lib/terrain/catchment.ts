import { contours } from 'd3-contour';
import type { FlowAccumulation } from './flow-accumulation';
import { cellCentre, checkGridTransform, toCell, type GridTransform } from './grid-transform';
import { checkElevationGrid, D8_DX, D8_DY, D8_NONE, type ElevationGrid } from './raster';

/** The area draining to one point, with what the flood formulas need. */
export interface Catchment {
  /** The cell the point was snapped to (largest upstream area within the search radius). */
  readonly outlet: { col: number; row: number; x: number; y: number; elevationM: number };
  readonly cellCount: number;
  /** Plan area, m² (per-row cell sizes). */
  readonly areaM2: number;
  /**
   * Outline as GeoJSON MultiPolygon coordinates in the grid's CRS (along cell edges, corners cut);
   * empty when asked for without it (`outline: false`).
   */
  readonly polygon: [number, number][][][];
  /** Longest flow path to the outlet, metres, and its vertices from its top down, CRS `[x, y]`. */
  readonly longestFlowPathM: number;
  readonly longestFlowPath: [number, number][];
  /**
   * Equal-area slope of the longest flow path, m/m: the slope of the straight line through the
   * outlet that encloses the same area under it as the path's profile (Australian Rainfall and
   * Runoff 1987, Book IV; the slope used by Bransby-Williams' time of concentration).
   */
  readonly equalAreaSlope: number;
}

/**
 * Delineates the catchment of a point: snaps it to the cell of largest upstream area within a
 * search radius (so a click beside a channel lands in it), collects every cell whose D8 path
 * passes through that cell, and measures area, longest flow path and its equal-area slope.
 *
 * @param grid - heights, nodata and per-row cell sizes (metres)
 * @param filled - the conditioned surface from `fillDepressions`, metres
 * @param directions - D8 codes from `computeFlowDirections`
 * @param accumulation - from `accumulateFlow`
 * @param transform - the grid's georeferencing
 * @param point - `[x, y]` in the grid's CRS
 * @param snapRadiusM - search radius in metres (0: the cell under the point)
 * @param options.outline - trace the outline polygon (default true); the figures alone, for a
 *   crossing's flood estimate, are much cheaper without it
 * @returns the catchment, or null when no valid cell lies within the radius
 * @throws RangeError on mismatched shapes or a negative radius
 */
export function delineateCatchment(
  grid: ElevationGrid,
  filled: Float64Array,
  directions: Uint8Array,
  accumulation: FlowAccumulation,
  transform: GridTransform,
  point: [number, number],
  snapRadiusM: number,
  options: { outline?: boolean } = {},
): Catchment | null {
  checkElevationGrid(grid);
  checkGridTransform(transform);
  const { width, height, data, cellWidthM, cellHeightM } = grid;
  const n = width * height;
  if (filled.length !== n || directions.length !== n || accumulation.areaM2.length !== n) {
    throw new RangeError(`filled, directions and accumulation must each hold width × height = ${n} values`);
  }
  if (!(snapRadiusM >= 0)) throw new RangeError(`the snap radius must be ≥ 0 metres, got ${snapRadiusM}`);

  const outletCell = outletCellNear(grid, accumulation.areaM2, transform, point, snapRadiusM);
  if (outletCell < 0) return null;

  // Upslope cells in breadth-first order from the outlet, each with its flow distance to it.
  const inside = new Uint8Array(n);
  const distanceM = new Float64Array(n);
  const order: number[] = [outletCell];
  inside[outletCell] = 1;
  let areaM2 = 0;
  for (let head = 0; head < order.length; head++) {
    const cell = order[head]!;
    const col = cell % width;
    const row = (cell - col) / width;
    areaM2 += cellWidthM[row]! * cellHeightM;
    for (let code = 0; code < 8; code++) {
      // The neighbour in direction `code` drains here when its own code points back (code + 4).
      const ncol = col + D8_DX[code]!;
      const nrow = row + D8_DY[code]!;
      if (ncol < 0 || ncol >= width || nrow < 0 || nrow >= height) continue;
      const neighbour = nrow * width + ncol;
      const back = directions[neighbour]!;
      if (back === D8_NONE || inside[neighbour] || (back + 4) % 8 !== code || Number.isNaN(data[neighbour]!)) continue;
      inside[neighbour] = 1;
      const dxM = D8_DX[code]! * 0.5 * (cellWidthM[row]! + cellWidthM[nrow]!);
      distanceM[neighbour] = distanceM[cell]! + Math.hypot(dxM, D8_DY[code]! * cellHeightM);
      order.push(neighbour);
    }
  }

  let source = outletCell;
  for (const cell of order) if (distanceM[cell]! > distanceM[source]!) source = cell;
  const pathCells: number[] = [];
  for (let cell = source; ; ) {
    pathCells.push(cell);
    if (cell === outletCell) break;
    const code = directions[cell]!;
    cell += D8_DY[code]! * width + D8_DX[code]!;
  }
  const lengthM = distanceM[source]!;
  const outletZ = filled[outletCell]!;
  // Area under the profile above the outlet, by trapezoids; equal-area slope Se = 2A / L².
  let areaUnder = 0;
  for (let i = 1; i < pathCells.length; i++) {
    const a = pathCells[i - 1]!;
    const b = pathCells[i]!;
    areaUnder += 0.5 * (filled[a]! - outletZ + filled[b]! - outletZ) * (distanceM[a]! - distanceM[b]!);
  }
  const outletCol = outletCell % width;
  const outletRow = (outletCell - outletCol) / width;
  const [x, y] = cellCentre(transform, outletCol, outletRow);
  return {
    outlet: { col: outletCol, row: outletRow, x, y, elevationM: outletZ },
    cellCount: order.length,
    areaM2,
    polygon: options.outline === false ? [] : outlineMask(inside, width, height, transform),
    longestFlowPathM: lengthM,
    longestFlowPath: pathCells.map((cell) => cellCentre(transform, cell % width, Math.floor(cell / width))),
    equalAreaSlope: lengthM > 0 ? Math.max(0, (2 * areaUnder) / (lengthM * lengthM)) : 0,
  };
}

/**
 * The cell a point snaps to: the one of largest upstream area within `radiusM` (what
 * `delineateCatchment` starts from), or -1 when no valid cell is that near. Two points with the
 * same outlet cell have the same catchment.
 */
export function outletCellNear(grid: ElevationGrid, areaM2: Float64Array, transform: GridTransform, point: [number, number], radiusM: number): number {
  const { width, height, data, cellWidthM, cellHeightM } = grid;
  const [colF, rowF] = toCell(transform, point[0], point[1]);
  const col0 = Math.round(colF);
  const row0 = Math.round(rowF);
  if (col0 < 0 || col0 >= width || row0 < 0 || row0 >= height) return -1;
  const reachCols = Math.ceil(radiusM / cellWidthM[row0]!);
  const reachRows = Math.ceil(radiusM / cellHeightM);
  let best = -1;
  for (let row = Math.max(0, row0 - reachRows); row <= Math.min(height - 1, row0 + reachRows); row++) {
    for (let col = Math.max(0, col0 - reachCols); col <= Math.min(width - 1, col0 + reachCols); col++) {
      const cell = row * width + col;
      if (Number.isNaN(data[cell]!)) continue;
      const offM = Math.hypot((col - colF) * cellWidthM[row]!, (row - rowF) * cellHeightM);
      if (offM > radiusM + 0.5 * Math.max(cellWidthM[row]!, cellHeightM)) continue;
      if (best < 0 || areaM2[cell]! > areaM2[best]!) best = cell;
    }
  }
  return best;
}

/**
 * Cell-edge outline of a 0/1 mask through d3-contour's marching squares at the 0.5 level, run on
 * the mask's bounding box (plus a cell of margin) so a small catchment costs little in a big model.
 */
function outlineMask(mask: Uint8Array, width: number, height: number, transform: GridTransform): [number, number][][][] {
  let [minCol, minRow, maxCol, maxRow] = [width, height, -1, -1];
  for (let i = 0; i < mask.length; i++) {
    if (!mask[i]) continue;
    const col = i % width;
    const row = (i - col) / width;
    if (col < minCol) minCol = col;
    if (col > maxCol) maxCol = col;
    if (row < minRow) minRow = row;
    if (row > maxRow) maxRow = row;
  }
  if (maxCol < 0) return [];
  const col0 = minCol - 1;
  const row0 = minRow - 1;
  const boxWidth = maxCol - minCol + 3;
  const boxHeight = maxRow - minRow + 3;
  const box = new Array<number>(boxWidth * boxHeight).fill(0);
  for (let row = minRow; row <= maxRow; row++) {
    for (let col = minCol; col <= maxCol; col++) box[(row - row0) * boxWidth + (col - col0)] = mask[row * width + col]!;
  }
  const [outline] = contours().size([boxWidth, boxHeight]).smooth(false).thresholds([0.5])(box);
  // d3-contour centres box cell (c, r) at (c + 0.5, r + 0.5); unsmoothed, the outline runs along
  // cell edges and cuts outer corners diagonally. The reported area comes from the cells.
  return (outline?.coordinates ?? []).map((polygon) =>
    polygon.map((ring) =>
      ring.map(([cx, cy]) => [transform.originX + (cx! + col0) * transform.cellSizeX, transform.originY - (cy! + row0) * transform.cellSizeY] as [number, number]),
    ),
  );
}
