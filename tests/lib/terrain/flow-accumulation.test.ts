import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  accumulateFlow,
  computeFlowDirections,
  D8_NONE,
  fillDepressions,
  uniformCellSize,
  type ElevationGrid,
} from '../../../src/lib/terrain/index';
import { downstreamOf, elevationModel, gridFromFunction, gridFromRows, toRows } from './helpers';

function accumulationOf(grid: ElevationGrid) {
  const directions = computeFlowDirections(fillDepressions(grid), grid);
  return { directions, ...accumulateFlow(directions, grid) };
}

describe('accumulateFlow', () => {
  it('counts the cells draining through each cell, itself included (by hand)', () => {
    // Directions [[SE, S, SW], [E, SE, S], [NE, E, out]]: five cells drain into the centre, which
    // drains with two more into the south-east corner.
    const grid = gridFromRows(
      [
        [9, 9, 9],
        [9, 5, 9],
        [9, 9, 1],
      ],
      2,
    );
    const { cells, areaM2 } = accumulationOf(grid);
    expect(toRows(cells, 3)).toEqual([
      [1, 1, 1],
      [1, 6, 1],
      [1, 1, 9],
    ]);
    expect(areaM2[8]).toBe(36);
  });

  // Analytic: on a plane falling only eastward every cell drains east along its row (east drop 1
  // beats 1/√2 to the north-east and south-east), so column x (from 0) accumulates x + 1 cells.
  it('accumulates x + 1 cells in column x of a plane inclined eastward', () => {
    const width = 9;
    const height = 6;
    const grid = gridFromFunction(width, height, (x) => 50 - x, 10);
    const { cells, areaM2 } = accumulationOf(grid);
    for (let y = 0; y < height; y++) {
      for (let x = 0; x < width; x++) {
        expect(cells[y * width + x]).toBe(x + 1);
        expect(areaM2[y * width + x]).toBeCloseTo((x + 1) * 100, 9);
      }
    }
  });

  // Analytic: a V-shaped valley z = 2|x − 10.3| + 0.1 (rows from the south end), thalweg at
  // x = 10.3 running south: the largest accumulation of each row lies within one cell of it.
  it('puts the channel of a V-shaped valley on its thalweg', () => {
    const width = 21;
    const height = 30;
    const thalwegX = 10.3;
    const grid = gridFromFunction(width, height, (x, row) => 2 * Math.abs(x - thalwegX) + 0.1 * (height - 1 - row), 10);
    const { cells } = accumulationOf(grid);
    for (let row = 0; row < height; row++) {
      const line = Array.from(cells.subarray(row * width, (row + 1) * width));
      const channelX = line.indexOf(Math.max(...line));
      expect(Math.abs(channelX - thalwegX), `row ${row}`).toBeLessThanOrEqual(1);
    }
    expect(Math.max(...cells)).toBe(width * height);
  });

  it('sums per-row cell areas (a geographic model whose cells narrow northward)', () => {
    const width = 7;
    const height = 5;
    // Cell widths of 1 arc-second at latitudes 30°..30.0011° S are about 26.7 m; any widths will do.
    const cellWidthM = new Float64Array([20, 21, 22, 23, 24]);
    const base = gridFromFunction(width, height, (x, row) => 30 - x - 0.1 * row + (x === 3 && row === 2 ? Number.NaN : 0));
    const grid = { ...base, cellWidthM, cellHeightM: 30 };
    const { directions, cells, areaM2 } = accumulationOf(grid);
    let expectedM2 = 0;
    let outletM2 = 0;
    for (let c = 0; c < width * height; c++) {
      if (Number.isNaN(grid.data[c]!)) continue;
      expectedM2 += cellWidthM[Math.floor(c / width)]! * 30;
      if (directions[c] === D8_NONE) outletM2 += areaM2[c]!;
    }
    expect(outletM2).toBeCloseTo(expectedM2, 6);
    expect(areaM2[0]).toBe(20 * 30);
    expect(cells[3 + 2 * width]).toBe(0);
    expect(areaM2[3 + 2 * width]).toBe(0);
  });

  it('does not mutate the directions', () => {
    const grid = gridFromRows([
      [3, 2, 1],
      [3, 2, 1],
    ]);
    const directions = computeFlowDirections(fillDepressions(grid), grid);
    const before = Array.from(directions);
    accumulateFlow(directions, grid);
    expect(Array.from(directions)).toEqual(before);
  });

  it('refuses cycles, bad codes, and directions leaving the grid or entering nodata', () => {
    const grid = { width: 2, height: 1, data: new Float64Array([1, 1]), ...uniformCellSize(2, 1, 1) };
    expect(() => accumulateFlow(new Uint8Array([0, 4]), grid)).toThrow(/cycle through 2 cells/);
    expect(() => accumulateFlow(new Uint8Array([9, 255]), grid)).toThrow(/invalid direction code 9/);
    expect(() => accumulateFlow(new Uint8Array([4, 255]), grid)).toThrow(/out of the grid/);
    const holed = { ...grid, data: new Float64Array([1, Number.NaN]) };
    expect(() => accumulateFlow(new Uint8Array([0, 255]), holed)).toThrow(/into nodata/);
    expect(() => accumulateFlow(new Uint8Array([255, 4]), holed)).toThrow(/nodata cell/);
    expect(() => accumulateFlow(new Uint8Array(3), grid)).toThrow(/width × height = 2/);
  });

  it('delivers every valid cell to exactly one outlet and grows downstream (property)', () => {
    fc.assert(
      fc.property(elevationModel, (grid) => {
        const { directions, cells, areaM2 } = accumulationOf(grid);
        let valid = 0;
        let atOutlets = 0;
        for (let c = 0; c < cells.length; c++) {
          if (Number.isNaN(grid.data[c]!)) {
            expect(cells[c]).toBe(0);
            continue;
          }
          valid++;
          const down = downstreamOf(directions, grid.width, c);
          if (down < 0) {
            atOutlets += cells[c]!;
          } else {
            expect(cells[down]!).toBeGreaterThan(cells[c]!);
            expect(areaM2[down]!).toBeGreaterThan(areaM2[c]!);
          }
        }
        expect(atOutlets).toBe(valid);
      }),
      { numRuns: 300 },
    );
  });
});
