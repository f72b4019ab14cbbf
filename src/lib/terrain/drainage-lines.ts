import type { FlowAccumulation } from './flow-accumulation';
import { cellCentre, checkGridTransform, type GridTransform } from './grid-transform';
import { checkElevationGrid, D8_DX, D8_DY, D8_NONE, type ElevationGrid } from './raster';
import { simplifyCellPath } from './simplify-cell-path';

/** One drainage line between two nodes of the network (a channel head, a confluence, an outlet). */
export interface DrainageSegment {
  /** Index in the returned list; stable for one run. */
  readonly id: number;
  /** Vertices from upstream to downstream, `[x, y]` in the grid's CRS; first and last are cell centres of its nodes. */
  readonly coordinates: [number, number][];
  /** Strahler stream order (Strahler 1957): 1 for a headwater line, +1 where two of equal order meet. */
  readonly order: number;
  /** Upstream area at the first and last vertex, m². */
  readonly upstreamAreaStartM2: number;
  readonly upstreamAreaEndM2: number;
  /** Length along the traced cells in metres (per-row cell sizes, before simplification). */
  readonly lengthM: number;
  /** Mean bed slope, m/m: fall of the conditioned surface over the length (never negative). */
  readonly meanSlope: number;
  /** The segment this one flows into, or null when it leaves the model. */
  readonly downstreamId: number | null;
}

export interface DrainageOptions {
  /** A cell is a channel when at least this much area drains through it, hectares (> 0). */
  readonly thresholdHa: number;
  /** Douglas–Peucker tolerance in cells for the drawn line; 0 keeps every cell centre. Default 0.75. */
  readonly simplifyCells?: number;
}

/**
 * Traces drainage lines: the cells whose upstream area reaches a threshold, followed down their
 * D8 directions and split at confluences, so that every line runs downstream and lines meet at
 * shared vertices. Each line carries its Strahler order (Strahler 1957, "Quantitative analysis of
 * watershed geomorphology", Transactions AGU 38(6):913–920), upstream area at both ends, length
 * and mean bed slope. The channel network definition by an area threshold follows O'Callaghan &
 * Mark (1984).
 *
 * @param grid - heights and per-row cell sizes; only shape, nodata and sizes are used
 * @param filled - the conditioned surface (from `fillDepressions`), metres, for bed slopes
 * @param directions - D8 codes from `computeFlowDirections`
 * @param accumulation - from `accumulateFlow`
 * @param transform - the grid's georeferencing, for CRS coordinates
 * @returns segments sorted from headwaters downstream (every segment after those flowing into it)
 * @throws RangeError on mismatched shapes or a threshold that is not a positive number
 */
export function traceDrainageLines(
  grid: ElevationGrid,
  filled: Float64Array,
  directions: Uint8Array,
  accumulation: FlowAccumulation,
  transform: GridTransform,
  options: DrainageOptions,
): DrainageSegment[] {
  checkElevationGrid(grid);
  checkGridTransform(transform);
  const { width, height, cellWidthM, cellHeightM } = grid;
  const n = width * height;
  if (filled.length !== n || directions.length !== n || accumulation.areaM2.length !== n) {
    throw new RangeError(`filled, directions and accumulation must each hold width × height = ${n} values`);
  }
  if (!(Number.isFinite(options.thresholdHa) && options.thresholdHa > 0)) {
    throw new RangeError(`the drainage threshold must be a positive number of hectares, got ${options.thresholdHa}`);
  }
  const thresholdM2 = options.thresholdHa * 10_000;
  const area = accumulation.areaM2;
  const downstream = (cell: number): number => {
    const code = directions[cell]!;
    if (code === D8_NONE) return -1;
    return cell + D8_DY[code]! * width + D8_DX[code]!;
  };

  // Channel inflow count per channel cell: 0 marks a head, 2 or more a confluence.
  const inflows = new Uint8Array(n);
  for (let cell = 0; cell < n; cell++) {
    if (area[cell]! < thresholdM2) continue;
    const next = downstream(cell);
    if (next >= 0) inflows[next]! += 1;
  }

  type Draft = { cells: number[]; startArea: number };
  const drafts: Draft[] = [];
  for (let cell = 0; cell < n; cell++) {
    if (area[cell]! < thresholdM2 || inflows[cell] === 1) continue;
    // A head or a confluence starts a segment, which runs to the next confluence or the outlet.
    const cells = [cell];
    let current = downstream(cell);
    while (current >= 0) {
      cells.push(current);
      if (inflows[current]! >= 2) break;
      current = downstream(current);
    }
    if (cells.length > 1) drafts.push({ cells, startArea: area[cell]! });
  }
  // Upstream segments start on cells with less area than any segment they feed.
  drafts.sort((a, b) => a.startArea - b.startArea);

  const startsAt = new Map<number, number>();
  drafts.forEach((draft, id) => startsAt.set(draft.cells[0]!, id));
  const incomingOrders = new Map<number, number[]>();
  const segments: DrainageSegment[] = [];
  for (const [id, { cells }] of drafts.entries()) {
    const first = cells[0]!;
    const last = cells[cells.length - 1]!;
    const order = strahlerOrder(incomingOrders.get(first) ?? []);
    const downstreamId = startsAt.get(last) ?? null;
    if (downstreamId !== null) incomingOrders.set(last, [...(incomingOrders.get(last) ?? []), order]);
    const lengthM = pathLengthM(cells, width, cellWidthM, cellHeightM);
    const fall = filled[first]! - filled[last]!;
    const path = simplifyCellPath(
      cells.map((cell) => [cell % width, Math.floor(cell / width)] as [number, number]),
      options.simplifyCells ?? 0.75,
    );
    segments.push({
      id,
      coordinates: path.map(([col, row]) => cellCentre(transform, col, row)),
      order,
      upstreamAreaStartM2: area[first]!,
      upstreamAreaEndM2: area[last]!,
      lengthM,
      meanSlope: lengthM > 0 ? Math.max(0, fall) / lengthM : 0,
      downstreamId,
    });
  }
  return segments;
}

/** Strahler's rule at a node: the highest incoming order, plus one when two or more share it. */
function strahlerOrder(incoming: number[]): number {
  if (incoming.length === 0) return 1;
  const highest = Math.max(...incoming);
  return incoming.filter((order) => order === highest).length >= 2 ? highest + 1 : highest;
}

function pathLengthM(cells: number[], width: number, cellWidthM: Float64Array, cellHeightM: number): number {
  let lengthM = 0;
  for (let i = 1; i < cells.length; i++) {
    const a = cells[i - 1]!;
    const b = cells[i]!;
    const rowA = Math.floor(a / width);
    const rowB = Math.floor(b / width);
    // A step's west–east part uses the mean width of the two rows it touches.
    const dxM = ((b % width) - (a % width)) * 0.5 * (cellWidthM[rowA]! + cellWidthM[rowB]!);
    const dyM = (rowB - rowA) * cellHeightM;
    lengthM += Math.hypot(dxM, dyM);
  }
  return lengthM;
}
