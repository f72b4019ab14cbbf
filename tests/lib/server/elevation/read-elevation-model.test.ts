/**
 * The elevation-model reader against outside references:
 * - GDAL 3.6 (Debian gdal-bin): gdal_translate and gdalwarp write each variant of the demo model;
 *   gdalinfo -json gives size, georeferencing, CRS, band type, block size, nodata and compression;
 *   gdallocationinfo -valonly gives the value GDAL reads at sample cells; gdal_translate -of ENVI
 *   gives every cell as GDAL decodes it.
 * - GeographicLib (Karney 2013, "Algorithms for geodesics", Journal of Geodesy 87:43–55; npm
 *   geographiclib-geodesic) for the ground size of the cells of geographic models.
 */
import { copyFileSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import geographiclib from 'geographiclib-geodesic';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inspectElevationModel, readElevationModel, type ElevationModel, type ElevationModelHeader } from '../../../../src/lib/server/elevation/index';
import { gdalAllCells, gdalEllipsoid, gdalInfo, gdalValuesAt, runGdal, type GdalInfo } from '../../../helpers/gdal';

const DEMO = resolve(dirname(fileURLToPath(import.meta.url)), '../../../../data-samples/saltbush-rise-dem.tif');
const TILED = ['-co', 'TILED=YES', '-co', 'BLOCKXSIZE=256', '-co', 'BLOCKYSIZE=256'];
/** Sample cells (col, row) of the 600 × 600 demo: corners, centre, both sides of a tile edge; (0, 599) is nodata. */
const POINTS = [[0, 0], [599, 0], [300, 300], [123, 457], [255, 256], [256, 255], [599, 599], [0, 599]] as const;
const SOUTH_WEST = 7;

let dir = '';
let source = '';

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'gullyline-elevation-'));
  // A copy, so that no GDAL side file is ever written beside the committed demo model.
  source = join(dir, 'demo.tif');
  copyFileSync(DEMO, source);
  runGdal('gdalinfo', ['--version']);
});

afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

interface Variant {
  readonly name: string;
  readonly args: readonly string[];
  readonly sampleType: string;
  readonly compression: ElevationModelHeader['compression'];
  readonly tiled: boolean;
}

const COMPRESSIONS = [
  ['NONE', 'none'],
  ['LZW', 'LZW'],
  ['DEFLATE', 'Deflate'],
  ['PACKBITS', 'PackBits'],
] as const;

const VARIANTS: Variant[] = [
  ...COMPRESSIONS.flatMap(([gdal, compression]): Variant[] => [
    { name: `float32-${gdal}-strips`, args: ['-co', `COMPRESS=${gdal}`], sampleType: 'Float32', compression, tiled: false },
    { name: `float32-${gdal}-tiles`, args: ['-co', `COMPRESS=${gdal}`, ...TILED], sampleType: 'Float32', compression, tiled: true },
  ]),
  { name: 'int16-strips', args: ['-ot', 'Int16'], sampleType: 'Int16', compression: 'none', tiled: false },
  { name: 'int16-lzw-predictor-tiles', args: ['-ot', 'Int16', '-co', 'COMPRESS=LZW', '-co', 'PREDICTOR=2', ...TILED], sampleType: 'Int16', compression: 'LZW', tiled: true },
  // GDAL clamps the nodata value −9999 to 0 for UInt16 (it says so on stderr).
  { name: 'uint16-deflate-strips', args: ['-ot', 'UInt16', '-co', 'COMPRESS=DEFLATE'], sampleType: 'UInt16', compression: 'Deflate', tiled: false },
  { name: 'int32-packbits-tiles', args: ['-ot', 'Int32', '-co', 'COMPRESS=PACKBITS', ...TILED], sampleType: 'Int32', compression: 'PackBits', tiled: true },
  { name: 'float64-deflate-fp-predictor', args: ['-ot', 'Float64', '-co', 'COMPRESS=DEFLATE', '-co', 'PREDICTOR=3'], sampleType: 'Float64', compression: 'Deflate', tiled: false },
  // Regression: geotiff.js 3.0.5 reads lazily loaded strip offsets as little-endian.
  { name: 'big-endian-one-row-strips', args: ['-co', 'ENDIANNESS=BIG', '-co', 'BLOCKYSIZE=1'], sampleType: 'Float32', compression: 'none', tiled: false },
  { name: 'big-endian-lzw-16-tiles', args: ['-co', 'ENDIANNESS=BIG', '-co', 'COMPRESS=LZW', '-co', 'TILED=YES', '-co', 'BLOCKXSIZE=16', '-co', 'BLOCKYSIZE=16'], sampleType: 'Float32', compression: 'LZW', tiled: true },
  { name: 'bigtiff', args: ['-co', 'BIGTIFF=YES', '-co', 'COMPRESS=DEFLATE'], sampleType: 'Float32', compression: 'Deflate', tiled: false },
  { name: 'pixel-is-point', args: ['-mo', 'AREA_OR_POINT=Point'], sampleType: 'Float32', compression: 'none', tiled: false },
];

const GDAL_COMPRESSION: Record<string, ElevationModelHeader['compression']> = { LZW: 'LZW', DEFLATE: 'Deflate', PACKBITS: 'PackBits' };

/** Header facts against gdalinfo -json. */
function expectHeaderMatchesGdal(header: ElevationModelHeader, info: GdalInfo): void {
  const band = info.bands[0]!;
  const [x0, sx, rx, y0, ry, sy] = info.geoTransform!;
  expect([header.width, header.height]).toEqual(info.size);
  expect([rx, ry]).toEqual([0, 0]);
  // gdalinfo -json prints the geotransform to about 12 significant digits.
  const { transform, extent } = header;
  expectNumbersClose([transform.originX, transform.originY, transform.cellSizeX, transform.cellSizeY], [x0, y0, sx, -sy]);
  expectNumbersClose([extent.minX, extent.maxX, extent.minY, extent.maxY], [x0, x0 + info.size[0] * sx, y0 + info.size[1] * sy, y0]);
  expect(header.crs?.code).toBe(`EPSG:${info.stac?.['proj:epsg']}`);
  expect(header.sampleType).toBe(band.type);
  expect([header.blockWidth, header.blockHeight]).toEqual(band.block);
  expect(header.nodataValue).toBe(Number(band.noDataValue));
  expect(header.compression).toBe(GDAL_COMPRESSION[info.metadata?.['IMAGE_STRUCTURE']?.['COMPRESSION'] ?? ''] ?? 'none');
}

function expectNumbersClose(ours: readonly number[], gdal: readonly number[]): void {
  ours.forEach((value, i) => expect(Math.abs(value - gdal[i]!), `${value} vs ${gdal[i]}`).toBeLessThanOrEqual(1e-11 * Math.abs(gdal[i]!)));
}

/** Values at sample cells against gdallocationinfo -valonly, nodata ⇔ NaN. */
function expectValuesMatchGdal(model: ElevationModel, file: string, points: readonly (readonly [number, number])[]): number[] {
  const gdalValues = gdalValuesAt(file, points);
  points.forEach(([col, row], i) => {
    const ours = model.grid.data[row * model.grid.width + col]!;
    const gdal = gdalValues[i]!;
    if (gdal === model.nodataValue) expect(ours, `cell ${col},${row} is nodata`).toBeNaN();
    else expect(ours, `cell ${col},${row}`).toBeCloseTo(gdal, 9);
  });
  return gdalValues;
}

/** Every cell against GDAL's own decoding, and the statistics from those cells. */
function expectAllCellsMatchGdal(model: ElevationModel, file: string, name: string): void {
  const cells = gdalAllCells(file, dir, name);
  const { data } = model.grid;
  expect(cells.length).toBe(data.length);
  let mismatches = 0;
  let valid = 0;
  let min = Number.POSITIVE_INFINITY;
  let max = Number.NEGATIVE_INFINITY;
  for (let i = 0; i < cells.length; i++) {
    const gdal = cells[i]!;
    if (gdal === model.nodataValue) {
      if (!Number.isNaN(data[i]!)) mismatches++;
      continue;
    }
    valid++;
    min = Math.min(min, gdal);
    max = Math.max(max, gdal);
    if (Math.abs(data[i]! - gdal) > 1e-9 * Math.max(1, Math.abs(gdal))) mismatches++;
  }
  expect(mismatches).toBe(0);
  expect([model.validCells, model.minElevationM, model.maxElevationM]).toEqual([valid, min, max]);
}

describe('readElevationModel and inspectElevationModel against GDAL', () => {
  it.each(VARIANTS)('$name: header, sample cells and every cell as GDAL reads them', async (variant) => {
    const file = join(dir, `${variant.name}.tif`);
    runGdal('gdal_translate', ['-q', ...variant.args, source, file]);
    // GDAL gdalinfo -json (Debian gdal-bin 3.6): size, georeferencing, CRS, type, block, nodata, compression.
    const info = gdalInfo(file);
    const header = await inspectElevationModel(file);
    expect(header).toMatchObject({ sampleType: variant.sampleType, compression: variant.compression, tiled: variant.tiled, cells: 360_000 });
    expect(header.crs).toMatchObject({ code: 'EPSG:7854', name: 'GDA2020 / MGA zone 54', geographic: false, source: 'file' });
    expect(header.cellSizeM).toEqual({ westEastM: 5, northSouthM: 5 });
    expect(header.pixelIsPoint).toBe(variant.name === 'pixel-is-point');
    expectHeaderMatchesGdal(header, info);

    const model = await readElevationModel(file);
    expect(model.transform).toEqual(header.transform);
    expect(model.crs).toEqual(header.crs);
    expect(model.grid.data).toBeInstanceOf(variant.sampleType === 'Float64' ? Float64Array : Float32Array);
    expect(Array.from(new Set(model.grid.cellWidthM))).toEqual([5]);
    expect(model.grid.cellHeightM).toBe(5);
    // GDAL gdallocationinfo -valonly: the raw value at each sample cell; the south-west corner is nodata.
    const gdalValues = expectValuesMatchGdal(model, file, POINTS);
    expect(gdalValues[SOUTH_WEST]).toBe(model.nodataValue);
    expect(model.grid.data[599 * 600]).toBeNaN();
    // GDAL gdal_translate -of ENVI -ot Float64: every cell as GDAL decodes it.
    expectAllCellsMatchGdal(model, file, variant.name);
  });

  it('reports progress by bands of rows and stops when aborted', async () => {
    const file = join(dir, 'progress.tif');
    runGdal('gdal_translate', ['-q', '-co', 'BLOCKYSIZE=1', source, file]);
    const fractions: number[] = [];
    await readElevationModel(file, { onProgress: (fraction) => fractions.push(fraction) });
    expect(fractions.at(-1)).toBe(1);
    expect(fractions).toEqual([...fractions].sort((a, b) => a - b));
    const controller = new AbortController();
    controller.abort(new Error('stopped by the test'));
    await expect(readElevationModel(file, { signal: controller.signal })).rejects.toThrow('stopped by the test');
  });
});

interface GeographicCase {
  readonly name: string;
  readonly args: readonly string[];
  readonly code: string;
}

const GEOGRAPHIC: GeographicCase[] = [
  { name: 'gda2020-geographic', args: ['-t_srs', 'EPSG:7844'], code: 'EPSG:7844' },
  { name: 'wgs84-tiled-deflate', args: ['-t_srs', 'EPSG:4326', '-co', 'TILED=YES', '-co', 'COMPRESS=DEFLATE'], code: 'EPSG:4326' },
  { name: 'gda94-1-arc-second', args: ['-t_srs', 'EPSG:4283', '-tr', String(1 / 3600), String(1 / 3600), '-r', 'bilinear'], code: 'EPSG:4283' },
];

describe('geographic models (gdalwarp to latitude and longitude)', () => {
  it.each(GEOGRAPHIC)('$name: georeferencing and cells as GDAL reads them, cell sizes as GeographicLib measures them', async ({ name, args, code }) => {
    const file = join(dir, `${name}.tif`);
    runGdal('gdalwarp', ['-q', ...args, source, file]);
    // GDAL gdalinfo -json (Debian gdal-bin 3.6).
    const info = gdalInfo(file);
    const header = await inspectElevationModel(file);
    expectHeaderMatchesGdal(header, info);
    expect(header.crs).toMatchObject({ code, geographic: true, source: 'file' });

    const model = await readElevationModel(file);
    const { width, height } = model.grid;
    const points = [[0, 0], [width - 1, 0], [0, height - 1], [width - 1, height - 1], [width >> 1, height >> 1], [width >> 2, (3 * height) >> 2], [(3 * width) >> 2, height >> 3]] as const;
    // GDAL gdallocationinfo -valonly; the warped footprint leaves nodata in the corners.
    const gdalValues = expectValuesMatchGdal(model, file, points);
    expect(gdalValues.filter((value) => value === model.nodataValue).length).toBeGreaterThan(0);
    expect(model.grid.data[(height - 1) * width]).toBeNaN();
    // GDAL gdal_translate -of ENVI: every cell.
    expectAllCellsMatchGdal(model, file, name);

    // GeographicLib (Karney 2013) on the ellipsoid gdalinfo names for the CRS: the geodesic across
    // one cell along each row's centre latitude, and along the meridian, within 0.1 %.
    const { a, f } = gdalEllipsoid(info);
    const geodesic = new geographiclib.Geodesic.Geodesic(a, f);
    const { originX, originY, cellSizeX, cellSizeY } = model.transform;
    let worstWidth = 0;
    for (let row = 0; row < height; row++) {
      const lat = originY - (row + 0.5) * cellSizeY;
      const across = geodesic.Inverse(lat, originX, lat, originX + cellSizeX).s12!;
      worstWidth = Math.max(worstWidth, Math.abs(model.grid.cellWidthM[row]! - across) / across);
    }
    expect(worstWidth).toBeLessThan(1e-3);
    for (const row of [0, height >> 1, height - 1]) {
      const lat = originY - (row + 0.5) * cellSizeY;
      const along = geodesic.Inverse(lat + cellSizeY / 2, originX, lat - cellSizeY / 2, originX).s12!;
      expect(Math.abs(model.grid.cellHeightM - along) / along).toBeLessThan(1e-3);
    }
    expect(header.cellSizeM!.northSouthM).toBeCloseTo(model.grid.cellHeightM, 6);
  });
});
