import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { accumulateFlow, computeFlowDirections, fillDepressions } from '../../../src/lib/terrain/index';
import { traceDrainageLines } from '../../../src/lib/terrain/drainage-lines';
import type { GridTransform } from '../../../src/lib/terrain/grid-transform';
import { D8_NONE, D8_SOUTH, D8_SOUTH_EAST, D8_SOUTH_WEST } from '../../../src/lib/terrain/raster';
import { elevationModel, gridFromFunction, gridFromRows } from './helpers';

// Cell (col, row) centre at x = col + 0.5, y = -(row + 0.5): 1 m cells, origin at (0, 0).
const unit: GridTransform = { originX: 0, originY: 0, cellSizeX: 1, cellSizeY: 1 };

function pipeline(grid: ReturnType<typeof gridFromRows>) {
  const filled = fillDepressions(grid);
  const directions = computeFlowDirections(filled, grid);
  return { filled, directions, accumulation: accumulateFlow(directions, grid) };
}

describe('traceDrainageLines', () => {
  it('splits a Y-shaped network at its confluence and orders it by Strahler (checked by hand)', () => {
    const _ = NaN;
    // Two arms from the top corners meet at (2, 2) and leave through the south edge at (2, 3).
    const grid = gridFromRows([
      [9, _, _, _, 9],
      [_, 8, _, 8, _],
      [_, _, 7, _, _],
      [_, _, 6, _, _],
    ]);
    const directions = new Uint8Array(20).fill(D8_NONE);
    directions[0] = D8_SOUTH_EAST;
    directions[6] = D8_SOUTH_EAST;
    directions[4] = D8_SOUTH_WEST;
    directions[8] = D8_SOUTH_WEST;
    directions[12] = D8_SOUTH;
    const accumulation = accumulateFlow(directions, grid);
    const filled = Float64Array.from(grid.data);
    const segments = traceDrainageLines(grid, filled, directions, accumulation, unit, { thresholdHa: 0.0001, simplifyCells: 0 });

    expect(segments.map((s) => s.coordinates)).toEqual([
      [[0.5, -0.5], [1.5, -1.5], [2.5, -2.5]],
      [[4.5, -0.5], [3.5, -1.5], [2.5, -2.5]],
      [[2.5, -2.5], [2.5, -3.5]],
    ]);
    expect(segments.map((s) => s.order)).toEqual([1, 1, 2]);
    expect(segments.map((s) => s.downstreamId)).toEqual([2, 2, null]);
    expect(segments[0]!.lengthM).toBeCloseTo(2 * Math.SQRT2, 12);
    expect(segments[0]!.meanSlope).toBeCloseTo(2 / (2 * Math.SQRT2), 12);
    expect(segments[2]).toMatchObject({ upstreamAreaStartM2: 5, upstreamAreaEndM2: 6, lengthM: 1, meanSlope: 1 });
  });

  it('follows the thalweg of a V-shaped valley within one cell', () => {
    // Sides rise 0.2 m per cell from column 10; the valley falls 0.05 m per cell southward.
    const grid = gridFromFunction(21, 40, (col, row) => 0.2 * Math.abs(col - 10) + 0.05 * (39 - row), 5);
    const { filled, directions, accumulation } = pipeline(grid);
    const transform: GridTransform = { originX: 1000, originY: 2000, cellSizeX: 5, cellSizeY: 5 };
    const segments = traceDrainageLines(grid, filled, directions, accumulation, transform, { thresholdHa: 0.5 });
    const thalwegX = 1000 + 10.5 * 5;
    expect(segments.length).toBeGreaterThan(0);
    const main = segments.reduce((a, b) => (b.upstreamAreaEndM2 > a.upstreamAreaEndM2 ? b : a));
    for (const [x] of main.coordinates) expect(Math.abs(x - thalwegX)).toBeLessThanOrEqual(5);
    // The main line reaches the south edge and runs downstream (y decreasing).
    const ys = main.coordinates.map(([, y]) => y);
    expect(ys[ys.length - 1]).toBeCloseTo(2000 - 39.5 * 5, 9);
    expect(ys).toEqual([...ys].sort((a, b) => b - a));
  });

  it('does not change its inputs', () => {
    const grid = gridFromFunction(12, 12, (col, row) => Math.abs(col - 6) + (11 - row));
    const { filled, directions, accumulation } = pipeline(grid);
    const copies = [Float64Array.from(filled), Uint8Array.from(directions), Float64Array.from(accumulation.areaM2)];
    traceDrainageLines(grid, filled, directions, accumulation, unit, { thresholdHa: 0.0005 });
    expect([filled, directions, accumulation.areaM2]).toEqual(copies);
  });

  it('refuses a threshold that is not a positive number of hectares', () => {
    const grid = gridFromRows([[1, 2], [3, 4]]);
    const { filled, directions, accumulation } = pipeline(grid);
    for (const thresholdHa of [0, -1, Number.NaN]) {
      expect(() => traceDrainageLines(grid, filled, directions, accumulation, unit, { thresholdHa })).toThrow(/positive number of hectares/);
    }
  });

  it('keeps the network connected on random models: lines meet end to start, orders and areas never fall downstream', () => {
    fc.assert(
      fc.property(elevationModel, fc.integer({ min: 1, max: 6 }), (grid, thresholdCells) => {
        const { filled, directions, accumulation } = pipeline(grid);
        const segments = traceDrainageLines(grid, filled, directions, accumulation, unit, {
          thresholdHa: thresholdCells / 10_000,
          simplifyCells: 0.75,
        });
        for (const segment of segments) {
          expect(segment.coordinates.length).toBeGreaterThanOrEqual(2);
          expect(segment.upstreamAreaEndM2).toBeGreaterThanOrEqual(segment.upstreamAreaStartM2);
          expect(segment.upstreamAreaStartM2).toBeGreaterThanOrEqual(thresholdCells);
          expect(segment.meanSlope).toBeGreaterThanOrEqual(0);
          if (segment.downstreamId === null) continue;
          const next = segments[segment.downstreamId]!;
          expect(next.id).toBeGreaterThan(segment.id);
          expect(next.coordinates[0]).toEqual(segment.coordinates[segment.coordinates.length - 1]);
          expect(next.order).toBeGreaterThanOrEqual(segment.order);
        }
      }),
      { numRuns: 300 },
    );
  });
});
