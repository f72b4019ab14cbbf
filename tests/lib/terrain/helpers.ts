import fc from 'fast-check';
import { D8_DX, D8_DY, D8_NONE, uniformCellSize, type ElevationGrid } from '../../../src/lib/terrain/index';

/** A grid from rows of heights written north row first, as they read on a map. */
export function gridFromRows(rows: readonly (readonly number[])[], cellSizeM = 1): ElevationGrid {
  const height = rows.length;
  const width = rows[0]!.length;
  const data = new Float64Array(width * height);
  rows.forEach((row, y) => {
    if (row.length !== width) throw new Error('ragged test grid');
    row.forEach((z, x) => (data[y * width + x] = z));
  });
  return { width, height, data, ...uniformCellSize(width, height, cellSizeM) };
}

/** A grid from a height function of (column, row), row 0 northmost. */
export function gridFromFunction(
  width: number,
  height: number,
  heightM: (col: number, row: number) => number,
  cellSizeM = 1,
): ElevationGrid {
  const data = new Float64Array(width * height);
  for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) data[y * width + x] = heightM(x, y);
  return { width, height, data, ...uniformCellSize(width, height, cellSizeM) };
}

/** Reshapes a flat row-major array into rows, for readable expectations. */
export function toRows<T extends ArrayLike<number>>(values: T, width: number): number[][] {
  const rows: number[][] = [];
  for (let i = 0; i < values.length; i += width) rows.push(Array.from(values).slice(i, i + width));
  return rows;
}

/** True when the valid cell lies on the grid's edge or next to nodata. */
export function isOnBoundary(grid: ElevationGrid, c: number): boolean {
  const { width, height, data } = grid;
  const x = c % width;
  const y = (c - x) / width;
  if (x === 0 || y === 0 || x === width - 1 || y === height - 1) return true;
  for (let dy = -1; dy <= 1; dy++) {
    for (let dx = -1; dx <= 1; dx++) if (Number.isNaN(data[(y + dy) * width + x + dx]!)) return true;
  }
  return false;
}

/**
 * Follows the directions from one valid cell and returns the outlet cell it ends at.
 * Throws when the path leaves the grid, enters nodata, or is longer than the grid (a cycle).
 */
export function traceToOutlet(directions: Uint8Array, grid: ElevationGrid, start: number): number {
  const { width, height, data } = grid;
  let c = start;
  for (let steps = 0; steps <= width * height; steps++) {
    const d = directions[c]!;
    if (d === D8_NONE) return c;
    if (d > 7) throw new Error(`bad direction code ${d} at ${c}`);
    const x = (c % width) + D8_DX[d]!;
    const y = Math.floor(c / width) + D8_DY[d]!;
    if (x < 0 || y < 0 || x >= width || y >= height) throw new Error(`path leaves the grid at ${c}`);
    c = y * width + x;
    if (Number.isNaN(data[c]!)) throw new Error(`path enters nodata at ${c}`);
  }
  throw new Error(`cycle on the path from ${start}`);
}

/** The cell a valid cell drains into, or -1 at an outlet. */
export function downstreamOf(directions: Uint8Array, width: number, c: number): number {
  const d = directions[c]!;
  if (d === D8_NONE) return -1;
  return (Math.floor(c / width) + D8_DY[d]!) * width + (c % width) + D8_DX[d]!;
}

/**
 * Random small elevation models for property tests: integer heights in a narrow range (so many
 * equal neighbours and flats), optionally a large flat block at one height and a nodata hole.
 */
export const elevationModel: fc.Arbitrary<ElevationGrid> = fc
  .record({ width: fc.integer({ min: 1, max: 14 }), height: fc.integer({ min: 1, max: 14 }) })
  .chain(({ width, height }) =>
    fc.record({
      width: fc.constant(width),
      height: fc.constant(height),
      heights: fc.array(
        fc.oneof(
          { arbitrary: fc.integer({ min: 0, max: 4 }), weight: 12 },
          { arbitrary: fc.constant(Number.NaN), weight: 1 },
        ),
        { minLength: width * height, maxLength: width * height },
      ),
      flat: fc.option(rectangle(width, height, fc.integer({ min: 0, max: 4 }))),
      hole: fc.option(rectangle(width, height, fc.constant(Number.NaN))),
      float32: fc.boolean(),
    }),
  )
  .map(({ width, height, heights, flat, hole, float32 }) => {
    const data = float32 ? new Float32Array(heights) : new Float64Array(heights);
    for (const block of [flat, hole]) {
      if (block === null) continue;
      for (let y = block.y0; y <= block.y1; y++) {
        for (let x = block.x0; x <= block.x1; x++) data[y * width + x] = block.value;
      }
    }
    return { width, height, data, ...uniformCellSize(width, height, 1) };
  });

function rectangle(width: number, height: number, value: fc.Arbitrary<number>) {
  return fc
    .record({
      xa: fc.nat(width - 1),
      xb: fc.nat(width - 1),
      ya: fc.nat(height - 1),
      yb: fc.nat(height - 1),
      value,
    })
    .map(({ xa, xb, ya, yb, value: v }) => ({
      x0: Math.min(xa, xb),
      x1: Math.max(xa, xb),
      y0: Math.min(ya, yb),
      y1: Math.max(ya, yb),
      value: v,
    }));
}
