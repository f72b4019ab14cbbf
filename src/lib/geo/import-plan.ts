import { kml } from '@tmcw/togeojson';
import { z, type ZodError } from 'zod';
import { fenceLineSchemas, type FenceLineInput } from '../schemas/plan';
import { ImportError, parseXml } from './import-lines';
import { PLAN_EXPORT_FORMAT_VERSION } from './plan-data';

/** A paddock read from a plan file: its name and rings (outer then holes, `[lon, lat]`, closed). */
export interface ImportedPaddock {
  readonly name: string;
  readonly rings: [number, number][][];
}

export interface ImportedPlan {
  readonly format: 'geojson' | 'kml';
  readonly fenceLines: FenceLineInput[];
  readonly paddocks: ImportedPaddock[];
  /** Crossings and layout points in the file; not read, as they are worked out again after import. */
  readonly derived: number;
  /** Features that are not part of a Gullyline plan (no or an unknown `featureType`). */
  readonly unrecognised: number;
}

type RawFeature = { geometry?: unknown; properties?: Record<string, unknown> | null };

const lonLat = z
  .array(z.number({ invalid_type_error: 'Positions are [lon, lat] numbers.' }))
  .min(2, 'Positions are [lon, lat] numbers.')
  .transform(([lon, lat]) => [lon, lat] as [number, number])
  .refine(([lon, lat]) => Math.abs(lon) <= 180 && Math.abs(lat) <= 90, 'Longitudes lie between -180 and 180, latitudes between -90 and 90.');
const geometryError = (what: string) => ({ required_error: `A ${what} needs a geometry.`, invalid_type_error: `A ${what} needs a geometry.` });
const lineGeometry = z.object({ type: z.literal('LineString', { errorMap: () => ({ message: 'A fence line is a LineString.' }) }), coordinates: z.array(lonLat) }, geometryError('fence line'));
const ring = z
  .array(lonLat)
  .min(4, 'A paddock ring needs at least three corners and its first position repeated at the end.')
  .refine((r) => r[0]![0] === r.at(-1)![0] && r[0]![1] === r.at(-1)![1], 'A paddock ring must end where it starts.');
const paddockSchema = z.object({
  geometry: z.object({ type: z.literal('Polygon', { errorMap: () => ({ message: 'A paddock is a Polygon.' }) }), coordinates: z.array(ring).min(1, 'A paddock needs an outer ring.') }, geometryError('paddock')),
  properties: z.object({ name: z.string({ required_error: 'Give the paddock a name.' }).trim().min(1, 'Give the paddock a name.').max(120, 'Keep the name under 120 characters.') }),
});
const collectionSchema = z.object({
  type: z.literal('FeatureCollection'),
  features: z.array(z.object({ type: z.literal('Feature'), geometry: z.unknown(), properties: z.record(z.unknown()).nullable() })),
  gullylineExport: z.object({ formatVersion: z.number() }).passthrough().optional(),
});

/**
 * Reads a Gullyline plan export (GeoJSON, RFC 7946, or KML 2.2, told apart by the content) back
 * into plan input: fence lines (name, status, `[lon, lat]` coordinates, wire spec) and paddocks
 * (name, rings). Features are recognised by their `featureType` (GeoJSON property or KML
 * ExtendedData); crossings and layout points are counted and skipped, since they are worked out
 * again from the fence lines. Every fence line is checked with the same schema as one drawn on
 * the map; heights are dropped.
 *
 * @param text - the file's text
 * @param options.maxFenceVertices - most vertices in one fence line (default the schema's)
 * @throws ImportError with a message a person can act on: an empty file, text that is neither
 *   JSON nor XML, JSON that is not a FeatureCollection, XML that is not KML, a file with no fence
 *   lines or paddocks, a file too detailed to check ({@link MAX_PLAN_COMMAS}; KML as for
 *   `parseXml`), or a fence line or paddock that fails its checks (named, with the reason)
 */
export function importPlan(text: string, options: { maxFenceVertices?: number } = {}): ImportedPlan {
  const fenceLineInputSchema = fenceLineSchemas(options.maxFenceVertices).input;
  const body = text.replace(/^\uFEFF/, '').trim();
  if (!body) throw new ImportError('The file is empty. Choose the plan.geojson or plan.kml file exported from Gullyline.');
  const format = body.startsWith('<') ? 'kml' : body.startsWith('{') || body.startsWith('[') ? 'geojson' : null;
  if (!format) throw new ImportError('This file is neither GeoJSON nor KML (it starts with neither "{" nor "<"). Choose the plan.geojson or plan.kml file exported from Gullyline.');
  if (format === 'geojson' && countUpTo(body, ',', MAX_PLAN_COMMAS) > MAX_PLAN_COMMAS) {
    throw new ImportError('This plan file is too detailed to import in one go (more than about 250 000 positions). Export fewer fence lines at a time, or simplify the lines, and import the parts.');
  }
  const features = format === 'kml' ? kmlFeatures(body) : geoJsonFeatures(body);
  const label = format === 'kml' ? 'KML' : 'GeoJSON';
  if (features.length === 0) throw new ImportError(`This ${label} file has no features: there is nothing to import.`);

  const fenceLines: FenceLineInput[] = [];
  const paddocks: ImportedPaddock[] = [];
  const problems: string[] = [];
  const others: string[] = [];
  let derived = 0;
  features.forEach((feature, index) => {
    const properties = feature.properties ?? {};
    const type = properties.featureType;
    const name = typeof properties.name === 'string' ? ` "${properties.name}"` : '';
    if (type === 'fence-line') {
      const where = `feature ${index + 1} (fence line${name})`;
      const wireSpec = wireSpecOf(properties.wireSpec);
      if (wireSpec === NOT_JSON) return void problems.push(`${where}: wireSpec: is not JSON text`);
      const geometry = lineGeometry.safeParse(feature.geometry);
      const input = fenceLineInputSchema.safeParse({ ...properties, name: properties.name ?? '', coordinates: geometry.data?.coordinates ?? [], wireSpec });
      if (!geometry.success || !input.success) problems.push(`${where}: ${firstIssue((geometry.error ?? input.error)!)}`);
      else fenceLines.push(input.data);
    } else if (type === 'paddock') {
      const paddock = paddockSchema.safeParse(feature);
      if (!paddock.success) problems.push(`feature ${index + 1} (paddock${name}): ${firstIssue(paddock.error)}`);
      else paddocks.push({ name: paddock.data.properties.name, rings: paddock.data.geometry.coordinates });
    } else if (type === 'crossing' || type === 'layout-point') derived += 1;
    else others.push(geometryType(feature.geometry));
  });
  if (problems.length) {
    throw new ImportError(`Nothing was imported: ${problems.slice(0, 3).join('; ')}${problems.length > 3 ? `; and ${problems.length - 3} more` : ''}. Correct the file or export it again from Gullyline.`);
  }
  if (fenceLines.length === 0 && paddocks.length === 0) {
    if (others.length === 0) throw new ImportError(`This ${label} file holds only crossings and layout points (${derived}), which Gullyline works out again from the fence lines; it has no fence lines or paddocks to import.`);
    throw new ImportError(
      `This ${label} file has no Gullyline fence lines or paddocks: its ${others.length} feature(s) (${summarise(others)}) carry no Gullyline featureType. Choose a plan file exported from Gullyline; lines from other programs are imported as tracks.`,
    );
  }
  return { format, fenceLines, paddocks, derived, unrecognised: others.length };
}

/**
 * Most commas in a GeoJSON plan (two per position): about 250 000 positions. Checking each fence
 * line takes time and memory per vertex (measured: 720 000 positions, 14 MB, 380 MB and 17 s), so
 * a file within the upload limit but past this is refused before it is parsed.
 */
export const MAX_PLAN_COMMAS = 500_000;

function countUpTo(text: string, char: string, limit: number): number {
  let count = 0;
  for (let i = text.indexOf(char); i !== -1 && count <= limit; i = text.indexOf(char, i + 1)) count += 1;
  return count;
}

function geoJsonFeatures(body: string): RawFeature[] {
  let value: unknown;
  try {
    value = JSON.parse(body);
  } catch (error) {
    throw new ImportError(`This file is not valid JSON (${(error as Error).message}). Export the plan from Gullyline again.`);
  }
  const parsed = collectionSchema.safeParse(value);
  if (!parsed.success) {
    const type = value && typeof value === 'object' && 'type' in value ? String((value as { type: unknown }).type) : null;
    throw new ImportError(
      type === 'FeatureCollection'
        ? `This GeoJSON FeatureCollection is malformed (${firstIssue(parsed.error)}). Export the plan from Gullyline again.`
        : `This JSON is not a GeoJSON FeatureCollection${type ? ` (its type is "${type}")` : ''}. A Gullyline plan export is a FeatureCollection; choose the plan.geojson file.`,
    );
  }
  const version = parsed.data.gullylineExport?.formatVersion;
  if (version !== undefined && version > PLAN_EXPORT_FORMAT_VERSION) {
    throw new ImportError(`This plan was exported by a newer Gullyline (format ${version}; this one reads up to ${PLAN_EXPORT_FORMAT_VERSION}). Update Gullyline and import it again.`);
  }
  return parsed.data.features;
}

function kmlFeatures(body: string): RawFeature[] {
  const doc = parseXml(body);
  const root = doc.documentElement?.localName;
  if (root !== 'kml') throw new ImportError(`This file is XML but not KML (its root element is <${root ?? '?'}>). Choose the plan.kml or plan.geojson file exported from Gullyline.`);
  return kml(doc, { skipNullGeometry: true }).features;
}

const NOT_JSON = Symbol('not JSON');

/** KML's ExtendedData carries the wire spec as JSON text; GeoJSON as an object. */
function wireSpecOf(value: unknown): unknown {
  if (typeof value !== 'string') return value;
  try {
    return JSON.parse(value);
  } catch {
    return NOT_JSON;
  }
}

function firstIssue(error: ZodError): string {
  const issue = error.issues[0]!;
  const message = issue.message.replace(/\.$/, '');
  return issue.path.length ? `${issue.path.join('.')}: ${message}` : message;
}

function geometryType(geometry: unknown): string {
  return geometry && typeof geometry === 'object' && 'type' in geometry ? String((geometry as { type: unknown }).type) : 'no geometry';
}

function summarise(types: string[]): string {
  const counts = new Map<string, number>();
  for (const type of types) counts.set(type, (counts.get(type) ?? 0) + 1);
  return [...counts].map(([type, n]) => `${n} ${type}${n > 1 && type !== 'no geometry' ? 's' : ''}`).join(', ');
}
