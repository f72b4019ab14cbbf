import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  accumulateFlow,
  computeFlowDirections,
  D8_DX,
  D8_DY,
  D8_NONE,
  D8_NORTH,
  D8_NORTH_EAST,
  D8_EAST,
  fillDepressions,
  type ElevationGrid,
} from '../../../src/lib/terrain/index';
import { elevationModel, gridFromFunction, gridFromRows, isOnBoundary, toRows, traceToOutlet } from './helpers';

function directionsOf(grid: ElevationGrid): Uint8Array {
  return computeFlowDirections(fillDepressions(grid), grid);
}

describe('computeFlowDirections', () => {
  it('sends each cell down its steepest drop, diagonals over √2 (by hand)', () => {
    const grid = gridFromRows([
      [9, 9, 9],
      [9, 5, 9],
      [9, 9, 1],
    ]);
    expect(toRows(directionsOf(grid), 3)).toEqual([
      [1, 2, 3],
      [0, 1, 2],
      [7, 0, 255],
    ]);
  });

  it('drains an edge cell into the model when it has a lower neighbour, out only otherwise (by hand)', () => {
    // West edge 4 drains east to 2; the north-west corner prefers the drop 5 south over 7/√2 = 4.95
    // south-east; the east edge 1 has no lower neighbour and drains out.
    const grid = gridFromRows([
      [9, 9, 9],
      [4, 2, 1],
      [9, 9, 9],
    ]);
    const rows = toRows(directionsOf(grid), 3);
    expect(rows[1]).toEqual([0, 0, 255]);
    expect(rows[0]![0]).toBe(2);
  });

  it('drains a level strip towards its outlet (by hand)', () => {
    const grid = gridFromRows([
      [9, 9, 9, 9, 9],
      [9, 5, 5, 5, 1],
      [9, 9, 9, 9, 9],
    ]);
    expect(toRows(directionsOf(grid), 5)).toEqual([
      [1, 2, 2, 1, 2],
      [0, 0, 0, 0, 255],
      [7, 6, 6, 7, 6],
    ]);
  });

  // Worked by hand from the method of Barnes, Lehman & Mulla (2014), Computers & Geosciences
  // 62:128–135: on a level 5 × 3 flat inside a rim of 9s with an outlet of 1 in the east rim,
  // the gradient 2 × (steps to the low edges) − (steps from the rim) is, for columns 1–4,
  //   row 1: 9 7 5 3    row 2: 9 6 4 2    row 3: 9 7 5 3
  // so the outer rows converge diagonally on the middle row instead of running parallel to it.
  it('drains a flat towards lower ground and away from higher ground (by hand)', () => {
    const grid = gridFromRows([
      [9, 9, 9, 9, 9, 9, 9],
      [9, 5, 5, 5, 5, 5, 9],
      [9, 5, 5, 5, 5, 5, 1],
      [9, 5, 5, 5, 5, 5, 9],
      [9, 9, 9, 9, 9, 9, 9],
    ]);
    const rows = toRows(directionsOf(grid), 7);
    expect(rows.slice(1, 4).map((row) => row.slice(1, 6))).toEqual([
      [1, 1, 1, 0, 1],
      [0, 0, 0, 0, 0],
      [7, 7, 7, 0, 7],
    ]);
  });

  // Derived check, shared/references.md "Terrain analysis": on the plane z = 10 − x − 0.5y (cell 1,
  // y northward) D8 sends all flow north-east, drop 1.5/√2 = 1.061 beating 1.0 east (D8, O'Callaghan
  // & Mark 1984, CVGIP 28:323–344). Rows run north to south, so y = height − 1 − row.
  it('sends all flow north-east on the plane z = 10 − x − 0.5y (references.md)', () => {
    const width = 6;
    const height = 5;
    const grid = gridFromFunction(width, height, (x, row) => 10 - x - 0.5 * (height - 1 - row));
    const directions = directionsOf(grid);
    for (let row = 0; row < height; row++) {
      for (let x = 0; x < width; x++) {
        const d = directions[row * width + x];
        // Cells on the north or east edge have no north-east neighbour: east along the north edge
        // (1.0 beats 0.5/√2), north along the east edge (0.5), out at the north-east corner.
        const expected =
          row > 0 && x < width - 1 ? D8_NORTH_EAST : row === 0 && x < width - 1 ? D8_EAST : row > 0 ? D8_NORTH : D8_NONE;
        expect(d, `col ${x}, row ${row}`).toBe(expected);
      }
    }
  });

  it('weights drops by the per-row cell widths', () => {
    // z falls 1 per column eastward and 1.5 per row southward. With 1 m cells: east 1, south 1.5,
    // south-east 2.5/√2 = 1.77 wins. With 0.25 m wide cells: east 1/0.25 = 4 beats
    // south-east 2.5/√(0.25² + 1) = 2.43.
    const base = gridFromFunction(5, 5, (x, row) => 100 - x - 1.5 * row);
    expect(directionsOf(base)[2 * 5 + 2]).toBe(1);
    const narrow = { ...base, cellWidthM: new Float64Array([1, 1, 0.25, 1, 1]) };
    expect(computeFlowDirections(fillDepressions(narrow), narrow)[2 * 5 + 2]).toBe(0);
  });

  // Regression: a level plateau inside a rim, drained through one notch in the rim.
  it('flat-plateau-drains-to-outlet', () => {
    const width = 12;
    const height = 10;
    const notch = (height - 1) * width + 5;
    const grid = gridFromFunction(width, height, (x, y) =>
      y * width + x === notch ? 9 : x === 0 || y === 0 || x === width - 1 || y === height - 1 ? 12 : 10,
    );
    const filled = fillDepressions(grid);
    expect(filled).toEqual(grid.data);
    const directions = computeFlowDirections(filled, grid);
    for (let c = 0; c < width * height; c++) expect(traceToOutlet(directions, grid, c)).toBe(notch);
    expect(accumulateFlow(directions, grid).cells[notch]).toBe(width * height);
  });

  it('does not mutate the filled surface or the grid', () => {
    const grid = gridFromRows([
      [3, 3, 3, 3],
      [3, 2, 2, 3],
      [3, 2, 2, 1],
    ]);
    const before = Array.from(grid.data);
    const filled = fillDepressions(grid);
    const filledBefore = Array.from(filled);
    computeFlowDirections(filled, grid);
    expect(Array.from(grid.data)).toEqual(before);
    expect(Array.from(filled)).toEqual(filledBefore);
  });

  it('refuses a surface with an unfilled depression, and a surface of the wrong length', () => {
    const pit = gridFromRows([
      [5, 5, 5, 5],
      [5, 1, 1, 5],
      [5, 5, 5, 5],
    ]);
    expect(() => computeFlowDirections(new Float64Array(pit.data), pit)).toThrow(/fillDepressions/);
    expect(() => computeFlowDirections(new Float64Array(3), pit)).toThrow(/width × height = 12/);
  });

  it('drains every valid cell, downhill or level, to an outlet on the edge or by nodata (property)', () => {
    fc.assert(
      fc.property(elevationModel, (grid) => {
        const filled = fillDepressions(grid);
        const directions = computeFlowDirections(filled, grid);
        const { width, height } = grid;
        for (let c = 0; c < width * height; c++) {
          if (Number.isNaN(filled[c]!)) {
            expect(directions[c]).toBe(D8_NONE);
            continue;
          }
          const outlet = traceToOutlet(directions, grid, c);
          expect(isOnBoundary(grid, outlet)).toBe(true);
          const d = directions[c]!;
          const x = c % width;
          const y = (c - x) / width;
          // Steepest lower neighbour, distance-weighted (O'Callaghan & Mark 1984).
          let steepest = 0;
          for (let k = 0; k < 8; k++) {
            const nx = x + D8_DX[k]!;
            const ny = y + D8_DY[k]!;
            if (nx < 0 || ny < 0 || nx >= width || ny >= height) continue;
            const drop = (filled[c]! - filled[ny * width + nx]!) * (1 / Math.hypot(D8_DX[k]!, D8_DY[k]!));
            if (drop > steepest) steepest = drop;
          }
          if (d === D8_NONE) {
            expect(steepest).toBe(0);
            continue;
          }
          const down = (y + D8_DY[d]!) * width + x + D8_DX[d]!;
          const drop = (filled[c]! - filled[down]!) * (1 / Math.hypot(D8_DX[d]!, D8_DY[d]!));
          expect(drop).toBe(steepest);
        }
      }),
      { numRuns: 300 },
    );
  });
});
