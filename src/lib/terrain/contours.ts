/**
 * Contour lines by marching squares between cell centres, and a readable contour interval.
 *
 * Written here rather than taken from d3-contour: d3-contour traces filled bands (closed rings
 * padded round the grid's border, nodata below everything), which would have to be cut back into
 * lines; marching squares on the squares of four valid cell centres gives the lines directly and
 * stops them cleanly at the border and at nodata. The tests check the segments against
 * d3-contour's.
 */
import { checkElevationGrid, type ElevationGrid } from './raster';

/**
 * One contour line: points `[col, row]` in cell-centre units (fractional; `[0, 0]` is the centre of
 * the north-west cell, rows grow southward; map them with `cellCentre` of `grid-transform`). A
 * closed line repeats its first point at the end. Walking along it, ground at or above the level
 * lies on the right as seen on a north-up map.
 */
export type ContourLine = [col: number, row: number][];

/** The lines of one contour level. */
export interface ContourLevel {
  /** Height of the level in metres: `baseM + k × intervalM`. */
  readonly elevationM: number;
  /** The lines at this level, possibly none. */
  readonly lines: ContourLine[];
}

/** Levels for {@link traceContours}. */
export interface ContourOptions {
  /** Height between levels in metres, > 0. */
  readonly intervalM: number;
  /** A height that is a level, in metres (default 0): levels are `baseM + k × intervalM`. */
  readonly baseM?: number;
}

/** More levels than this in one call is a mistake (an interval far too small for the relief). */
const MAX_LEVELS = 10_000;

// Edges of a square of four cell centres: T north, R east, B south, L west.
const T = 0;
const R = 1;
const B = 2;
const L = 3;
/**
 * Oriented segments (from edge, to edge) for each corner code `NW·8 + NE·4 + SE·2 + SW·1`
 * (bit set = at or above the level), leaving the high side on the right on the map. Codes 5 and 10
 * are saddles: this table separates the high corners; {@link SADDLE_JOINED} joins them.
 */
const SEGMENTS: readonly (readonly number[])[] = [
  [], [L, B], [B, R], [L, R], [R, T], [R, T, L, B], [B, T], [L, T],
  [T, L], [T, B], [T, L, B, R], [T, R], [R, L], [R, B], [B, L], [],
];
/** Saddles whose centre (mean of the four corners) is at or above the level: high corners joined. */
const SADDLE_JOINED: Readonly<Record<number, readonly number[]>> = { 5: [L, T, R, B], 10: [T, R, B, L] };

/**
 * Contour lines of a grid at every level `baseM + k × intervalM` between its lowest and highest
 * valid heights (inclusive), lowest level first.
 *
 * Marching squares (the two-dimensional form of Lorensen & Cline 1987, "Marching cubes: a high
 * resolution 3D surface construction algorithm", Computer Graphics 21(4):163–169) on each square
 * of four neighbouring cell centres, with the crossing point on each side placed by linear
 * interpolation between its two centres. A square with a nodata corner has
 * no lines, so lines end where they meet nodata or the grid's border (they do not reach the outer
 * half cell). A corner counts as high when its height is ≥ the level. A saddle (two high corners
 * diagonally opposite) joins the high corners when the mean of the four is ≥ the level. Lines are
 * stitched across squares into the longest polylines; lines of zero length are dropped.
 *
 * @param grid - heights in metres, row 0 northmost, NaN = nodata; not modified
 * @param options - `intervalM` > 0 and `baseM`, in metres
 * @returns one {@link ContourLevel} per level in the grid's range; `[]` when all cells are nodata
 * @throws RangeError when the grid's shape is inconsistent, the interval is not a finite positive
 *   number, the base is not finite, or the range holds more than 10 000 levels
 */
export function traceContours(grid: ElevationGrid, options: ContourOptions): ContourLevel[] {
  checkElevationGrid(grid);
  const { intervalM, baseM = 0 } = options;
  if (!(Number.isFinite(intervalM) && intervalM > 0)) {
    throw new RangeError(`contour intervalM must be a finite number of metres > 0, got ${intervalM}`);
  }
  if (!Number.isFinite(baseM)) throw new RangeError(`contour baseM must be a finite number of metres, got ${baseM}`);
  const { width, height, data } = grid;
  let minM = Infinity;
  let maxM = -Infinity;
  for (let i = 0; i < data.length; i++) {
    const z = data[i]!;
    if (z < minM) minM = z;
    if (z > maxM) maxM = z;
  }
  if (!(minM <= maxM)) return [];
  const kFirst = Math.ceil((minM - baseM) / intervalM);
  const kLast = Math.floor((maxM - baseM) / intervalM);
  if (kLast - kFirst + 1 > MAX_LEVELS) {
    throw new RangeError(`contour interval ${intervalM} m gives more than ${MAX_LEVELS} levels over ${minM}..${maxM} m`);
  }

  // Crossing points are keyed by the side they lie on: 2 × (row × width + col) for the side from
  // cell (col, row) east, + 1 for the side from it south. Each key has at most one segment leaving
  // and one arriving, so `next` holds the stitching.
  const next = new Int32Array(2 * width * height);
  const arrives = new Uint8Array(2 * width * height);
  const levels: ContourLevel[] = [];
  for (let k = kFirst; k <= kLast; k++) {
    const level = baseM + k * intervalM;
    if (level < minM || level > maxM) continue;
    next.fill(-1);
    arrives.fill(0);
    const starts: number[] = [];
    for (let row = 0; row < height - 1; row++) {
      for (let col = 0; col < width - 1; col++) {
        const i = row * width + col;
        const nw = data[i]!;
        const ne = data[i + 1]!;
        const se = data[i + width + 1]!;
        const sw = data[i + width]!;
        const code = (nw >= level ? 8 : 0) | (ne >= level ? 4 : 0) | (se >= level ? 2 : 0) | (sw >= level ? 1 : 0);
        // NaN compares false everywhere, so test for nodata only on squares that cross the level.
        if (code === 0 || code === 15 || Number.isNaN(nw + ne + se + sw)) continue;
        const joined = (code === 5 || code === 10) && (nw + ne + se + sw) / 4 >= level;
        const pairs = joined ? SADDLE_JOINED[code]! : SEGMENTS[code]!;
        const sideKey = [2 * i, 2 * (i + 1) + 1, 2 * (i + width), 2 * i + 1];
        for (let s = 0; s < pairs.length; s += 2) {
          const from = sideKey[pairs[s]!]!;
          const to = sideKey[pairs[s + 1]!]!;
          next[from] = to;
          arrives[to] = 1;
          starts.push(from);
        }
      }
    }
    const lines: ContourLine[] = [];
    // Open lines first (from a point nothing arrives at), then the closed loops that remain.
    for (const open of [true, false]) {
      for (const start of starts) {
        if (next[start]! < 0 || (open && arrives[start] === 1)) continue;
        const line: ContourLine = [crossing(grid, start, level)];
        for (let key = start, to = next[key]!; to >= 0; key = to, to = next[key]!) {
          next[key] = -1;
          line.push(crossing(grid, to, level));
        }
        if (hasLength(line)) lines.push(line);
      }
    }
    levels.push({ elevationM: level, lines });
  }
  return levels;
}

/** The `[col, row]` where the level crosses the side with this key, by linear interpolation. */
function crossing(grid: ElevationGrid, key: number, level: number): [number, number] {
  const { width, data } = grid;
  const i = key >> 1;
  const col = i % width;
  const row = (i - col) / width;
  const z0 = data[i]!;
  const z1 = data[key & 1 ? i + width : i + 1]!;
  const t = (level - z0) / (z1 - z0);
  return key & 1 ? [col, row + t] : [col + t, row];
}

function hasLength(line: ContourLine): boolean {
  const [c0, r0] = line[0]!;
  return line.some(([c, r]) => c !== c0 || r !== r0);
}

/**
 * A readable contour interval for a range of heights: the smallest interval of the 1–2–5 series
 * (…, 0.1, 0.2, 0.5, 1, 2, 5, 10, … m) that draws at most 25 levels, which gives about 10 to 25
 * lines; never below 0.1 m, where lines would trace a model's noise more than the ground.
 *
 * @param minM - lowest height in metres
 * @param maxM - highest height in metres, ≥ `minM`
 * @returns the interval in metres (0.1 m for flat ground)
 * @throws RangeError when a height is not finite or `minM > maxM`
 */
export function chooseContourIntervalM(minM: number, maxM: number): number {
  if (!(Number.isFinite(minM) && Number.isFinite(maxM) && minM <= maxM)) {
    throw new RangeError(`heights must be finite with minM ≤ maxM, got ${minM}..${maxM}`);
  }
  for (let exponent = -1; ; exponent++) {
    for (const mantissa of [1, 2, 5]) {
      // Dividing keeps 0.1, 0.2 and 0.5 equal to their literals.
      const intervalM = exponent < 0 ? mantissa / 10 ** -exponent : mantissa * 10 ** exponent;
      if (Math.floor(maxM / intervalM) - Math.ceil(minM / intervalM) + 1 <= 25) return intervalM;
    }
  }
}
