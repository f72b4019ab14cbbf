/**
 * Hillshade by Horn's method, checked by hand, against the geometry of light on a plane, and grey
 * for grey against GDAL.
 *
 * Outside references used here:
 * - Horn (1981), "Hill shading and the reflectance map", Proceedings of the IEEE 69(1):14–47: the
 *   shade is the cosine of the angle between the ground's normal and the direction of the light.
 * - GDAL gdaldem (Debian gdal-bin 3.6), Horn 1981: `gdaldem hillshade` on the demo elevation
 *   model, default options, `-compute_edges`, `-z 2 -az 90 -alt 30` and
 *   `-z 25 -az 200 -alt 60 -compute_edges`.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { fromFile } from 'geotiff';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { computeHillshade, computeSlope, type ElevationGrid } from '../../../src/lib/terrain/index';
import { elevationModel, gridFromFunction, gridFromRows, toRows } from './helpers';
import { readDemoModel, runGdal } from '../../helpers/gdal';

const DEM_PATH = resolve(dirname(fileURLToPath(import.meta.url)), '../../../data-samples/saltbush-rise-dem.tif');
const DEGREES_0_90 = fc.double({ min: 0, max: 90, noNaN: true });
const DEGREES_0_360 = fc.double({ min: 0, max: 360, noNaN: true });

/** Grey of a plane from the vector geometry (Horn 1981): unit normal · unit vector to the light. */
function planeGrey(dzdEast: number, dzdNorth: number, azimuthDeg: number, altitudeDeg: number, zFactor: number): number {
  const rad = Math.PI / 180;
  const n = [-zFactor * dzdEast, -zFactor * dzdNorth, 1];
  const len = Math.hypot(n[0]!, n[1]!, n[2]!);
  const light = [
    Math.cos(altitudeDeg * rad) * Math.sin(azimuthDeg * rad),
    Math.cos(altitudeDeg * rad) * Math.cos(azimuthDeg * rad),
    Math.sin(altitudeDeg * rad),
  ];
  const cosine = (n[0]! * light[0]! + n[1]! * light[1]! + n[2]! * light[2]!) / len;
  return cosine <= 0 ? 1 : Math.floor(1 + 254 * cosine + 0.5);
}

describe('computeHillshade', () => {
  it('shades a 45° slope rising east, lit from the north-west at 45°, 218 (by hand)', () => {
    // Normal (−1, 0, 1)/√2, light (−½, ½, √½): cosine 0.8536, 1 + 254 × 0.8536 = 217.8 → 218.
    const grid = gridFromRows([
      [0, 1, 2],
      [0, 1, 2],
      [0, 1, 2],
    ]);
    expect(toRows(computeHillshade(grid), 3)).toEqual([
      [0, 0, 0],
      [0, 218, 0],
      [0, 0, 0],
    ]);
  });

  it('shades flat ground 1 + 254·sin(altitude), rounded half up as gdaldem does', () => {
    fc.assert(
      fc.property(DEGREES_0_90, DEGREES_0_360, (altitudeDeg, azimuthDeg) => {
        const grid = gridFromFunction(4, 4, () => 123.4, 5);
        const grey = computeHillshade(grid, { altitudeDeg, azimuthDeg });
        // gdaldem: 1 + 254·sin(alt · π/180) as a float, written to a byte as ⌊v + 0.5⌋ in single precision.
        const shade = 1 + 254 * Math.sin(altitudeDeg * (Math.PI / 180));
        const expected = Math.floor(Math.fround(Math.fround(shade) + 0.5));
        for (const i of [5, 6, 9, 10]) expect(grey[i]).toBe(expected);
      }),
    );
    // gdaldem's default light: 1 + 254 × sin 45° = 180.6 → 181.
    expect(computeHillshade(gridFromFunction(3, 3, () => 0))[4]).toBe(181);
  });

  it('shades any plane as the cosine between its normal and the light (Horn 1981), within one grey', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -3, max: 3, noNaN: true }),
        fc.double({ min: -3, max: 3, noNaN: true }),
        fc.double({ min: 0, max: 360, noNaN: true }),
        fc.double({ min: 1, max: 90, noNaN: true }),
        fc.double({ min: 0.1, max: 5, noNaN: true }),
        fc.double({ min: 0.5, max: 30, noNaN: true }),
        (dzdEast, dzdNorth, azimuthDeg, altitudeDeg, zFactor, cellM) => {
          // Row 0 is northmost, so northing falls with the row.
          const grid = gridFromFunction(4, 4, (col, row) => 100 + dzdEast * col * cellM - dzdNorth * row * cellM, cellM);
          const grey = computeHillshade(grid, { azimuthDeg, altitudeDeg, zFactor });
          const expected = planeGrey(dzdEast, dzdNorth, azimuthDeg, altitudeDeg, zFactor);
          for (const i of [5, 6, 9, 10]) expect(Math.abs(grey[i]! - expected)).toBeLessThanOrEqual(1);
        },
      ),
    );
  });

  it('is 0 exactly where the slope is nodata and 1..255 elsewhere, with and without computeEdges', () => {
    fc.assert(
      fc.property(elevationModel, fc.boolean(), (grid, computeEdges) => {
        const grey = computeHillshade(grid, { computeEdges });
        const slope = computeSlope(grid, { computeEdges });
        expect(grey.length).toBe(grid.width * grid.height);
        for (let i = 0; i < grey.length; i++) {
          if (Number.isNaN(slope[i]!)) expect(grey[i]).toBe(0);
          else expect(grey[i]).toBeGreaterThanOrEqual(1);
        }
      }),
    );
  });

  it('shades edges and cells next to nodata only with computeEdges, never nodata itself', () => {
    const grid = gridFromRows([
      [1, 2, 3, 4],
      [2, 3, Number.NaN, 5],
      [3, 4, 5, 6],
    ]);
    expect(toRows(computeHillshade(grid), 4).flat().every((g) => g === 0)).toBe(true);
    const edges = toRows(computeHillshade(grid, { computeEdges: true }), 4);
    expect(edges[1]![2]).toBe(0);
    expect(edges.flat().filter((g) => g === 0)).toHaveLength(1);
    // A single row has no window at all, as in gdaldem.
    expect(Array.from(computeHillshade(gridFromRows([[1, 2, 3]]), { computeEdges: true }))).toEqual([0, 0, 0]);
  });

  it('uses each row’s own cell width on a geographic-like model', () => {
    // Heights rise 1 m per column; rows narrow northward as on a latitude–longitude grid, so each
    // row shades as a projected grid of that row's width.
    const widths = [3, 4, 5, 6, 7];
    const grid: ElevationGrid = {
      ...gridFromFunction(4, 5, (col) => col),
      cellWidthM: Float64Array.from(widths),
      cellHeightM: 5,
    };
    const grey = computeHillshade(grid, { azimuthDeg: 270 });
    for (let row = 1; row < 4; row++) {
      const expected = planeGrey(1 / widths[row]!, 0, 270, 45, 1);
      expect(Math.abs(grey[row * 4 + 1]! - expected), `row ${row}`).toBeLessThanOrEqual(1);
    }
    // Light from the west on a west-facing slope: the narrower the cells, the steeper and brighter.
    expect(grey[1 * 4 + 1]).toBeGreaterThan(grey[3 * 4 + 1]!);
  });

  it('does not modify its input', () => {
    const grid = gridFromRows([
      [5, 4, 3],
      [4, Number.NaN, 2],
      [3, 2, 1],
    ]);
    const before = Float64Array.from(grid.data);
    const widths = Float64Array.from(grid.cellWidthM);
    computeHillshade(grid, { computeEdges: true, zFactor: 3 });
    expect(grid.data).toEqual(before);
    expect(grid.cellWidthM).toEqual(widths);
  });

  it('rejects a malformed grid and non-finite options', () => {
    const grid = gridFromRows([[1, 2]]);
    expect(() => computeHillshade({ ...grid, width: 3 })).toThrow(RangeError);
    expect(() => computeHillshade(grid, { azimuthDeg: Number.NaN })).toThrow(/azimuthDeg/);
  });
});

// GDAL gdaldem (Debian gdal-bin 3.6), Horn 1981: grey for grey on the demo elevation model.
describe('computeHillshade against GDAL gdaldem (Debian gdal-bin 3.6), Horn 1981', () => {
  let dir = '';
  let dem: ElevationGrid;

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'gullyline-hillshade-'));
    dem = await readDemoModel();
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  const cases: { name: string; args: string[]; options: Parameters<typeof computeHillshade>[1] }[] = [
    { name: 'defaults', args: [], options: {} },
    { name: '-compute_edges', args: ['-compute_edges'], options: { computeEdges: true } },
    {
      name: '-z 2 -az 90 -alt 30',
      args: ['-z', '2', '-az', '90', '-alt', '30'],
      options: { zFactor: 2, azimuthDeg: 90, altitudeDeg: 30 },
    },
    {
      name: '-z 25 -az 200 -alt 60 -compute_edges',
      args: ['-z', '25', '-az', '200', '-alt', '60', '-compute_edges'],
      options: { zFactor: 25, azimuthDeg: 200, altitudeDeg: 60, computeEdges: true },
    },
  ];

  for (const { name, args, options } of cases) {
    it(`matches gdaldem hillshade ${name} within one grey level, nodata cell for cell`, async () => {
      const out = join(dir, `hillshade-${cases.findIndex((c) => c.name === name)}.tif`);
      runGdal('gdaldem', ['hillshade', ...args, '-q', DEM_PATH, out]);
      const gdal = await readBand(out);
      if (!(gdal instanceof Uint8Array)) throw new Error('expected a Byte band from gdaldem hillshade');
      const ours = computeHillshade(dem, options);
      expect(ours.length).toBe(gdal.length);
      let maxDiff = 0;
      let differing = 0;
      let nodataMismatch = 0;
      for (let i = 0; i < ours.length; i++) {
        if ((ours[i] === 0) !== (gdal[i] === 0)) nodataMismatch++;
        if (ours[i] !== gdal[i]) differing++;
        maxDiff = Math.max(maxDiff, Math.abs(ours[i]! - gdal[i]!));
      }
      expect(nodataMismatch).toBe(0);
      expect(maxDiff).toBeLessThanOrEqual(1);
      // Off by one only where gdaldem's single-precision sums and approximate 1/√ tip a half grey.
      expect(differing).toBeLessThan(ours.length / 10_000);
    });
  }
});


/** The first band of a GeoTIFF, read with geotiff.js. */
async function readBand(path: string): Promise<unknown> {
  const image = await (await fromFile(path)).getImage();
  const [band] = await image.readRasters();
  return band;
}

