import { describe, expect, it } from 'vitest';
import { accumulateFlow, computeFlowDirections, fillDepressions } from '../../../src/lib/terrain/index';
import { delineateCatchment, outletCellNear } from '../../../src/lib/terrain/catchment';
import type { GridTransform } from '../../../src/lib/terrain/grid-transform';
import { gridFromFunction } from './helpers';

function prepare(grid: ReturnType<typeof gridFromFunction>) {
  const filled = fillDepressions(grid);
  const directions = computeFlowDirections(filled, grid);
  return { filled, directions, accumulation: accumulateFlow(directions, grid) };
}

const transform: GridTransform = { originX: 500_000, originY: 6_000_000, cellSizeX: 10, cellSizeY: 10 };

describe('delineateCatchment', () => {
  it('on a plane falling south, the catchment of a bottom cell is its column (analytic case)', () => {
    // z = 0.1 m per row southward on 10 m cells: D8 drop south 0.1 beats 0.1/√2 diagonally.
    const grid = gridFromFunction(8, 30, (_col, row) => 0.1 * (29 - row), 10);
    const { filled, directions, accumulation } = prepare(grid);
    const bottomOfColumn3: [number, number] = [500_000 + 35, 6_000_000 - 295];
    const catchment = delineateCatchment(grid, filled, directions, accumulation, transform, bottomOfColumn3, 0)!;
    expect(catchment.cellCount).toBe(30);
    expect(catchment.areaM2).toBe(30 * 100);
    expect(catchment.longestFlowPathM).toBeCloseTo(29 * 10, 9);
    // A straight profile's equal-area slope is its own slope: 0.1 m per 10 m.
    expect(catchment.equalAreaSlope).toBeCloseTo(0.01, 12);
    expect(catchment.longestFlowPath[0]).toEqual([500_035, 6_000_000 - 5]);
    const xs = catchment.polygon.flat(2).map(([x]) => x);
    expect(Math.min(...xs)).toBeGreaterThanOrEqual(500_030);
    expect(Math.max(...xs)).toBeLessThanOrEqual(500_040);
  });

  it('gives the same figures without the outline, and no outline', () => {
    const grid = gridFromFunction(21, 30, (col, row) => 0.3 * Math.abs(col - 10) + 0.05 * (29 - row), 10);
    const { filled, directions, accumulation } = prepare(grid);
    const point: [number, number] = [500_000 + 105, 6_000_000 - 255];
    const full = delineateCatchment(grid, filled, directions, accumulation, transform, point, 20)!;
    const figures = delineateCatchment(grid, filled, directions, accumulation, transform, point, 20, { outline: false })!;
    expect(full.polygon.length).toBeGreaterThan(0);
    expect(figures).toEqual({ ...full, polygon: [] });
  });

  it('snaps a point beside a channel to the channel within the search radius', () => {
    const grid = gridFromFunction(21, 30, (col, row) => 0.3 * Math.abs(col - 10) + 0.05 * (29 - row), 10);
    const { filled, directions, accumulation } = prepare(grid);
    const besideThalweg: [number, number] = [500_000 + 135, 6_000_000 - 255]; // column 13, row 25
    const snapped = delineateCatchment(grid, filled, directions, accumulation, transform, besideThalweg, 40)!;
    expect(snapped.outlet.col).toBe(10);
    const unsnapped = delineateCatchment(grid, filled, directions, accumulation, transform, besideThalweg, 0)!;
    expect(unsnapped.outlet.col).toBe(13);
    expect(snapped.areaM2).toBeGreaterThan(unsnapped.areaM2);
  });

  it('outletCellNear names the cell the catchment starts from (the key a server may keep it by)', () => {
    const grid = gridFromFunction(21, 30, (col, row) => 0.3 * Math.abs(col - 10) + 0.05 * (29 - row), 10);
    const { filled, directions, accumulation } = prepare(grid);
    for (const [point, radius] of [[[500_135, 6_000_000 - 255], 40], [[500_135, 6_000_000 - 255], 0], [[500_101, 6_000_000 - 201], 15]] as [[number, number], number][]) {
      const catchment = delineateCatchment(grid, filled, directions, accumulation, transform, point, radius)!;
      expect(outletCellNear(grid, accumulation.areaM2, transform, point, radius)).toBe(catchment.outlet.row * grid.width + catchment.outlet.col);
    }
    expect(outletCellNear(grid, accumulation.areaM2, transform, [400_000, 6_000_000], 40)).toBe(-1);
  });

  it('equal-area slope of a concave profile lies between its steepest and flattest parts', () => {
    // Steep near the head, flat near the outlet, as creeks are.
    const grid = gridFromFunction(5, 40, (_col, row) => Math.sqrt(39 - row), 10);
    const { filled, directions, accumulation } = prepare(grid);
    const catchment = delineateCatchment(grid, filled, directions, accumulation, transform, [500_025, 6_000_000 - 395], 0)!;
    const meanSlope = Math.sqrt(39) / (39 * 10);
    // For z = √d the equal-area line is steeper than the mean slope (more area lies high up).
    expect(catchment.equalAreaSlope).toBeGreaterThan(meanSlope);
    expect(catchment.equalAreaSlope).toBeLessThan(1 / 10);
  });

  it('answers null off the model and does not change its inputs', () => {
    const grid = gridFromFunction(6, 6, (col, row) => col + row, 10);
    const { filled, directions, accumulation } = prepare(grid);
    const before = Float64Array.from(filled);
    expect(delineateCatchment(grid, filled, directions, accumulation, transform, [0, 0], 50)).toBeNull();
    delineateCatchment(grid, filled, directions, accumulation, transform, [500_025, 5_999_975], 0);
    expect(filled).toEqual(before);
  });
});
