// Gullyline's command line, over the same cores the app uses.
//   npm run gullyline -- terrain DEM.tif --out DIR [--threshold-ha N] [--crs EPSG:xxxx]
//   npm run gullyline -- profile DEM.tif --line LINE.geojson [--spacing-m N]
import { readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { createFromWgs84 } from '../src/lib/geo/reproject';
import { DomainError } from '../src/lib/server/http';
import { readElevationModel } from '../src/lib/server/elevation/read-elevation-model';
import { runTerrain, TERRAIN_STAGES } from '../src/lib/server/terrain/run-terrain';
import { sampleProfile } from '../src/lib/terrain/profile';

const USAGE = `Usage:
  npm run gullyline -- terrain DEM.tif --out DIR [--threshold-ha N] [--crs EPSG:xxxx]
      Writes filled.tif, flowdir.tif, accumulation.tif (upstream cells, the cell itself included),
      hillshade.tif (GeoTIFFs in the model's CRS), drainage.geojson (model CRS), contours.geojson
      (WGS84) and hillshade.png into DIR, and prints the time of each stage.
  npm run gullyline -- profile DEM.tif --line LINE.geojson [--spacing-m N]
      Prints the ground profile under the line's first LineString as CSV
      (chainage_m,x,y,elevation_m; empty elevation where the line leaves the model).
      The line is read in WGS84 (RFC 7946) unless its "crs" member names the model's CRS.`;

async function terrain(args: string[]): Promise<void> {
  const { values, positionals } = parseArgs({ args, allowPositionals: true, options: { out: { type: 'string' }, 'threshold-ha': { type: 'string' }, crs: { type: 'string' } } });
  const [file] = positionals;
  if (!file || !values.out) throw new UsageError();
  const thresholdHa = values['threshold-ha'] === undefined ? undefined : Number(values['threshold-ha']);
  if (thresholdHa !== undefined && !(thresholdHa > 0)) throw new UsageError('--threshold-ha must be a positive number of hectares.');
  const started = performance.now();
  const summary = await runTerrain({ file, outDir: values.out, thresholdHa, assumeCrs: values.crs, writeRasters: true });
  for (const { stage, label } of TERRAIN_STAGES) {
    const ms = summary.stageTimesMs[stage] ?? 0;
    console.log(`${label.padEnd(34)} ${(ms / 1000).toFixed(2).padStart(7)} s`);
  }
  console.log(`${'Total'.padEnd(34)} ${((performance.now() - started) / 1000).toFixed(2).padStart(7)} s`);
  console.log(
    `${summary.width} × ${summary.height} cells in ${summary.crs.code} (${summary.crs.name}); ${summary.drainage.length} drainage lines at ${summary.thresholdHa} ha; files in ${values.out}`,
  );
}

async function profile(args: string[]): Promise<void> {
  const { values, positionals } = parseArgs({ args, allowPositionals: true, options: { line: { type: 'string' }, 'spacing-m': { type: 'string' } } });
  const [file] = positionals;
  if (!file || !values.line) throw new UsageError();
  const model = await readElevationModel(file);
  const geojson = JSON.parse(readFileSync(values.line, 'utf8')) as GeoJsonInput;
  const coordinates = firstLineString(geojson);
  if (!coordinates) throw new UsageError(`${values.line} holds no LineString.`);
  const inModelCrs = JSON.stringify(geojson.crs ?? '').includes(model.crs.code.split(':')[1]!);
  const toModel = inModelCrs ? (xy: [number, number]) => xy : createFromWgs84(model.crs.proj4);
  const line = coordinates.map((position) => toModel([position[0]!, position[1]!]));
  const spacingM = values['spacing-m'] === undefined ? undefined : Number(values['spacing-m']);
  const result = sampleProfile(model.grid, model.transform, line, spacingM === undefined ? {} : { spacingM });
  const rows = result.samples.map(
    (sample) => `${sample.chainageM.toFixed(2)},${sample.x.toFixed(3)},${sample.y.toFixed(3)},${sample.elevationM === null ? '' : sample.elevationM.toFixed(3)}`,
  );
  process.stdout.write(['chainage_m,x,y,elevation_m', ...rows].join('\n') + '\n');
}

type GeoJsonInput = { type?: string; crs?: unknown; coordinates?: number[][]; geometry?: GeoJsonInput; features?: GeoJsonInput[] };
function firstLineString(node: GeoJsonInput): number[][] | undefined {
  if (node.type === 'LineString' && node.coordinates) return node.coordinates;
  if (node.geometry) return firstLineString(node.geometry);
  for (const feature of node.features ?? []) {
    const found = firstLineString(feature);
    if (found) return found;
  }
  return undefined;
}

class UsageError extends Error {
  constructor(message = '') {
    super(message ? `${message}\n\n${USAGE}` : USAGE);
  }
}

// Output piped into `head` and the like may close early; that is not an error.
process.stdout.on('error', (error: NodeJS.ErrnoException) => {
  if (error.code === 'EPIPE') process.exit(0);
  throw error;
});

const [command, ...rest] = process.argv.slice(2);
const commands: Record<string, (args: string[]) => Promise<void>> = { terrain, profile };
const run = command ? commands[command] : undefined;
(run ? run(rest) : Promise.reject(new UsageError(command ? `Unknown command "${command}".` : ''))).catch((error: unknown) => {
  // Problems with the input are explained; anything else is a bug worth its stack.
  console.error(error instanceof UsageError || error instanceof DomainError ? error.message : error);
  process.exitCode = error instanceof UsageError ? 2 : 1;
});
