/**
 * GDAL 3.6 command-line tools from Debian's gdal-bin package, the outside reference for the
 * elevation-model reader: gdal_translate / gdalwarp / gdal_create / gdal_edit.py to write test
 * files, gdalinfo -json and gdallocationinfo -valonly to say what is in them.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fromFile } from 'geotiff';
import { z } from 'zod';
import { uniformCellSize, type ElevationGrid } from '../../src/lib/terrain/index';

const DEMO_MODEL = 'data-samples/saltbush-rise-dem.tif';

/** Runs a GDAL tool; fails (never skips) with an install hint when GDAL is missing. */
export function runGdal(tool: string, args: readonly string[], input?: string): string {
  const result = spawnSync(tool, args, { encoding: 'utf8', input });
  if (result.error) {
    if ((result.error as NodeJS.ErrnoException).code === 'ENOENT') {
      throw new Error(`${tool} not found: install GDAL's command-line tools (Debian: apt-get install gdal-bin) to run the GDAL checks`);
    }
    throw result.error;
  }
  if (result.status !== 0) throw new Error(`${tool} ${args.join(' ')} failed: ${result.stderr}`);
  return result.stdout;
}

const ellipsoidSchema = z.object({ semi_major_axis: z.number(), inverse_flattening: z.number() });
const gdalInfoSchema = z.object({
  size: z.tuple([z.number(), z.number()]),
  geoTransform: z.tuple([z.number(), z.number(), z.number(), z.number(), z.number(), z.number()]).optional(),
  metadata: z.record(z.record(z.string())).optional(),
  bands: z.array(
    z.object({
      type: z.string(),
      block: z.tuple([z.number(), z.number()]),
      noDataValue: z.union([z.number(), z.string()]).optional(),
      minimum: z.number().optional(),
      maximum: z.number().optional(),
    }),
  ),
  stac: z
    .object({
      'proj:epsg': z.number().nullable().optional(),
      'proj:projjson': z
        .object({
          datum: z.object({ ellipsoid: ellipsoidSchema }).optional(),
          datum_ensemble: z.object({ ellipsoid: ellipsoidSchema }).optional(),
          base_crs: z.object({ datum: z.object({ ellipsoid: ellipsoidSchema }).optional() }).optional(),
        })
        .passthrough()
        .optional(),
    })
    .passthrough()
    .optional(),
});
export type GdalInfo = z.infer<typeof gdalInfoSchema>;

/** `gdalinfo -json`: size, geotransform, band type, block, nodata, EPSG code and ellipsoid. */
export function gdalInfo(file: string): GdalInfo {
  return gdalInfoSchema.parse(JSON.parse(runGdal('gdalinfo', ['-json', file])));
}

/** The ellipsoid of a CRS as gdalinfo reports it (PROJJSON), as `{ a, f }`. */
export function gdalEllipsoid(info: GdalInfo): { a: number; f: number } {
  const projjson = info.stac?.['proj:projjson'];
  const ellipsoid = projjson?.datum?.ellipsoid ?? projjson?.datum_ensemble?.ellipsoid ?? projjson?.base_crs?.datum?.ellipsoid;
  if (!ellipsoid) throw new Error('gdalinfo gave no ellipsoid');
  return { a: ellipsoid.semi_major_axis, f: 1 / ellipsoid.inverse_flattening };
}

/** `gdallocationinfo -valonly` at pixel positions (col, row): the raw value GDAL reads, nodata included. */
export function gdalValuesAt(file: string, cells: readonly (readonly [col: number, row: number])[]): number[] {
  const input = cells.map(([col, row]) => `${col} ${row}`).join('\n') + '\n';
  const lines = runGdal('gdallocationinfo', ['-valonly', file], input).trim().split('\n');
  if (lines.length !== cells.length) throw new Error(`gdallocationinfo gave ${lines.length} values for ${cells.length} cells`);
  return lines.map(Number);
}

/** Every cell as GDAL decodes it, through `gdal_translate -of ENVI -ot Float64` (raw doubles). */
export function gdalAllCells(file: string, workDir: string, name: string): Float64Array {
  const out = join(workDir, `${name}.envi`);
  runGdal('gdal_translate', ['-q', '-of', 'ENVI', '-ot', 'Float64', file, out]);
  const header = readFileSync(`${out.replace(/\.envi$/, '')}.hdr`, 'utf8');
  if (!/byte order\s*=\s*0/.test(header)) throw new Error('expected a little-endian ENVI file');
  const bytes = readFileSync(out);
  return new Float64Array(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength));
}

/** The demo elevation model (data-samples) read with geotiff.js, its nodata value turned into NaN. */
export async function readDemoModel(): Promise<ElevationGrid> {
  const image = await (await fromFile(DEMO_MODEL)).getImage();
  const [raw] = await image.readRasters();
  if (!(raw instanceof Float32Array)) throw new Error('expected a Float32 elevation model');
  const nodata = image.getGDALNoData();
  const data = raw.map((v) => (v === nodata ? Number.NaN : v));
  const [sizeX] = image.getResolution();
  const width = image.getWidth();
  const height = image.getHeight();
  return { width, height, data, ...uniformCellSize(width, height, sizeX!) };
}

/** The layer names `ogrinfo -ro -q` lists for a vector file (KML folders, GPX's waypoints …). */
export function ogrLayers(file: string): string[] {
  return runGdal('ogrinfo', ['-ro', '-q', file])
    .split('\n')
    .map((line) => /^\d+: (.*?)(?: \([^()]*\))?$/.exec(line.trim())?.[1])
    .filter((name): name is string => Boolean(name));
}

export type OgrFeature = { properties: Record<string, unknown>; geometry: { type: string; coordinates: unknown } | null };

/** One layer of a vector file as GDAL reads it, written out by `ogr2ogr -f GeoJSON` (extra options before the file). */
export function ogrFeatures(file: string, layer?: string, options: readonly string[] = []): OgrFeature[] {
  const out = runGdal('ogr2ogr', ['-f', 'GeoJSON', ...options, '/vsistdout/', file, ...(layer ? [layer] : [])]);
  return (JSON.parse(out) as { features: OgrFeature[] }).features;
}
