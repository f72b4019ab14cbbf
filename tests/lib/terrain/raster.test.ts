import { describe, expect, it } from 'vitest';
import {
  checkElevationGrid,
  D8_DX,
  D8_DY,
  D8_EAST,
  D8_NONE,
  D8_NORTH,
  D8_NORTH_EAST,
  D8_NORTH_WEST,
  D8_SOUTH,
  D8_SOUTH_EAST,
  D8_SOUTH_WEST,
  D8_WEST,
  uniformCellSize,
} from '../../../src/lib/terrain/index';

describe('uniformCellSize', () => {
  it('gives every row the same width and the same height', () => {
    const size = uniformCellSize(4, 3, 5);
    expect(Array.from(size.cellWidthM)).toEqual([5, 5, 5]);
    expect(size.cellHeightM).toBe(5);
  });

  it('rejects bad dimensions and sizes with a message', () => {
    expect(() => uniformCellSize(0, 3, 5)).toThrow(/positive integers/);
    expect(() => uniformCellSize(2.5, 3, 5)).toThrow(/positive integers/);
    expect(() => uniformCellSize(2, 3, 0)).toThrow(/> 0/);
    expect(() => uniformCellSize(2, 3, Number.NaN)).toThrow(/> 0/);
  });
});

describe('checkElevationGrid', () => {
  const good = { width: 2, height: 2, data: new Float32Array(4), ...uniformCellSize(2, 2, 1) };

  it('accepts a well-formed grid', () => {
    expect(() => checkElevationGrid(good)).not.toThrow();
  });

  it('names what was expected when the shape is wrong', () => {
    expect(() => checkElevationGrid({ ...good, data: new Float32Array(3) })).toThrow(/expected width × height = 4/);
    expect(() => checkElevationGrid({ ...good, cellWidthM: new Float64Array(3) })).toThrow(/one width per row/);
    expect(() => checkElevationGrid({ ...good, cellWidthM: new Float64Array([1, -1]) })).toThrow(/cellWidthM\[1\]/);
    expect(() => checkElevationGrid({ ...good, cellHeightM: Number.POSITIVE_INFINITY })).toThrow(/cellHeightM/);
  });
});

describe('D8 encoding', () => {
  it('runs clockwise on the map from east, rows growing southward', () => {
    const steps = [D8_EAST, D8_SOUTH_EAST, D8_SOUTH, D8_SOUTH_WEST, D8_WEST, D8_NORTH_WEST, D8_NORTH, D8_NORTH_EAST].map(
      (d) => [D8_DX[d], D8_DY[d]],
    );
    expect(steps).toEqual([
      [1, 0],
      [1, 1],
      [0, 1],
      [-1, 1],
      [-1, 0],
      [-1, -1],
      [0, -1],
      [1, -1],
    ]);
    expect(D8_NONE).toBe(255);
  });

  it('has the opposite direction at (d + 4) & 7', () => {
    for (let d = 0; d < 8; d++) {
      expect(D8_DX[(d + 4) & 7]! + D8_DX[d]!).toBe(0);
      expect(D8_DY[(d + 4) & 7]! + D8_DY[d]!).toBe(0);
    }
  });
});
