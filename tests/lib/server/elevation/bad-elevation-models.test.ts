/**
 * Files that are not usable elevation models, each refused with a message a person can act on.
 * Most are written with GDAL 3.6 (Debian gdal-bin: gdal_translate, gdal_create, gdal_edit.py);
 * the oversized header is written byte by byte per TIFF 6.0 (Adobe 1992) §2 and OGC GeoTIFF 1.1
 * (OGC 19-008r4).
 */
import { copyFileSync, mkdtempSync, readFileSync, rmSync, truncateSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  ElevationModelError,
  inspectElevationModel,
  readElevationModel,
  type ElevationModelOptions,
  type ElevationModelProblem,
} from '../../../../src/lib/server/elevation/index';
import { gdalValuesAt, runGdal } from '../../../helpers/gdal';
import { oversizedTiff } from '../../../helpers/elevation-fixtures';

const DEMO = resolve(dirname(fileURLToPath(import.meta.url)), '../../../../data-samples/saltbush-rise-dem.tif');
/** A small projected model for gdal_create: 20 × 20 cells of 5 m in EPSG:7854. */
const SMALL = ['-outsize', '20', '20', '-ot', 'Float32', '-a_ullr', '560000', '6523000', '560100', '6522900'];

let dir = '';
let source = '';
const path = (name: string) => join(dir, name);

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'gullyline-bad-elevation-'));
  source = path('demo.tif');
  copyFileSync(DEMO, source);
});

afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

async function refusal(read: Promise<unknown>): Promise<ElevationModelError> {
  try {
    await read;
  } catch (error) {
    if (error instanceof ElevationModelError) return error;
    throw error;
  }
  throw new Error('expected the model to be refused');
}

/**
 * Reading refuses the file with `problem` and a message matching every pattern; with
 * `header: true` the header inspection refuses it the same way (the check needs no pixels).
 */
async function expectRefused(
  file: string,
  problem: ElevationModelProblem,
  patterns: readonly RegExp[],
  { header = true, options = {} }: { header?: boolean; options?: ElevationModelOptions } = {},
): Promise<void> {
  const readers = header ? [readElevationModel, inspectElevationModel] : [readElevationModel];
  for (const reader of readers) {
    const error = await refusal(reader(file, options));
    expect(error.problem, error.message).toBe(problem);
    expect(error.status).toBe(422);
    expect(error.fields).toEqual({ file: error.message });
    for (const pattern of patterns) expect(error.message).toMatch(pattern);
    // Never a stack trace or a library's internals: one paragraph in plain words.
    expect(error.message).not.toMatch(/\n|\bat \S+:\d+|Error:|undefined|NaN/);
  }
}

/** A seeded byte generator (mulberry32), so the "random" file is the same on every run. */
function seededBytes(length: number, seed: number): Uint8Array {
  const bytes = new Uint8Array(length);
  let state = seed >>> 0;
  for (let i = 0; i < length; i++) {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    bytes[i] = (t ^ (t >>> 14)) & 0xff;
  }
  return bytes;
}


describe('elevation models that are refused', () => {
  it('refuses bytes that are not a TIFF', async () => {
    const random = seededBytes(4096, 20260314);
    random[0] = 0; // a random first pair of bytes could be "II" or "MM" only by a 1-in-32768 chance; rule it out
    writeFileSync(path('random.tif'), random);
    await expectRefused(path('random.tif'), 'not-tiff', [/not a GeoTIFF/, /does not start with the TIFF signature/, /Export the elevation model as a GeoTIFF/]);
    writeFileSync(path('empty.tif'), new Uint8Array(0));
    await expectRefused(path('empty.tif'), 'not-tiff', [/not a GeoTIFF/]);
    writeFileSync(path('text.tif'), 'ncols 20\nnrows 20\nxllcorner 560000\n');
    await expectRefused(path('text.tif'), 'not-tiff', [/not a GeoTIFF/]);
  });

  it('refuses a truncated TIFF: pixels cut off, or the image directory at the end cut off', async () => {
    runGdal('gdal_translate', ['-q', source, path('stripped.tif')]);
    const size = readFileSync(path('stripped.tif')).length;
    copyFileSync(path('stripped.tif'), path('half.tif'));
    truncateSync(path('half.tif'), Math.floor(size / 2));
    await expectRefused(path('half.tif'), 'truncated', [/incomplete/, new RegExp(`file is ${Math.floor(size / 2).toLocaleString('en-AU')} bytes long`), /cut short/, /upload the complete file again/]);

    runGdal('gdal_translate', ['-q', '-co', 'TILED=YES', '-co', 'COMPRESS=LZW', source, path('tiled.tif')]);
    copyFileSync(path('tiled.tif'), path('tiled-short.tif'));
    truncateSync(path('tiled-short.tif'), readFileSync(path('tiled.tif')).length - 100);
    await expectRefused(path('tiled-short.tif'), 'truncated', [/incomplete/]);

    // gdal_edit.py rewrites the directory at the end of the file.
    copyFileSync(source, path('edited.tif'));
    runGdal('gdal_edit.py', ['-mo', 'NOTE=edited', path('edited.tif')]);
    truncateSync(path('edited.tif'), readFileSync(path('edited.tif')).length - 50);
    await expectRefused(path('edited.tif'), 'truncated', [/incomplete/]);
  });

  it('refuses an RGB image and a two-band image', async () => {
    runGdal('gdal_translate', ['-q', '-b', '1', '-b', '1', '-b', '1', '-ot', 'Byte', '-scale', '144', '157', '0', '255', '-co', 'PHOTOMETRIC=RGB', source, path('rgb.tif')]);
    await expectRefused(path('rgb.tif'), 'not-single-band', [/RGB colour image of 3 bands/, /single band of ground heights/, /gdal_translate -b/]);
    runGdal('gdal_translate', ['-q', '-b', '1', '-b', '1', source, path('two-bands.tif')]);
    await expectRefused(path('two-bands.tif'), 'not-single-band', [/image of 2 bands/]);
  });

  it('refuses 8-bit, complex and 64-bit integer samples', async () => {
    runGdal('gdal_translate', ['-q', '-ot', 'Byte', '-scale', '144', '157', '0', '255', source, path('byte.tif')]);
    await expectRefused(path('byte.tif'), 'unsupported-sample-type', [/8-bit unsigned integer samples/, /only 256 different heights/, /Int16, UInt16, Int32, Float32 or Float64/, /gdal_translate -ot Float32/]);
    runGdal('gdal_translate', ['-q', '-ot', 'CFloat32', source, path('complex.tif')]);
    await expectRefused(path('complex.tif'), 'unsupported-sample-type', [/64-bit complex-number samples/]);
    runGdal('gdal_translate', ['-q', '-ot', 'CInt16', source, path('complex-int.tif')]);
    await expectRefused(path('complex-int.tif'), 'unsupported-sample-type', [/32-bit complex-number samples/]);
    runGdal('gdal_translate', ['-q', '-ot', 'Int64', source, path('int64.tif')]);
    await expectRefused(path('int64.tif'), 'unsupported-sample-type', [/64-bit signed integer samples/]);
  });

  it('refuses a header declaring 200 000 × 200 000 cells from the header alone, saying the size and the limit', async () => {
    writeFileSync(path('huge.tif'), oversizedTiff());
    // The file holds 4 bytes of pixels: only the header check can have refused it, before any
    // pixel array was allocated (inspect reads no pixels at all).
    await expectRefused(path('huge.tif'), 'too-large', [/200,000 × 200,000 = 40,000,000,000 cells/, /the limit is 64,000,000 cells/, /gdal_translate -projwin/]);
    await expectRefused(source, 'too-large', [/600 × 600 = 360,000 cells/, /the limit is 100,000 cells/], { options: { maxCells: 100_000 } });
    await expect(readElevationModel(source, { maxCells: 0 })).rejects.toThrow(RangeError);
  });

  it('refuses a model that is all nodata', async () => {
    runGdal('gdal_create', ['-q', ...SMALL, '-burn', '-9999', '-a_nodata', '-9999', '-a_srs', 'EPSG:7854', path('all-nodata.tif')]);
    await expectRefused(path('all-nodata.tif'), 'all-nodata', [/holds no heights/, /all 400 of its cells are nodata/, /marks -9999 as nodata/], { header: false });
    expect((await inspectElevationModel(path('all-nodata.tif'))).nodataValue).toBe(-9999);
  });

  it('asks for an EPSG code when the model has no CRS, and reads it in the code given', async () => {
    runGdal('gdal_create', ['-q', ...SMALL, '-burn', '150', path('no-crs.tif')]);
    await expectRefused(path('no-crs.tif'), 'missing-crs', [/does not say which coordinate reference system/, /Give its EPSG code/, /EPSG:7854/], { header: false });
    expect((await inspectElevationModel(path('no-crs.tif'))).crs).toBeNull();
    const model = await readElevationModel(path('no-crs.tif'), { assumeCrs: 'EPSG:7854' });
    expect(model.crs).toMatchObject({ code: 'EPSG:7854', name: 'GDA2020 / MGA zone 54', source: 'assumed' });
    expect([model.validCells, model.minElevationM, model.maxElevationM]).toEqual([400, 150, 150]);

    // The demo with its CRS removed by gdal_edit.py, read in the CRS the person gives.
    copyFileSync(source, path('crs-removed.tif'));
    runGdal('gdal_edit.py', ['-a_srs', '', path('crs-removed.tif')]);
    await expectRefused(path('crs-removed.tif'), 'missing-crs', [/EPSG code/], { header: false });
    const assumed = await readElevationModel(path('crs-removed.tif'), { assumeCrs: 'EPSG:7854' });
    const original = await readElevationModel(source);
    expect(assumed.grid.data).toEqual(original.grid.data);
    expect(assumed.transform).toEqual(original.transform);
    // GDAL gdallocationinfo reads the same cells from the edited file.
    const [northWest, centre] = gdalValuesAt(path('crs-removed.tif'), [[0, 0], [300, 300]]);
    expect(assumed.grid.data[0]).toBeCloseTo(northWest!, 9);
    expect(assumed.grid.data[300 * 600 + 300]).toBeCloseTo(centre!, 9);
  });

  it('refuses unknown, unsuitable and conflicting CRS codes', async () => {
    runGdal('gdal_create', ['-q', ...SMALL, '-burn', '150', path('no-crs-2.tif')]);
    await expectRefused(path('no-crs-2.tif'), 'unknown-crs', [/"EPSG:99999" is not a code in the EPSG registry/], { options: { assumeCrs: 'EPSG:99999' } });
    await expectRefused(path('no-crs-2.tif'), 'unknown-crs', [/"mga54" is not a code/, /EPSG: and a number/], { options: { assumeCrs: 'mga54' } });
    await expectRefused(path('no-crs-2.tif'), 'crs-conflict', [/not longitudes and latitudes in degrees/, /EPSG:4326 \(WGS 84\)/], { options: { assumeCrs: 'EPSG:4326' } });
    await expectRefused(source, 'crs-conflict', [/says it is in EPSG:7854 \(GDA2020 \/ MGA zone 54\), but EPSG:7855/], { options: { assumeCrs: 'EPSG:7855' } });
    runGdal('gdal_translate', ['-q', '-a_srs', 'EPSG:2277', source, path('feet.tif')]);
    await expectRefused(path('feet.tif'), 'unsupported-crs', [/EPSG:2277/, /US survey foot, not in metres/, /gdalwarp -t_srs/]);
  });

  it('refuses rotated, control-point, south-up and unplaced grids', async () => {
    const withGeoTransform = (name: string, geoTransform: string) => {
      runGdal('gdal_translate', ['-q', '-of', 'VRT', source, path(`${name}.vrt`)]);
      const vrt = readFileSync(path(`${name}.vrt`), 'utf8').replace(/<GeoTransform>[^<]*<\/GeoTransform>/, `<GeoTransform>${geoTransform}</GeoTransform>`);
      writeFileSync(path(`${name}.vrt`), vrt);
      runGdal('gdal_translate', ['-q', path(`${name}.vrt`), path(`${name}.tif`)]);
      return path(`${name}.tif`);
    };
    await expectRefused(withGeoTransform('rotated', '560000, 4.9, 0.5, 6523000, 0.5, -4.9'), 'not-north-up', [/rotated or sheared/, /only north-up grids/, /gdalwarp/]);
    await expectRefused(withGeoTransform('south-up', '560000, 5, 0, 6520000, 0, 5'), 'not-north-up', [/rows run south to north/]);
    runGdal('gdal_translate', ['-q', '-gcp', '0', '0', '560000', '6523000', '-gcp', '600', '0', '563000', '6523000', '-gcp', '0', '600', '560000', '6520000', source, path('gcps.tif')]);
    await expectRefused(path('gcps.tif'), 'not-north-up', [/ground control points/, /gdalwarp/]);
    runGdal('gdal_create', ['-q', '-outsize', '20', '20', '-ot', 'Float32', '-burn', '150', path('unplaced.tif')]);
    await expectRefused(path('unplaced.tif'), 'no-georeferencing', [/no georeferencing/]);
  });

  it('refuses a compression it does not decode, and damaged compressed data', async () => {
    runGdal('gdal_translate', ['-q', '-co', 'COMPRESS=ZSTD', source, path('zstd.tif')]);
    await expectRefused(path('zstd.tif'), 'unsupported-compression', [/compressed with Zstandard/, /COMPRESS=DEFLATE/]);
    runGdal('gdal_translate', ['-q', '-co', 'COMPRESS=DEFLATE', source, path('deflate.tif')]);
    const bytes = readFileSync(path('deflate.tif'));
    bytes.set(seededBytes(2000, 7), bytes.length >> 1);
    writeFileSync(path('damaged.tif'), bytes);
    await expectRefused(path('damaged.tif'), 'damaged', [/could not be decoded/, /Export the elevation model again/], { header: false });
  });
});
