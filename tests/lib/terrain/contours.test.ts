/**
 * Contour lines: by hand, on planes (straight, evenly spaced, high side on the right), at nodata,
 * and segment for segment against d3-contour.
 *
 * Outside references used here:
 * - d3-contour 4.0.3 (npm, Mike Bostock / Observable), `contours().thresholds([level])`: marching
 *   squares with linear interpolation; its rings, less the segments it adds along the padded
 *   border, must be our segments (saddle squares aside, where it always separates the high corners).
 * - Analytic case: the level sets of a plane are straight lines `interval / |gradient|` apart.
 */
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { contours as d3Contours } from 'd3-contour';
import fc from 'fast-check';
import { fromFile } from 'geotiff';
import { describe, expect, it } from 'vitest';
import { chooseContourIntervalM, traceContours, uniformCellSize, type ContourLine } from '../../../src/lib/terrain/index';
import { gridFromFunction, gridFromRows } from './helpers';

const DEM_PATH = resolve(dirname(fileURLToPath(import.meta.url)), '../../../data-samples/saltbush-rise-dem.tif');

type Segment = [number, number, number, number];

function segmentsOf(lines: readonly ContourLine[]): Segment[] {
  const out: Segment[] = [];
  for (const line of lines) {
    for (let i = 1; i < line.length; i++) out.push([...line[i - 1]!, ...line[i]!]);
  }
  return out;
}

describe('traceContours', () => {
  it('rings a single peak clockwise on the map, high side on the right (by hand)', () => {
    const grid = gridFromRows([
      [0, 0, 0],
      [0, 2, 0],
      [0, 0, 0],
    ]);
    // Level 0 has every cell at or above it and level 2 only touches the peak: no lines.
    expect(traceContours(grid, { intervalM: 1 })).toEqual([
      { elevationM: 0, lines: [] },
      {
        elevationM: 1,
        lines: [
          [
            [0.5, 1],
            [1, 0.5],
            [1.5, 1],
            [1, 1.5],
            [0.5, 1],
          ],
        ],
      },
      { elevationM: 2, lines: [] },
    ]);
  });

  it('places levels at baseM + k·intervalM within the range of valid heights', () => {
    const grid = gridFromRows([
      [10.2, 11, Number.NaN],
      [12, 14.9, Number.NaN],
    ]);
    expect(traceContours(grid, { intervalM: 2, baseM: 0.5 }).map((l) => l.elevationM)).toEqual([10.5, 12.5, 14.5]);
    expect(traceContours(gridFromRows([[Number.NaN]]), { intervalM: 1 })).toEqual([]);
  });

  it('draws a plane as straight, evenly spaced lines with the high side on the right', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -3, max: 3, noNaN: true }).filter((a) => Math.abs(a) > 0.05),
        fc.double({ min: -3, max: 3, noNaN: true }),
        fc.double({ min: 0.2, max: 2, noNaN: true }),
        (dzdCol, dzdRow, intervalM) => {
          const plane = (col: number, row: number) => 50 + dzdCol * col + dzdRow * row;
          const grid = gridFromFunction(9, 7, plane);
          const gradient = Math.hypot(dzdCol, dzdRow);
          let previous: { elevationM: number; point: [number, number] } | undefined;
          for (const { elevationM, lines } of traceContours(grid, { intervalM, baseM: 0.123 })) {
            expect(lines.length).toBeLessThanOrEqual(1);
            const line = lines[0];
            if (line === undefined) continue;
            // Straight: every point is on the line plane = level.
            for (const [col, row] of line) expect(plane(col, row)).toBeCloseTo(elevationM, 9);
            // High side on the right on a north-up map (x = col, y = −row): a step (dc, −dr) has the
            // right normal (−dr, −dc), which must point up the gradient (dzdCol, −dzdRow).
            for (const [c0, r0, c1, r1] of segmentsOf(lines)) {
              const dc = c1 - c0;
              const dr = r1 - r0;
              if (Math.hypot(dc, dr) > 1e-9) expect(-dr * dzdCol + dc * dzdRow).toBeGreaterThan(0);
            }
            // Evenly spaced: a point of this line lies intervalM / |gradient| from the previous line.
            if (previous !== undefined && Math.abs(elevationM - previous.elevationM - intervalM) < 1e-9) {
              const [col, row] = line[0]!;
              const distance = Math.abs(plane(col, row) - plane(...previous.point)) / gradient;
              expect(distance).toBeCloseTo(intervalM / gradient, 9);
            }
            previous = { elevationM, point: line[0]! };
          }
        },
      ),
    );
  });

  it('stops lines at nodata and at the border, cutting a line in two round a hole', () => {
    // A plane rising east, 1 m per column; the level 2.5 runs north–south between columns 2 and 3.
    const grid = gridFromFunction(6, 7, (col) => col);
    grid.data[3 * 6 + 3] = Number.NaN;
    const [level] = traceContours(grid, { intervalM: 1, baseM: 0.5 }).filter((l) => l.elevationM === 2.5);
    // Walking north (high ground, east, on the right): rows 2 → 0 and 6 → 4, northern piece first;
    // the squares touching the hole at (3, 3) have no line.
    expect(level!.lines).toEqual([
      [
        [2.5, 2],
        [2.5, 1],
        [2.5, 0],
      ],
      [
        [2.5, 6],
        [2.5, 5],
        [2.5, 4],
      ],
    ]);
  });

  it('joins the high corners of a saddle only when the mean of the square is at or above the level', () => {
    const linesAt = (rows: number[][], intervalM: number, level: number) =>
      traceContours(gridFromRows(rows), { intervalM }).find((l) => l.elevationM === level)!.lines;
    // Mean 1.5 ≥ 1: the high corners (north-west, south-east) join; the lines cut off the low ones.
    expect(linesAt([[3, 0], [0, 3]], 1, 1)).toEqual([
      [[2 / 3, 0], [1, 1 / 3]],
      [[1 / 3, 1], [0, 2 / 3]],
    ]);
    // Mean 1.125 < 1.25: the high corners stay apart; the lines cut them off.
    const apart = linesAt([[3, 0], [0, 1.5]], 1.25, 1.25).flat(2);
    [7 / 12, 0, 0, 7 / 12, 5 / 6, 1, 1, 5 / 6].forEach((v, i) => expect(apart[i]).toBeCloseTo(v, 12));
    expect(apart).toHaveLength(8);
  });

  it('gives d3-contour’s segments, less its border segments, for every non-saddle square', () => {
    let compared = 0;
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 9 }),
        fc.integer({ min: 2, max: 9 }),
        fc.array(fc.integer({ min: 0, max: 6 }), { minLength: 81, maxLength: 81 }),
        fc.integer({ min: 0, max: 5 }),
        (width, height, heights, k) => {
          // Distinct offsets keep heights off the level and away from ties.
          const grid = gridFromFunction(width, height, (col, row) => heights[row * 9 + col]! + (row * width + col) * 1e-4);
          const level = k + 0.5;
          const values = Array.from(grid.data);
          const ourLevel = traceContours(grid, { intervalM: 1, baseM: 0.5 }).find((l) => l.elevationM === level);
          const ours = segmentsOf(ourLevel?.lines ?? []);
          const [polygon] = d3Contours().size([width, height]).thresholds([level])(values);
          const theirs: Segment[] = [];
          for (const rings of polygon!.coordinates) {
            for (const ring of rings) {
              for (let i = 1; i < ring.length; i++) {
                const s: Segment = [ring[i - 1]![0]! - 0.5, ring[i - 1]![1]! - 0.5, ring[i]![0]! - 0.5, ring[i]![1]! - 0.5];
                // d3-contour pads the grid: segments reaching the outer half cell are its border.
                const inside =
                  [s[0], s[2]].every((c) => c >= 0 && c <= width - 1) && [s[1], s[3]].every((r) => r >= 0 && r <= height - 1);
                if (inside) theirs.push(s);
              }
            }
          }
          const isSaddle = ([c0, r0, c1, r1]: Segment) => {
            const col = Math.floor((c0 + c1) / 2);
            const row = Math.floor((r0 + r1) / 2);
            const at = (c: number, r: number) => (grid.data[r * width + c]! >= level ? 1 : 0);
            const code = (at(col, row) << 3) | (at(col + 1, row) << 2) | (at(col + 1, row + 1) << 1) | at(col, row + 1);
            return code === 5 || code === 10;
          };
          const canonical = (segments: Segment[]) =>
            segments
              .filter((s) => !isSaddle(s))
              .map(([c0, r0, c1, r1]): Segment =>
                c0 < c1 - 1e-9 || (Math.abs(c0 - c1) <= 1e-9 && r0 < r1) ? [c0, r0, c1, r1] : [c1, r1, c0, r0],
              )
              .sort((a, b) => a[0] - b[0] || a[1] - b[1] || a[2] - b[2] || a[3] - b[3]);
          const a = canonical(ours);
          const b = canonical(theirs);
          expect(a.length).toBe(b.length);
          a.forEach((s, i) => s.forEach((v, j) => expect(v).toBeCloseTo(b[i]![j]!, 9)));
          compared += a.length;
        },
      ),
    );
    expect(compared).toBeGreaterThan(500);
  });

  it('traces the demo elevation model at a readable interval, keeping clear of its nodata corner', async () => {
    const image = await (await fromFile(DEM_PATH)).getImage();
    const [raw] = await image.readRasters();
    if (!(raw instanceof Float32Array)) throw new Error('expected a Float32 elevation model');
    const nodata = image.getGDALNoData();
    const data = raw.map((v) => (v === nodata ? Number.NaN : v));
    const grid = { width: 600, height: 600, data, ...uniformCellSize(600, 600, 5) };
    const valid = data.filter((v) => !Number.isNaN(v));
    const intervalM = chooseContourIntervalM(valid.reduce((a, v) => Math.min(a, v)), valid.reduce((a, v) => Math.max(a, v)));
    const levels = traceContours(grid, { intervalM });
    expect(levels.length).toBeGreaterThanOrEqual(9);
    expect(levels.length).toBeLessThanOrEqual(25);
    for (const { lines } of levels) {
      for (const line of lines) {
        for (const [col, row] of line) {
          expect(col >= 0 && col <= 599 && row >= 0 && row <= 599).toBe(true);
          // Every point lies on a side whose two cells are valid.
          expect(Number.isNaN(data[Math.floor(row) * 600 + Math.floor(col)]!)).toBe(false);
          expect(Number.isNaN(data[Math.ceil(row) * 600 + Math.ceil(col)]!)).toBe(false);
        }
      }
    }
  });

  it('does not modify its input', () => {
    const grid = gridFromRows([
      [1, 2, 3],
      [2, Number.NaN, 4],
      [3, 4, 5],
    ]);
    const before = Float64Array.from(grid.data);
    traceContours(grid, { intervalM: 0.5 });
    expect(grid.data).toEqual(before);
  });

  it('rejects a bad interval, base, or far too many levels', () => {
    const grid = gridFromRows([[0, 1000]]);
    expect(() => traceContours(grid, { intervalM: 0 })).toThrow(RangeError);
    expect(() => traceContours(grid, { intervalM: Number.NaN })).toThrow(RangeError);
    expect(() => traceContours(grid, { intervalM: 1, baseM: Infinity })).toThrow(RangeError);
    expect(() => traceContours(grid, { intervalM: 0.01 })).toThrow(/levels/);
  });
});

describe('chooseContourIntervalM', () => {
  it('picks from the 1–2–5 series (by hand)', () => {
    // The demo's few metres of relief: 0.5 m gives levels 140.0, 140.5, …, 150.0 = 21 lines.
    expect(chooseContourIntervalM(140, 150)).toBe(0.5);
    expect(chooseContourIntervalM(0, 1000)).toBe(50);
    expect(chooseContourIntervalM(3, 3)).toBe(0.1);
    expect(chooseContourIntervalM(100, 100.3)).toBe(0.1);
  });

  it('draws about 10 to 25 lines whatever the relief', () => {
    const lowest = fc.double({ min: -500, max: 5000, noNaN: true });
    fc.assert(
      fc.property(lowest, fc.double({ min: 2.6, max: 20_000, noNaN: true }), (minM, reliefM) => {
        const maxM = minM + reliefM;
        const intervalM = chooseContourIntervalM(minM, maxM);
        const mantissa = intervalM / 10 ** Math.floor(Math.log10(intervalM) + 1e-9);
        expect([1, 2, 5].some((m) => Math.abs(mantissa - m) < 1e-9)).toBe(true);
        const lines = Math.floor(maxM / intervalM) - Math.ceil(minM / intervalM) + 1;
        expect(lines).toBeGreaterThanOrEqual(9);
        expect(lines).toBeLessThanOrEqual(25);
      }),
    );
  });

  it('rejects non-finite or reversed heights', () => {
    expect(() => chooseContourIntervalM(2, 1)).toThrow(RangeError);
    expect(() => chooseContourIntervalM(Number.NaN, 1)).toThrow(RangeError);
  });
});
