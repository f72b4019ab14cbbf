/**
 * Slope by Horn's method, checked by hand, on planes, on a geographic-like model, and against GDAL.
 *
 * Outside references used here:
 * - Horn (1981), "Hill shading and the reflectance map", Proceedings of the IEEE 69(1):14–47: the
 *   weighted 3 × 3 differences are exact on a plane, whose slope is atan(|gradient|).
 * - GDAL gdaldem (Debian gdal-bin 3.6), Horn 1981: `gdaldem slope` (degrees) on the demo elevation
 *   model, with and without `-compute_edges`.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { fromFile } from 'geotiff';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { computeSlope, hornDifferences, type ElevationGrid } from '../../../src/lib/terrain/index';
import { elevationModel, gridFromFunction, gridFromRows, isOnBoundary, toRows } from './helpers';
import { readDemoModel, runGdal } from '../../helpers/gdal';

const DEM_PATH = resolve(dirname(fileURLToPath(import.meta.url)), '../../../data-samples/saltbush-rise-dem.tif');
const DEG = 180 / Math.PI;

describe('computeSlope', () => {
  it('gives 45° for a rise of one cell size per cell (by hand)', () => {
    // (0 + 2·0 + 0) − (2 + 2·2 + 2) = −8; atan(√(8²) / 8) = atan 1 = 45°.
    const grid = gridFromRows([
      [0, 1, 2],
      [0, 1, 2],
      [0, 1, 2],
    ]);
    expect(toRows(computeSlope(grid), 3)).toEqual([
      [NaN, NaN, NaN],
      [NaN, 45, NaN],
      [NaN, NaN, NaN],
    ]);
    expect(hornDifferences(grid).westMinusEastM[4]).toBe(-8);
    expect(hornDifferences(grid).southMinusNorthM[4]).toBe(0);
  });

  it('gives a plane its constant slope atan(|gradient|) (Horn 1981: exact on planes)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -5, max: 5, noNaN: true }),
        fc.double({ min: -5, max: 5, noNaN: true }),
        fc.double({ min: 0.5, max: 100, noNaN: true }),
        (dzdEast, dzdNorth, cellM) => {
          const grid = gridFromFunction(5, 4, (col, row) => 200 + dzdEast * col * cellM - dzdNorth * row * cellM, cellM);
          const slope = computeSlope(grid);
          const expected = Math.atan(Math.hypot(dzdEast, dzdNorth)) * DEG;
          for (let i = 0; i < slope.length; i++) {
            if (isOnBoundary(grid, i)) expect(slope[i]).toBeNaN();
            else expect(Math.abs(slope[i]! - expected)).toBeLessThan(1e-4);
          }
        },
      ),
    );
  });

  it('with computeEdges, extends a plane to its edges (corners of the first and last rows excepted, as gdaldem)', () => {
    // gdaldem's first and last rows repeat the edge column in the window, so their two corner
    // cells see half the west–east gradient; every other edge cell is extrapolated exactly.
    const width = 6;
    const height = 5;
    const grid = gridFromFunction(width, height, (col, row) => 10 + 0.3 * col + 0.4 * row, 2);
    const slope = computeSlope(grid, { computeEdges: true });
    const expected = Math.atan(Math.hypot(0.15, 0.2)) * DEG;
    const halfEast = Math.atan(Math.hypot(0.075, 0.2)) * DEG;
    for (let row = 0; row < height; row++) {
      for (let col = 0; col < width; col++) {
        const corner = (row === 0 || row === height - 1) && (col === 0 || col === width - 1);
        expect(slope[row * width + col], `col ${col}, row ${row}`).toBeCloseTo(corner ? halfEast : expected, 4);
      }
    }
  });

  it('uses each row’s own cell width: rows of narrower cells are steeper (geographic-like model)', () => {
    // Heights rise 1 m per column, cells narrow northward: slope on row r is atan(1 m / width_r).
    // Heights rise 0.5 m per row southward: slope atan(0.5 / cellHeightM), whatever the widths.
    const widths = [2, 3, 4, 5, 6, 7];
    const cells = { cellWidthM: Float64Array.from(widths), cellHeightM: 5 };
    const eastward: ElevationGrid = { ...gridFromFunction(4, 6, (col) => col), ...cells };
    const southward: ElevationGrid = { ...gridFromFunction(4, 6, (_col, row) => 0.5 * row), ...cells };
    const slopeEast = computeSlope(eastward);
    const slopeSouth = computeSlope(southward);
    for (let row = 1; row < 5; row++) {
      for (let col = 1; col < 3; col++) {
        expect(slopeEast[row * 4 + col], `row ${row}`).toBeCloseTo(Math.atan(1 / widths[row]!) * DEG, 5);
        expect(slopeSouth[row * 4 + col], `row ${row}`).toBeCloseTo(Math.atan(0.5 / 5) * DEG, 5);
      }
    }
  });

  it('is NaN on nodata, on the edge and next to nodata, and 0..90° elsewhere', () => {
    fc.assert(
      fc.property(elevationModel, (grid) => {
        const slope = computeSlope(grid);
        expect(slope).toBeInstanceOf(Float32Array);
        expect(slope.length).toBe(grid.width * grid.height);
        for (let i = 0; i < slope.length; i++) {
          if (Number.isNaN(grid.data[i]!) || isOnBoundary(grid, i)) expect(slope[i]).toBeNaN();
          else expect(slope[i]! >= 0 && slope[i]! <= 90).toBe(true);
        }
        // With computeEdges only nodata itself (and grids under 2 × 2) stay nodata.
        const edges = computeSlope(grid, { computeEdges: true });
        const tiny = grid.width < 2 || grid.height < 2;
        for (let i = 0; i < edges.length; i++) expect(Number.isNaN(edges[i]!)).toBe(tiny || Number.isNaN(grid.data[i]!));
      }),
    );
  });

  it('does not modify its input', () => {
    const grid = gridFromRows([
      [5, 4, 3, 2],
      [4, Number.NaN, 2, 1],
      [3, 2, 1, 0],
    ]);
    const before = Float64Array.from(grid.data);
    computeSlope(grid, { computeEdges: true });
    computeSlope(grid);
    expect(grid.data).toEqual(before);
  });

  it('rejects a malformed grid', () => {
    const grid = gridFromRows([[1, 2]]);
    expect(() => computeSlope({ ...grid, data: new Float64Array(3) })).toThrow(RangeError);
  });
});

// GDAL gdaldem (Debian gdal-bin 3.6), Horn 1981: slope in degrees on the demo elevation model.
describe('computeSlope against GDAL gdaldem (Debian gdal-bin 3.6), Horn 1981', () => {
  let dir = '';
  let dem: ElevationGrid;

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'gullyline-slope-'));
    dem = await readDemoModel();
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  for (const computeEdges of [false, true]) {
    it(`matches gdaldem slope${computeEdges ? ' -compute_edges' : ''} within 0.01°, nodata cell for cell`, async () => {
      const out = join(dir, `slope-${computeEdges}.tif`);
      runGdal('gdaldem', ['slope', ...(computeEdges ? ['-compute_edges'] : []), '-q', DEM_PATH, out]);
      const image = await (await fromFile(out)).getImage();
      const [gdal] = await image.readRasters();
      if (!(gdal instanceof Float32Array)) throw new Error('expected a Float32 band from gdaldem slope');
      const gdalNodata = image.getGDALNoData();
      const ours = computeSlope(dem, { computeEdges });
      let maxDiffDeg = 0;
      let nodataMismatch = 0;
      for (let i = 0; i < ours.length; i++) {
        const gdalIsNodata = gdal[i] === gdalNodata || Number.isNaN(gdal[i]!);
        if (Number.isNaN(ours[i]!) !== gdalIsNodata) nodataMismatch++;
        else if (!gdalIsNodata) maxDiffDeg = Math.max(maxDiffDeg, Math.abs(ours[i]! - gdal[i]!));
      }
      expect(nodataMismatch).toBe(0);
      expect(maxDiffDeg).toBeLessThan(0.01);
    });
  }
});


