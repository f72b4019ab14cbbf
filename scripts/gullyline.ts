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
import { designCrossing } from '../src/lib/crossings/design-crossing';
import { findCrossings } from '../src/lib/crossings/geometry/find-crossings';
import { crossingInputsSchema } from '../src/lib/schemas/crossing';
import { wireSpecSchema } from '../src/lib/schemas/plan';

const USAGE = `Usage:
  npm run gullyline -- terrain DEM.tif --out DIR [--threshold-ha N] [--crs EPSG:xxxx]
      Writes filled.tif, flowdir.tif, accumulation.tif (upstream cells, the cell itself included),
      hillshade.tif (GeoTIFFs in the model's CRS), drainage.geojson (model CRS), contours.geojson
      (WGS84) and hillshade.png into DIR, and prints the time of each stage.
  npm run gullyline -- profile DEM.tif --line LINE.geojson [--spacing-m N]
      Prints the ground profile under the line's first LineString as CSV
      (chainage_m,x,y,elevation_m; empty elevation where the line leaves the model).
      The line is read in WGS84 (RFC 7946) unless its "crs" member names the model's CRS.
  npm run gullyline -- design --profile PROFILE.csv --discharge Q --slope S --n N
        [--angle DEG] [--crossing-chainage M] [--flood-mark M] [--freeboard M] [--style continuous-floodgate|drop-down-section]
      Designs one crossing from a ground profile along the fence (CSV with chainage_m and elevation_m
      columns, as the profile command prints) and prints the design as JSON: flood level, wet zone,
      floodgate layout with reasons, wire check, loads and materials. The crossing defaults to the
      profile's lowest point and a square (90°) crossing.
  npm run gullyline -- crossings --fences FENCES.geojson --drainage DRAINAGE.geojson [--good-within DEG] [--fair-within DEG]
      Prints, as JSON, every place a fence line (LineString features, WGS84) meets a drainage line
      (LineString features, upstream to downstream; streamOrder and upstream areas read from the
      properties when present), with chainage, crossing angle and class.`;

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

async function design(args: string[]): Promise<void> {
  const { values } = parseArgs({
    args,
    options: {
      profile: { type: 'string' }, discharge: { type: 'string' }, slope: { type: 'string' }, n: { type: 'string' }, angle: { type: 'string' },
      'crossing-chainage': { type: 'string' }, 'flood-mark': { type: 'string' }, freeboard: { type: 'string' }, style: { type: 'string' },
    },
  });
  if (!values.profile || (!values.discharge && !values['flood-mark']) || !values.slope || !values.n) throw new UsageError();
  const profile = readProfileCsv(values.profile);
  const known = profile.filter((p): p is { chainageM: number; elevationM: number } => p.elevationM !== null);
  const lowest = known.reduce((a, b) => (b.elevationM < a.elevationM ? b : a));
  const number = (name: string, value: string | undefined) => {
    if (value === undefined) return undefined;
    const parsed = Number(value);
    if (!Number.isFinite(parsed)) throw new UsageError(`--${name} must be a number, got "${value}".`);
    return parsed;
  };
  const inputs = crossingInputsSchema.safeParse({
    channelN: number('n', values.n),
    overbankN: number('n', values.n),
    ...(values['flood-mark'] ? { floodMarkM: number('flood-mark', values['flood-mark']) } : {}),
    ...(values.freeboard ? { freeboardM: number('freeboard', values.freeboard) } : {}),
    ...(values.style ? { style: values.style } : {}),
  });
  if (!inputs.success) throw new UsageError(inputs.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`).join('\n'));
  const result = designCrossing({
    profile,
    crossingChainageM: number('crossing-chainage', values['crossing-chainage']) ?? lowest.chainageM,
    crossingAngleDeg: number('angle', values.angle) ?? 90,
    channelSlope: number('slope', values.slope)!,
    catchment: null,
    ifd: null,
    dischargeM3s: number('discharge', values.discharge) ?? null,
    fence: wireSpecSchema.parse({}),
    inputs: inputs.data,
    settings: {},
  });
  console.log(JSON.stringify(result, null, 2));
}

async function crossings(args: string[]): Promise<void> {
  const { values } = parseArgs({ args, options: { fences: { type: 'string' }, drainage: { type: 'string' }, 'good-within': { type: 'string' }, 'fair-within': { type: 'string' } } });
  if (!values.fences || !values.drainage) throw new UsageError();
  const lines = (file: string) =>
    ((JSON.parse(readFileSync(file, 'utf8')) as { features?: GeoJsonFeature[] }).features ?? [])
      .filter((feature) => feature.geometry?.type === 'LineString')
      .map((feature, index) => ({ id: feature.properties?.name ?? feature.properties?.id ?? feature.id ?? index + 1, coordinates: feature.geometry!.coordinates as [number, number][], properties: feature.properties ?? {} }));
  const fences = lines(values.fences).map(({ id, coordinates }) => ({ id: String(id), coordinates }));
  const drainage = lines(values.drainage).map(({ id, coordinates, properties }) => ({
    id: String(id),
    coordinates,
    streamOrder: typeof properties.streamOrder === 'number' ? properties.streamOrder : null,
    upstreamAreaStartM2: typeof properties.upstreamAreaStartHa === 'number' ? properties.upstreamAreaStartHa * 10_000 : typeof properties.upstreamAreaStartM2 === 'number' ? properties.upstreamAreaStartM2 : null,
    upstreamAreaEndM2: typeof properties.upstreamAreaEndHa === 'number' ? properties.upstreamAreaEndHa * 10_000 : typeof properties.upstreamAreaEndM2 === 'number' ? properties.upstreamAreaEndM2 : null,
  }));
  if (fences.length === 0) throw new UsageError(`${values.fences} holds no LineString features.`);
  const goodWithinDeg = values['good-within'] ? Number(values['good-within']) : undefined;
  const fairWithinDeg = values['fair-within'] ? Number(values['fair-within']) : undefined;
  console.log(JSON.stringify(findCrossings(fences, drainage, { ...(goodWithinDeg ? { goodWithinDeg } : {}), ...(fairWithinDeg ? { fairWithinDeg } : {}) }), null, 2));
}

type GeoJsonFeature = { id?: string | number; properties?: Record<string, unknown> & { name?: string; id?: string | number }; geometry?: { type: string; coordinates: unknown } };

/** A profile CSV with chainage_m and elevation_m columns (the profile command's output). */
function readProfileCsv(file: string): { chainageM: number; elevationM: number | null }[] {
  const [header, ...rows] = readFileSync(file, 'utf8').trim().split(/\r?\n/);
  const columns = (header ?? '').split(',').map((c) => c.trim());
  const chainageAt = columns.indexOf('chainage_m');
  const elevationAt = columns.indexOf('elevation_m');
  if (chainageAt < 0 || elevationAt < 0) throw new UsageError(`${file} needs chainage_m and elevation_m columns (found: ${columns.join(', ')}).`);
  return rows.map((row, i) => {
    const cells = row.split(',');
    const chainageM = Number(cells[chainageAt]);
    const raw = cells[elevationAt]?.trim() ?? '';
    const elevationM = raw === '' ? null : Number(raw);
    if (!Number.isFinite(chainageM) || (elevationM !== null && !Number.isFinite(elevationM))) throw new UsageError(`${file} line ${i + 2} is not a number: "${row}".`);
    return { chainageM, elevationM };
  });
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
const commands: Record<string, (args: string[]) => Promise<void>> = { terrain, profile, design, crossings };
const run = command ? commands[command] : undefined;
(run ? run(rest) : Promise.reject(new UsageError(command ? `Unknown command "${command}".` : ''))).catch((error: unknown) => {
  // Problems with the input are explained; anything else is a bug worth its stack.
  const explained = error instanceof UsageError || error instanceof DomainError || error instanceof RangeError;
  console.error(explained ? (error as Error).message : error);
  process.exitCode = error instanceof UsageError ? 2 : 1;
});
