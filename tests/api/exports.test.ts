// Plan exports (GeoJSON, KML, GPX) and importing a plan back, through the API of the built server.
import { check } from '@placemarkio/check-geojson';
import { DOMParser } from '@xmldom/xmldom';
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeServerDb, rowCounts, serverDb, signedInClient, type TestClient } from '../helpers/api-client';

type FenceLine = { id: number; name: string; status: string; coordinates: [number, number][]; wireSpec: Record<string, unknown> };
type Paddock = { name: string; rings: [number, number][][]; areaHa: number };
type Feature = { type: 'Feature'; geometry: { type: string; coordinates: unknown }; properties: Record<string, unknown> };
type Imported = { format: string; fenceLines: number; paddocks: number; fenceLineIds: number[]; paddockIds: number[]; derivedSkipped: number };

const manifest = JSON.parse(readFileSync('data-samples/saltbush-rise.json', 'utf8')) as {
  fenceLines: { name: string; pointsLonLat: [number, number][] }[];
  paddocks: { name: string; areaHa: number; ringLonLat: [number, number][] }[];
};
const ifd = JSON.parse(readFileSync('data-samples/saltbush-rise-ifd.json', 'utf8')) as Record<string, unknown>;
const WIRES = { wireHeightsM: [0.25, 0.5, 0.75, 1.0], wireKinds: ['plain', 'plain', 'plain', 'barbed'], postSpacingM: 8 };
const STATUSES = ['planned', 'approved', 'building'];

/** The demo subdivision (data-samples) as a plan file, written by hand as a person might. */
const HAND_PLAN = JSON.stringify({
  type: 'FeatureCollection',
  features: [
    ...manifest.fenceLines.map((fence, i) => ({
      type: 'Feature', geometry: { type: 'LineString', coordinates: fence.pointsLonLat }, properties: { featureType: 'fence-line', name: fence.name, status: STATUSES[i], wireSpec: WIRES },
    })),
    ...manifest.paddocks.map((paddock) => ({ type: 'Feature', geometry: { type: 'Polygon', coordinates: [paddock.ringLonLat] }, properties: { featureType: 'paddock', name: paddock.name } })),
  ],
});

let manager: TestClient;
const ids = { first: 0, second: 0, third: 0 };
const TABLES = ['fence_lines', 'paddocks', 'crossings', 'audit_log'];

const newProperty = async (name: string) => (await manager.json<{ property: { id: number } }>('POST', '/api/properties', { name, crs: 'EPSG:7854' })).body.property.id;
const importPlan = (propertyId: number, name: string, body: string | Uint8Array, type = 'application/geo+json') =>
  manager.request('POST', `/api/properties/${propertyId}/plan-import?name=${encodeURIComponent(name)}`, typeof body === 'string' ? new TextEncoder().encode(body) : body, { 'Content-Type': type });
const download = (propertyId: number, file: string) => manager.request('GET', `/api/properties/${propertyId}/exports/${file}`);
const fenceLines = async (propertyId: number) => (await manager.json<{ fenceLines: FenceLine[] }>('GET', `/api/properties/${propertyId}/fence-lines`)).body.fenceLines;
const paddocks = async (propertyId: number) => (await manager.json<{ paddocks: Paddock[] }>('GET', `/api/properties/${propertyId}/paddocks`)).body.paddocks;

function expectSamePlan(got: FenceLine[], want: FenceLine[]) {
  expect(got.map(({ name, status, wireSpec }) => ({ name, status, wireSpec }))).toEqual(want.map(({ name, status, wireSpec }) => ({ name, status, wireSpec })));
  got.forEach((fence, i) => {
    expect(fence.coordinates).toHaveLength(want[i]!.coordinates.length);
    fence.coordinates.forEach(([lon, lat], j) => {
      expect(Math.abs(lon - want[i]!.coordinates[j]![0])).toBeLessThanOrEqual(1e-9);
      expect(Math.abs(lat - want[i]!.coordinates[j]![1])).toBeLessThanOrEqual(1e-9);
    });
  });
}

beforeAll(async () => {
  manager = (await signedInClient('exports-manager')).client;
  ids.first = await newProperty('Saltbush Rise — Exports');
  await manager.json('PATCH', `/api/properties/${ids.first}/settings`, { version: 0, ifdTable: ifd });
  const upload = await manager.request('POST', `/api/properties/${ids.first}/elevation-models?name=dem.tif`, new Uint8Array(readFileSync('data-samples/saltbush-rise-dem.tif')), { 'Content-Type': 'image/tiff' });
  const runId = ((await upload.json()) as { run: { id: number } }).run.id;
  for (let i = 0; ; i++) {
    const { body } = await manager.json<{ run: { status: string; message: string | null } }>('GET', `/api/properties/${ids.first}/terrain-runs/${runId}`);
    if (body.run.status === 'succeeded') break;
    if (body.run.status !== 'queued' && body.run.status !== 'running') throw new Error(`terrain run ${body.run.status}: ${body.run.message}`);
    if (i > 1000) throw new Error('terrain run did not finish in 100 s');
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  ids.second = await newProperty('Exports copy');
  ids.third = await newProperty('Exports KML copy');
}, 120_000);
afterAll(closeServerDb);

describe('importing a plan file', () => {
  it('stores its fence lines and paddocks, records them, and designs their crossings', async () => {
    const response = await importPlan(ids.first, 'subdivision.geojson', HAND_PLAN);
    expect(response.status).toBe(201);
    const { imported } = (await response.json()) as { imported: Imported };
    expect(imported).toMatchObject({ format: 'geojson', fenceLines: 3, paddocks: 2, derivedSkipped: 0 });
    const stored = await fenceLines(ids.first);
    expect(stored.map((f) => [f.name, f.status, f.wireSpec.wireHeightsM])).toEqual(manifest.fenceLines.map((f, i) => [f.name, STATUSES[i], WIRES.wireHeightsM]));
    // Geodesic area (GeographicLib) against the generator's planar area in EPSG:7854 (data-samples manifest): within 0.1 %.
    for (const [i, paddock] of (await paddocks(ids.first)).entries()) expect(Math.abs(paddock.areaHa / manifest.paddocks[i]!.areaHa - 1)).toBeLessThan(0.001);
    const actions = (await serverDb()('audit_log').where({ property_id: ids.first }).select('action')).map((row) => row.action);
    expect(actions.filter((a) => a === 'fence_line.create')).toHaveLength(3);
    expect(actions).toContain('plan.import');
    const designed = await serverDb()('crossings').where({ property_id: ids.first, design_status: 'designed' }).count<{ n: number }[]>({ n: '*' });
    expect(Number(designed[0]!.n)).toBeGreaterThanOrEqual(3);
  });
});

describe('exports', () => {
  let collection: { gullylineExport: Record<string, unknown>; features: Feature[] };

  it('gives the plan as GeoJSON, as an attachment named after the property', async () => {
    const response = await download(ids.first, 'plan.geojson');
    expect(response.status).toBe(200);
    // RFC 7946 §12: the media type is application/geo+json.
    expect(response.headers.get('content-type')).toBe('application/geo+json');
    expect(response.headers.get('content-disposition')).toBe('attachment; filename="saltbush-rise-exports-plan.geojson"');
    const text = await response.text();
    // @placemarkio/check-geojson (Placemark): throws on any RFC 7946 structure error.
    expect(() => check(text)).not.toThrow();
    collection = JSON.parse(text) as typeof collection;
    expect(collection.gullylineExport).toMatchObject({ formatVersion: 1, property: 'Saltbush Rise — Exports' });
    const types = collection.features.map((f) => f.properties.featureType);
    expect(types.filter((t) => t === 'fence-line')).toHaveLength(3);
    expect(types.filter((t) => t === 'paddock')).toHaveLength(2);
    // Layout points: as many as the designed crossings' stored positions.
    const stored = await serverDb()('crossings').where({ property_id: ids.first }).select('design');
    const positions = stored.reduce((sum, row) => sum + ((row.design && (JSON.parse(row.design) as { positions?: unknown[] }).positions?.length) || 0), 0);
    expect(positions).toBeGreaterThan(0);
    expect(types.filter((t) => t === 'layout-point')).toHaveLength(positions);
    expect(types.filter((t) => t === 'crossing')).toHaveLength(stored.length);
    // Ground under each post: the design's own ground height (same profile), to the centimetre.
    const rows = await serverDb()('crossings').where({ property_id: ids.first, design_status: 'designed' }).select('id', 'design');
    for (const row of rows) {
      const posts = (JSON.parse(row.design) as { layout: { posts: { groundM: number | null }[] } }).layout.posts;
      const exported = collection.features.filter((f) => f.properties.crossingId === row.id && /post$/.test(String(f.properties.kind)));
      expect(exported.map((f) => f.properties.elevationM)).toEqual(posts.map((p) => (p.groundM === null ? null : Number(p.groundM.toFixed(2)))));
    }
  });

  it('gives the same plan as KML 2.2, one Placemark per GeoJSON feature', async () => {
    const response = await download(ids.first, 'plan.kml');
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toBe('application/vnd.google-earth.kml+xml');
    expect(response.headers.get('content-disposition')).toBe('attachment; filename="saltbush-rise-exports-plan.kml"');
    const doc = new DOMParser().parseFromString(await response.text(), 'text/xml');
    // OGC KML 2.2 (OGC 07-147r2): namespace http://www.opengis.net/kml/2.2.
    expect(doc.documentElement!.namespaceURI).toBe('http://www.opengis.net/kml/2.2');
    expect(doc.getElementsByTagNameNS('http://www.opengis.net/kml/2.2', 'Placemark').length).toBe(collection.features.length);
  });

  it('gives the layout points as GPX 1.1 waypoints, named as in the GeoJSON', async () => {
    const response = await download(ids.first, 'waypoints.gpx');
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toBe('application/gpx+xml');
    expect(response.headers.get('content-disposition')).toBe('attachment; filename="saltbush-rise-exports-waypoints.gpx"');
    const doc = new DOMParser().parseFromString(await response.text(), 'text/xml');
    // GPX 1.1 schema (TopoGrafix): namespace http://www.topografix.com/GPX/1/1.
    expect(doc.documentElement!.namespaceURI).toBe('http://www.topografix.com/GPX/1/1');
    const names = Array.from(doc.getElementsByTagNameNS('http://www.topografix.com/GPX/1/1', 'wpt')).map((w) => w.getElementsByTagNameNS('http://www.topografix.com/GPX/1/1', 'name')[0]!.textContent);
    expect(names).toEqual(collection.features.filter((f) => f.properties.featureType === 'layout-point').map((f) => f.properties.waypoint));
    for (const name of names) expect(name!.length).toBeLessThanOrEqual(20);
  });

  it.each([
    ['GeoJSON', 'plan.geojson', 'second'],
    ['KML', 'plan.kml', 'third'],
  ] as const)('imports the exported %s into another property and gives the same fence lines and paddocks', async (_label, file, target) => {
    const exported = await (await download(ids.first, file)).text();
    const response = await importPlan(ids[target], file, exported, file.endsWith('kml') ? 'application/vnd.google-earth.kml+xml' : 'application/geo+json');
    expect(response.status).toBe(201);
    const { imported } = (await response.json()) as { imported: Imported };
    expect(imported.derivedSkipped).toBe(collection.features.filter((f) => f.geometry.type === 'Point').length);
    expectSamePlan(await fenceLines(ids[target]), await fenceLines(ids.first));
    const [got, want] = [await paddocks(ids[target]), await paddocks(ids.first)];
    expect(got.map(({ name, rings }) => ({ name, rings }))).toEqual(want.map(({ name, rings }) => ({ name, rings })));
  });

  it('takes a plan file larger than the JSON body limit as an upload', async () => {
    // MAX_JSON_BODY_BYTES is 256 KB by default (README); a plan export is a file, not a JSON request.
    const padded = { ...collection, features: [...collection.features, ...Array.from({ length: 3000 }, () => collection.features.find((f) => f.properties.featureType === 'layout-point')!)] };
    const body = JSON.stringify(padded);
    expect(body.length).toBeGreaterThan(256 * 1024);
    const propertyId = await newProperty('Large plan');
    const response = await importPlan(propertyId, 'large.geojson', body);
    expect(response.status).toBe(201);
    expect(((await response.json()) as { imported: Imported }).imported).toMatchObject({ fenceLines: 3, paddocks: 2 });
  });
});

describe('bad plan files', () => {
  const selfCrossing = JSON.stringify({
    type: 'FeatureCollection',
    features: [
      JSON.parse(HAND_PLAN).features[0],
      { type: 'Feature', geometry: { type: 'LineString', coordinates: [[141.64, -31.44], [141.65, -31.45], [141.65, -31.44], [141.64, -31.45]] }, properties: { featureType: 'fence-line', name: 'Figure eight' } },
    ],
  });
  it.each([
    ['an empty file', 'plan.geojson', '', /file is empty/],
    ['garbage', 'plan.geojson', 'PK\u0003\u0004 not a plan', /neither GeoJSON nor KML/],
    ['a GeoJSON of only points', 'points.geojson', JSON.stringify({ type: 'FeatureCollection', features: [{ type: 'Feature', geometry: { type: 'Point', coordinates: [141.6, -31.4] }, properties: {} }] }), /no Gullyline fence lines or paddocks/],
    ['a KML from another program', 'subdivision.kml', readFileSync('data-samples/saltbush-rise-subdivision.kml', 'utf8'), /carry no Gullyline featureType/],
    ['a KMZ', 'plan.kmz', 'PK\u0003\u0004', /unzip it/],
    ['a good fence line then one that crosses itself', 'plan.geojson', selfCrossing, /Nothing was imported: fence line 2 \("Figure eight"\) cannot be used as drawn/],
  ])('refuses %s with 422 and a clear message, and stores nothing', async (_label, name, body, message) => {
    const before = await rowCounts(...TABLES);
    const response = await importPlan(ids.second, name, body);
    expect(response.status).toBe(422);
    const answer = (await response.json()) as { error: string; fields: Record<string, string> };
    expect(answer.error).toMatch(message);
    expect(answer.fields.file).toBe(answer.error);
    expect(await rowCounts(...TABLES)).toEqual(before);
  });
});
