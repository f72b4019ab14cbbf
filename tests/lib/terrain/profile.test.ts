/**
 * Ground profiles: bilinear heights by hand, exact on planes, gaps at nodata and off the model,
 * chainage along the demo fence lines, and heights against GDAL's bilinear resampling.
 *
 * Outside references used here:
 * - GDAL gdalwarp (Debian gdal-bin 3.6), `-r bilinear`: the demo elevation model resampled onto
 *   5 m grids shifted by a fraction of a cell, so each output cell is GDAL's bilinear height at
 *   its centre. (`gdallocationinfo` in GDAL 3.6 has no `-r bilinear`; that came in 3.10.)
 * - Analytic case: bilinear interpolation reproduces a plane exactly.
 * - Chainage: the straight-line (Euclidean) length of each segment in EPSG:7854 metres, summed.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { fromFile } from 'geotiff';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  bilinearElevationM,
  cellCentre,
  sampleProfile,
  toCell,
  type ElevationGrid,
  type GridTransform,
} from '../../../src/lib/terrain/index';
import { gridFromFunction, gridFromRows } from './helpers';
import { readDemoModel, runGdal } from '../../helpers/gdal';

const SAMPLES_DIR = resolve(dirname(fileURLToPath(import.meta.url)), '../../../data-samples');
const DEM_PATH = join(SAMPLES_DIR, 'saltbush-rise-dem.tif');
const DEMO_TRANSFORM: GridTransform = { originX: 560_000, originY: 6_523_000, cellSizeX: 5, cellSizeY: 5 };

// Cell centres of this 2 × 2 grid: (0.5, 1.5) = 0, (1.5, 1.5) = 1, (0.5, 0.5) = 2, (1.5, 0.5) = 3.
const SQUARE = gridFromRows([
  [0, 1],
  [2, 3],
]);
const UNIT: GridTransform = { originX: 0, originY: 2, cellSizeX: 1, cellSizeY: 1 };

describe('cellCentre and toCell', () => {
  it('place cell centres half a cell in from the north-west corner, rows going south (by hand)', () => {
    expect(cellCentre(DEMO_TRANSFORM, 0, 0)).toEqual([560_002.5, 6_522_997.5]);
    expect(cellCentre(DEMO_TRANSFORM, 599, 599)).toEqual([562_997.5, 6_520_002.5]);
    expect(toCell(DEMO_TRANSFORM, 560_000, 6_523_000)).toEqual([-0.5, -0.5]);
    expect(toCell(DEMO_TRANSFORM, 562_997.5, 6_520_002.5)).toEqual([599, 599]);
  });

  it('are inverses', () => {
    fc.assert(
      fc.property(fc.double({ min: -10, max: 700, noNaN: true }), fc.double({ min: -10, max: 700, noNaN: true }), (col, row) => {
        const [x, y] = cellCentre(DEMO_TRANSFORM, col, row);
        const [c, r] = toCell(DEMO_TRANSFORM, x, y);
        expect(c).toBeCloseTo(col, 6);
        expect(r).toBeCloseTo(row, 6);
      }),
    );
  });
});

describe('bilinearElevationM', () => {
  it('interpolates between cell centres and holds the outer half cell at the edge (by hand)', () => {
    expect(bilinearElevationM(SQUARE, UNIT, 1, 1)).toBe(1.5);
    expect(bilinearElevationM(SQUARE, UNIT, 0.5, 1.5)).toBe(0);
    expect(bilinearElevationM(SQUARE, UNIT, 1.25, 1.5)).toBe(0.75);
    // Outer half cell: along the west column only, and the north-west corner cell's own height.
    expect(bilinearElevationM(SQUARE, UNIT, 0.1, 1)).toBe(1);
    expect(bilinearElevationM(SQUARE, UNIT, 0.1, 1.9)).toBe(0);
    // On the outer edge still on the model; beyond it a gap.
    expect(bilinearElevationM(SQUARE, UNIT, 2, 1)).toBe(2);
    expect(bilinearElevationM(SQUARE, UNIT, 2.01, 1)).toBeNull();
    expect(bilinearElevationM(SQUARE, UNIT, 1, -0.001)).toBeNull();
    expect(bilinearElevationM(SQUARE, UNIT, Number.NaN, 1)).toBeNull();
  });

  it('gives a gap when a cell with weight is nodata, and a height when only zero-weight cells are', () => {
    const grid = gridFromRows([
      [0, 1, 2],
      [3, Number.NaN, 5],
      [6, 7, 8],
    ]);
    const t: GridTransform = { originX: 0, originY: 3, cellSizeX: 1, cellSizeY: 1 };
    expect(bilinearElevationM(grid, t, 1, 2)).toBeNull();
    expect(bilinearElevationM(grid, t, 0.5, 2.5)).toBe(0);
    // On the line between the centres of (0, 0) and (1, 0): the nodata row below has no weight.
    expect(bilinearElevationM(grid, t, 1, 2.5)).toBe(0.5);
    expect(bilinearElevationM(grid, t, 1.5, 2.5)).toBe(1);
  });

  it('rejects a malformed transform', () => {
    expect(() => bilinearElevationM(SQUARE, { ...UNIT, cellSizeY: -1 }, 1, 1)).toThrow(RangeError);
  });
});

describe('sampleProfile', () => {
  it('samples every vertex and evenly spaced points between them (by hand)', () => {
    const profile = sampleProfile(SQUARE, UNIT, [
      [0.5, 1.5],
      [1.5, 1.5],
      [1.5, 0.5],
    ]);
    expect(profile).toEqual({
      samples: [
        { chainageM: 0, x: 0.5, y: 1.5, elevationM: 0 },
        { chainageM: 0.5, x: 1, y: 1.5, elevationM: 0.5 },
        { chainageM: 1, x: 1.5, y: 1.5, elevationM: 1 },
        { chainageM: 1.5, x: 1.5, y: 1, elevationM: 2 },
        { chainageM: 2, x: 1.5, y: 0.5, elevationM: 3 },
      ],
      vertexSampleIndex: [0, 2, 4],
      lengthM: 2,
    });
  });

  it('leaves gaps (null) where the line runs off the model, and keeps repeated vertices', () => {
    const profile = sampleProfile(
      SQUARE,
      UNIT,
      [
        [-1, 1],
        [1, 1],
        [1, 1],
        [3, 1],
      ],
      { spacingM: 1 },
    );
    expect(profile.samples.map((s) => s.elevationM)).toEqual([null, 1, 1.5, 1.5, 2, null]);
    expect(profile.samples.map((s) => s.chainageM)).toEqual([0, 1, 2, 2, 3, 4]);
    expect(profile.vertexSampleIndex).toEqual([0, 2, 3, 5]);
  });

  it('is exactly linear on a plane, at most spacingM apart, through every vertex', () => {
    const t: GridTransform = { originX: 1000, originY: 5000, cellSizeX: 2, cellSizeY: 3 };
    // Between the outermost cell centres, where the model is the plane itself.
    const inside = fc.tuple(
      fc.double({ min: 1001, max: 1019, noNaN: true }),
      fc.double({ min: 4971.5, max: 4998.5, noNaN: true }),
    );
    fc.assert(
      fc.property(
        fc.double({ min: -2, max: 2, noNaN: true }),
        fc.double({ min: -2, max: 2, noNaN: true }),
        fc.array(inside, { minLength: 2, maxLength: 6 }),
        fc.option(fc.double({ min: 0.2, max: 5, noNaN: true })),
        (a, b, line, spacing) => {
          const plane = (x: number, y: number) => 100 + a * (x - 1000) + b * (y - 5000);
          const base = gridFromFunction(10, 10, (col, row) => plane(...cellCentre(t, col, row)));
          const grid: ElevationGrid = { ...base, cellWidthM: new Float64Array(10).fill(2), cellHeightM: 3 };
          // The default spacing is half the smaller cell size: 1 here.
          const spacingM = spacing ?? 1;
          const { samples, vertexSampleIndex, lengthM } = sampleProfile(grid, t, line, spacing === null ? {} : { spacingM });
          let length = 0;
          for (let i = 1; i < line.length; i++) {
            length += Math.hypot(line[i]![0] - line[i - 1]![0], line[i]![1] - line[i - 1]![1]);
          }
          expect(lengthM).toBeCloseTo(length, 9);
          expect(samples.at(-1)!.chainageM).toBe(lengthM);
          line.forEach(([x, y], i) => expect(samples[vertexSampleIndex[i]!]).toMatchObject({ x, y }));
          for (let i = 0; i < samples.length; i++) {
            const s = samples[i]!;
            expect(s.elevationM).not.toBeNull();
            expect(s.elevationM!).toBeCloseTo(plane(s.x, s.y), 9);
            if (i > 0) {
              const step = s.chainageM - samples[i - 1]!.chainageM;
              expect(step).toBeGreaterThanOrEqual(0);
              expect(step).toBeLessThanOrEqual(spacingM + 1e-9);
              expect(Math.hypot(s.x - samples[i - 1]!.x, s.y - samples[i - 1]!.y)).toBeCloseTo(step, 9);
            }
          }
        },
      ),
    );
  });

  it('does not modify its inputs', () => {
    const grid = gridFromRows([
      [1, Number.NaN],
      [3, 4],
    ]);
    const line: [number, number][] = [
      [0.2, 0.3],
      [1.9, 1.7],
    ];
    const before = Float64Array.from(grid.data);
    const lineBefore = structuredClone(line);
    sampleProfile(grid, UNIT, line);
    expect(grid.data).toEqual(before);
    expect(line).toEqual(lineBefore);
  });

  it('rejects too short a line, non-finite vertices, a bad spacing, and far too many samples', () => {
    expect(() => sampleProfile(SQUARE, UNIT, [[1, 1]])).toThrow(/two vertices/);
    expect(() => sampleProfile(SQUARE, UNIT, [[1, 1], [Number.NaN, 1]])).toThrow(/vertex 1/);
    expect(() => sampleProfile(SQUARE, UNIT, [[1, 1], [2, 1]], { spacingM: 0 })).toThrow(RangeError);
    expect(() => sampleProfile(SQUARE, UNIT, [[0, 0], [1e6, 0]], { spacingM: 0.01 })).toThrow(/samples/);
  });
});

describe('sampleProfile on the demo elevation model', () => {
  let dem: ElevationGrid;
  let dir = '';

  beforeAll(async () => {
    dem = await readDemoModel();
    dir = mkdtempSync(join(tmpdir(), 'gullyline-profile-'));
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('gives each planned fence line its straight-line length as chainage, every 2.5 m, without gaps', () => {
    const manifest = JSON.parse(readFileSync(join(SAMPLES_DIR, 'saltbush-rise.json'), 'utf8')) as {
      fenceLines: { id: string; pointsXY: [number, number][] }[];
    };
    expect(manifest.fenceLines.length).toBeGreaterThan(0);
    for (const { id, pointsXY } of manifest.fenceLines) {
      const { samples, vertexSampleIndex, lengthM } = sampleProfile(dem, DEMO_TRANSFORM, pointsXY);
      let length = 0;
      for (let i = 1; i < pointsXY.length; i++) {
        length += Math.hypot(pointsXY[i]![0] - pointsXY[i - 1]![0], pointsXY[i]![1] - pointsXY[i - 1]![1]);
      }
      expect(lengthM, id).toBeCloseTo(length, 6);
      expect(vertexSampleIndex, id).toHaveLength(pointsXY.length);
      expect(samples.length, id).toBeGreaterThanOrEqual(Math.ceil(length / 2.5) + 1);
      for (let i = 1; i < samples.length; i++) {
        expect(samples[i]!.chainageM - samples[i - 1]!.chainageM).toBeLessThanOrEqual(2.5 + 1e-9);
      }
      expect(samples.every((s) => s.elevationM !== null && s.elevationM > 140 && s.elevationM < 160), id).toBe(true);
    }
  });

  // GDAL gdalwarp -r bilinear (Debian gdal-bin 3.6): GDAL's bilinear height at each output centre.
  // The last shift puts the first row and column in the model's outer half cell, where GDAL's
  // renormalised weights equal our heights held at the edge.
  const shifts: [number, number][] = [
    [1.3, 2.1],
    [3.7, 0.45],
    [-2, -1.7],
  ];
  for (const [dx, dy] of shifts) {
    it(`matches GDAL gdalwarp -r bilinear on a grid shifted by (${dx}, ${dy}) m within 1 µm`, async () => {
      // Output grid: 5 m cells, its west edge dx east of the model's, its north edge dy south.
      const width = 590;
      const height = 590;
      const west = DEMO_TRANSFORM.originX + dx;
      const north = DEMO_TRANSFORM.originY - dy;
      const out = join(dir, `warp-${dx}-${dy}.tif`);
      runGdal('gdalwarp', [
        '-q', '-r', 'bilinear', '-et', '0', '-ot', 'Float64', '-dstnodata', '-9999', '-tr', '5', '5',
        '-te', String(west), String(north - 5 * height), String(west + 5 * width), String(north),
        DEM_PATH, out,
      ]);
      const image = await (await fromFile(out)).getImage();
      const [gdal] = await image.readRasters();
      if (!(gdal instanceof Float64Array)) throw new Error('expected a Float64 band from gdalwarp');
      expect([image.getWidth(), image.getHeight()]).toEqual([width, height]);
      const outTransform: GridTransform = { originX: west, originY: north, cellSizeX: 5, cellSizeY: 5 };
      let compared = 0;
      let maxDiffM = 0;
      // Every 7th row as a profile through the output cells' centres, 5 m apart.
      for (let row = 0; row < height; row += 7) {
        const line: [number, number][] = [cellCentre(outTransform, 0, row), cellCentre(outTransform, width - 1, row)];
        const { samples } = sampleProfile(dem, DEMO_TRANSFORM, line, { spacingM: 5 });
        expect(samples).toHaveLength(width);
        samples.forEach((s, col) => {
          const g = gdal[row * width + col]!;
          // GDAL renormalises its weights over valid cells next to nodata; we leave a gap there.
          if (g === -9999) expect(s.elevationM).toBeNull();
          if (s.elevationM === null || g === -9999) return;
          maxDiffM = Math.max(maxDiffM, Math.abs(s.elevationM - g));
          compared++;
        });
      }
      // And single points at pseudo-random cells.
      for (let k = 0; k < 300; k++) {
        const col = (k * 7919) % width;
        const row = (k * 104_729) % height;
        const ours = bilinearElevationM(dem, DEMO_TRANSFORM, ...cellCentre(outTransform, col, row));
        const g = gdal[row * width + col]!;
        if (ours === null || g === -9999) continue;
        maxDiffM = Math.max(maxDiffM, Math.abs(ours - g));
        compared++;
      }
      expect(compared).toBeGreaterThan(40_000);
      expect(maxDiffM).toBeLessThan(1e-6);
    });
  }
});


