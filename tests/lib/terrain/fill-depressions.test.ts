import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fillDepressions, uniformCellSize, type ElevationGrid } from '../../../src/lib/terrain/index';
import { elevationModel, gridFromFunction, gridFromRows, isOnBoundary, toRows } from './helpers';

/**
 * Independent reference: the filled surface as the fixed point of "water starts at +∞ everywhere
 * but the outlets and drops to max(own height, lowest neighbouring water)" (Planchon & Darboux
 * 2001, "A fast, simple and versatile algorithm to fill the depressions of digital elevation
 * models", Catena 46:159–176), iterated naively until nothing changes.
 */
function fillByPlanchonDarboux(grid: ElevationGrid): Float64Array {
  const { width, height, data } = grid;
  const water = new Float64Array(width * height);
  for (let c = 0; c < water.length; c++) {
    const z = data[c]!;
    water[c] = Number.isNaN(z) ? Number.NaN : isOnBoundary(grid, c) ? z : Number.POSITIVE_INFINITY;
  }
  for (let changed = true; changed; ) {
    changed = false;
    for (let y = 0; y < height; y++) {
      for (let x = 0; x < width; x++) {
        const c = y * width + x;
        if (!(water[c]! > data[c]!)) continue;
        for (let ny = Math.max(0, y - 1); ny <= Math.min(height - 1, y + 1); ny++) {
          for (let nx = Math.max(0, x - 1); nx <= Math.min(width - 1, x + 1); nx++) {
            const candidate = Math.max(data[c]!, water[ny * width + nx]!);
            if (candidate < water[c]!) {
              water[c] = candidate;
              changed = true;
            }
          }
        }
      }
    }
  }
  return water;
}

describe('fillDepressions', () => {
  it('fills a one-cell pit to its lowest neighbour (by hand)', () => {
    const grid = gridFromRows([
      [5, 6, 5],
      [6, 1, 4],
      [5, 6, 5],
    ]);
    expect(toRows(fillDepressions(grid), 3)).toEqual([
      [5, 6, 5],
      [6, 4, 4],
      [5, 6, 5],
    ]);
  });

  // Derived check, shared/references.md "Terrain analysis": a pit of 1 inside a ring of 5s inside
  // a rim of 9s with one 8 on the south edge fills every interior cell to 8 (Priority-Flood, Barnes,
  // Lehman & Mulla 2014, Computers & Geosciences 62:117–127).
  it('fills the 5×5 pit case of references.md to the spill height 8', () => {
    const grid = gridFromRows([
      [9, 9, 9, 9, 9],
      [9, 5, 5, 5, 9],
      [9, 5, 1, 5, 9],
      [9, 5, 5, 5, 9],
      [9, 9, 8, 9, 9],
    ]);
    expect(toRows(fillDepressions(grid), 5)).toEqual([
      [9, 9, 9, 9, 9],
      [9, 8, 8, 8, 9],
      [9, 8, 8, 8, 9],
      [9, 8, 8, 8, 9],
      [9, 9, 8, 9, 9],
    ]);
  });

  // Analytic: a cone-shaped bowl z = 10 + r (r cells from the centre) with a notch at height 15
  // cut from the lake to the south edge; the lake fills exactly to the notch, max(z, 15).
  it('fills a bowl with one spill point to the spill height', () => {
    const notch = (x: number, y: number) => x === 7 && y >= 12;
    const grid = gridFromFunction(15, 15, (x, y) => (notch(x, y) ? 15 : 10 + Math.hypot(x - 7, y - 7)));
    const filled = fillDepressions(grid);
    for (let c = 0; c < filled.length; c++) expect(filled[c]).toBe(Math.max(grid.data[c]!, 15));
    expect(filled[7 * 15 + 7]).toBe(15);
  });

  // Analytic: basin A (west) spills over a saddle at 6 into basin B (east), which spills over the
  // east edge at 4: A fills to 6 and B to 4.
  it('fills two basins joined by a saddle to their own spill levels', () => {
    const profile = [20, 4, 1, 2, 5, 6, 3, 2, 3, 3.5, 20];
    const grid = gridFromFunction(11, 5, (x, y) => (y === 0 || y === 4 ? 20 : x === 10 && y === 2 ? 4 : profile[x]!));
    const filled = toRows(fillDepressions(grid), 11);
    for (const y of [1, 2, 3]) {
      expect(filled[y]!.slice(1, 6)).toEqual([6, 6, 6, 6, 6]);
      expect(filled[y]!.slice(6, 10)).toEqual([4, 4, 4, 4]);
    }
    expect(filled[2]![10]).toBe(4);
  });

  it('treats cells next to nodata as outlets and keeps nodata as NaN', () => {
    const grid = gridFromRows([
      [9, 9, 9, 9, 9],
      [9, 1, 9, 2, 9],
      [9, 9, 9, 9, Number.NaN],
      [9, 9, 9, 9, 9],
    ]);
    const filled = toRows(fillDepressions(grid), 5);
    expect(filled[1]).toEqual([9, 9, 9, 2, 9]);
    expect(filled[2]![4]).toBeNaN();
  });

  it('does not mutate its input and returns a new Float64Array', () => {
    const data = new Float32Array([3, 3, 3, 3, 0, 3, 3, 3, 3]);
    const grid = { width: 3, height: 3, data, ...uniformCellSize(3, 3, 1) };
    const filled = fillDepressions(grid);
    expect(Array.from(data)).toEqual([3, 3, 3, 3, 0, 3, 3, 3, 3]);
    expect(filled).toBeInstanceOf(Float64Array);
    expect(filled).not.toBe(data);
    expect(filled[4]).toBe(3);
  });

  it('handles single cells, single rows and all-nodata grids', () => {
    expect(Array.from(fillDepressions(gridFromRows([[7]])))).toEqual([7]);
    expect(Array.from(fillDepressions(gridFromRows([[3, 1, 3]])))).toEqual([3, 1, 3]);
    expect(fillDepressions(gridFromRows([[Number.NaN, Number.NaN]])).every(Number.isNaN)).toBe(true);
  });

  it('rejects a grid whose data does not match its shape', () => {
    expect(() => fillDepressions({ ...gridFromRows([[1, 2]]), width: 3 })).toThrow(/width × height/);
  });

  it('is never lower than the input, keeps nodata, and is idempotent (property)', () => {
    fc.assert(
      fc.property(elevationModel, (grid) => {
        const filled = fillDepressions(grid);
        for (let c = 0; c < filled.length; c++) {
          if (Number.isNaN(grid.data[c]!)) expect(filled[c]).toBeNaN();
          else expect(filled[c]!).toBeGreaterThanOrEqual(grid.data[c]!);
        }
        expect(fillDepressions({ ...grid, data: filled })).toEqual(filled);
      }),
      { numRuns: 300 },
    );
  });

  it('equals the Planchon & Darboux (2001) fixed point on random models (property)', () => {
    fc.assert(
      fc.property(elevationModel, (grid) => {
        expect(fillDepressions(grid)).toEqual(fillByPlanchonDarboux(grid));
      }),
      { numRuns: 300 },
    );
  });
});
