// Damaged and hostile files sent to the built server's importers: every one answers 4xx JSON with a
// message a person can act on (or, when the damage left a usable file, 2xx), never 5xx, within a
// bound per request; a refused file stores nothing (row counts and the files under the data
// folder unchanged); the server stays up and its resident memory under MAX_RSS_MB. The files come
// from the seeded generator in tests/helpers/fuzz-corpus.ts: FUZZ_SEED=<seed> replays a failure.
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import fc from 'fast-check';
import knex, { type Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sqliteSettings } from '../../src/lib/server/db';
import { TestClient, newAccount } from '../helpers/api-client';
import { oversizedTiff } from '../helpers/elevation-fixtures';
import { fuzzSeed, hostileXml, mutate, sampleGpx, sampleIfdTable, sampleKml, samplePlanGeoJson, samplePlanKml, smallGeoTiff, utf8 } from '../helpers/fuzz-corpus';
import { startBuiltServer } from '../helpers/global-server';

const SEED = fuzzSeed();
/** Longest one request may take on a busy two-core machine. */
const REQUEST_MS = 15_000;
/**
 * Resident memory the server must stay under through the whole run. It starts near 120 MB; the
 * most detailed files the importers read (a 35 000-point GPX, a KML line of 190 000 positions)
 * take it to 280–370 MB, and what the collector has not yet returned to the system adds up to
 * about 420 MB over a whole run with some seeds.
 */
const MAX_RSS_MB = 512;
const TABLES = ['elevation_models', 'terrain_runs', 'drainage_lines', 'tracks', 'paddocks', 'fence_lines', 'crossings', 'property_settings', 'audit_log'];

let dataDir = '';
let server: Awaited<ReturnType<typeof startBuiltServer>>;
let client: TestClient;
let database: Knex;
let propertyId = 0;
let peakRssMb = 0;
const peakByGroup: Record<string, number> = {};
const outcomes: Record<string, Record<string, number>> = {};

function rssMb(): number {
  const status = readFileSync(`/proc/${server.server.pid}/status`, 'utf8');
  const kb = Number(/VmRSS:\s+(\d+)/.exec(status)?.[1]);
  return kb / 1024;
}

/** Every file under the data folder but the database and the mail catcher's, with its size. */
function dataFiles(): string[] {
  const found: string[] = [];
  const walk = (dir: string) => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      const relative = path.relative(dataDir, full);
      if (relative === 'mail' || relative.startsWith('gullyline.sqlite')) continue;
      if (entry.isDirectory()) walk(full);
      else found.push(`${relative} ${statSync(full).size}`);
    }
  };
  walk(dataDir);
  return found.sort();
}

async function snapshot(): Promise<{ rows: Record<string, number>; files: string[]; version: number }> {
  const rows: Record<string, number> = {};
  for (const table of TABLES) rows[table] = Number((await database(table).count<{ n: number }[]>({ n: '*' }))[0]!.n);
  const settings = await database('property_settings').where({ property_id: propertyId }).first('version');
  return { rows, files: dataFiles(), version: settings?.version ?? 0 };
}

/**
 * Sends one case and checks its answer; a refusal must leave everything as it was. Waits for the
 * terrain worker first so a run started by an accepted model does not change counts mid-case.
 */
async function send(group: string, label: string, method: string, route: string, body: Uint8Array | string, contentType: string): Promise<number> {
  await terrainIdle();
  const before = await snapshot();
  const started = performance.now();
  const response = await client.request(method, route, body, { 'Content-Type': contentType, Accept: 'application/json' }).catch((error: Error) => {
    throw new Error(`${group}: ${label} (replay with FUZZ_SEED=${SEED}): no answer: ${error.message}`);
  });
  const answer = await response.text();
  const took = performance.now() - started;
  const where = `${group}: ${label} (replay with FUZZ_SEED=${SEED}) → ${response.status} ${answer.slice(0, 300)}`;
  expect(took, `${where} took ${Math.round(took)} ms`).toBeLessThan(REQUEST_MS);
  expect(response.status, where).toBeLessThan(500);
  expect(response.headers.get('content-type'), where).toMatch(/^application\/json/);
  const json = JSON.parse(answer) as { error?: string };
  if (response.status >= 400) {
    expect(json.error, where).toMatch(/\w{3,}.*\w{3,}/);
    expect(json.error, where).not.toMatch(/\bat .+:\d+:\d+|\[object Object\]|SQLITE|TypeError|RangeError/);
    await terrainIdle();
    expect(await snapshot(), `${where}: something was stored`).toEqual(before);
  }
  const mb = rssMb();
  peakRssMb = Math.max(peakRssMb, mb);
  peakByGroup[group] = Math.max(peakByGroup[group] ?? 0, Math.round(mb));
  expect(mb, `${where}: server RSS ${Math.round(mb)} MB`).toBeLessThan(MAX_RSS_MB);
  const bucket = (outcomes[group] ??= {});
  bucket[response.status] = (bucket[response.status] ?? 0) + 1;
  return response.status;
}

async function terrainIdle(): Promise<void> {
  for (let i = 0; i < 600; i++) {
    const busy = await database('terrain_runs').whereIn('status', ['queued', 'running']).first('id');
    if (!busy) return;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error('terrain runs did not finish');
}

beforeAll(async () => {
  dataDir = mkdtempSync(path.join(tmpdir(), 'gullyline-fuzz-'));
  // A limit of heavy requests per person far above this suite's, so every case reaches its importer.
  server = await startBuiltServer(dataDir, { EXPENSIVE_REQUESTS_PER_MINUTE: '100000' });
  database = knex(sqliteSettings(path.join(dataDir, 'gullyline.sqlite')));
  client = new TestClient(server.baseUrl);
  const account = newAccount('fuzz');
  await client.signUp(account);
  await client.signIn(account.email, account.password);
  propertyId = (await client.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Fuzz', crs: 'EPSG:7854' })).body.property.id;
}, 120_000);

afterAll(async () => {
  console.log(`fuzz seed ${SEED}; answers by importer ${JSON.stringify(outcomes)}; peak server RSS ${Math.round(peakRssMb)} MB (bound ${MAX_RSS_MB} MB), by importer ${JSON.stringify(peakByGroup)}`);
  await database?.destroy();
  await server?.stop();
  if (dataDir) rmSync(dataDir, { recursive: true, force: true });
});

describe('damaged uploads to the built server', () => {
  it('elevation models: damaged GeoTIFF headers and bodies', async () => {
    const cases = [...mutate(smallGeoTiff(), 25, SEED, { headerBytes: 300, growTo: 100_000 }), ...mutate(oversizedTiff(), 10, SEED + 1, { growTo: 50_000 })];
    let refused = 0;
    for (const { label, bytes } of cases) {
      const status = await send('GeoTIFF', label, 'POST', `/api/properties/${propertyId}/elevation-models?name=fuzz.tif`, bytes, 'image/tiff');
      if (status >= 400) refused += 1;
    }
    expect(refused).toBeGreaterThan(cases.length / 3);
  }, 300_000);

  it('tracks: damaged GPX and KML files, and hostile XML', async () => {
    const cases = [
      ...mutate(utf8(sampleGpx()), 20, SEED, { growTo: 300_000 }).map((c) => ({ ...c, name: 'walk.gpx' })),
      ...mutate(utf8(sampleKml()), 20, SEED, { growTo: 300_000 }).map((c) => ({ ...c, name: 'old.kml' })),
      ...hostileXml({ depth: 5000, hugeCoordinates: 100_000 }).map((c) => ({ label: c.label, bytes: utf8(c.text), name: 'hostile.kml' })),
    ];
    for (const { label, bytes, name } of cases) await send('GPX/KML', label, 'POST', `/api/properties/${propertyId}/tracks?name=${name}`, bytes, 'application/octet-stream');
    const names = (await database('tracks').pluck('name')) as string[];
    expect(names.join(' ')).not.toMatch(/root:|lollollol/);
  }, 300_000);

  it('the most detailed GPX read stays within the memory bound; a GPX or plan past the detail limit is refused before parsing', async () => {
    expect(await send('detail', 'a GPX of 35 000 points', 'POST', `/api/properties/${propertyId}/tracks?name=long.gpx`, utf8(sampleGpx(35_000)), 'application/gpx+xml')).toBe(201);
    const longKml = hostileXml({ depth: 1, hugeCoordinates: 190_000 }).find((c) => c.label.startsWith('a coordinate string of'))!.text;
    expect(await send('detail', 'a KML line of 190 000 positions', 'POST', `/api/properties/${propertyId}/tracks?name=long.kml`, utf8(longKml), 'application/vnd.google-earth.kml+xml')).toBe(201);
    expect(await send('detail', 'a GPX of 40 000 points', 'POST', `/api/properties/${propertyId}/tracks?name=longer.gpx`, utf8(sampleGpx(40_000)), 'application/gpx+xml')).toBe(422);
    const coordinates = Array.from({ length: 4000 }, (_, i) => [141.5 + i * 0.00001, -31.5 + (i % 2) * 0.00001]);
    const features = Array.from({ length: 180 }, (_, k) => ({ type: 'Feature', geometry: { type: 'LineString', coordinates }, properties: { featureType: 'fence-line', name: `Line ${k}`, status: 'planned' } }));
    const plan = JSON.stringify({ type: 'FeatureCollection', features });
    expect(await send('detail', `a plan of 720 000 positions (${Math.round(plan.length / 1e6)} MB)`, 'POST', `/api/properties/${propertyId}/plan-import?name=big.geojson`, plan, 'application/geo+json')).toBe(422);
  }, 120_000);

  it('plan import: damaged GeoJSON and KML plans, and hostile XML', async () => {
    const cases = [
      ...mutate(utf8(samplePlanGeoJson()), 20, SEED, { growTo: 300_000 }).map((c) => ({ ...c, name: 'plan.geojson' })),
      ...mutate(utf8(samplePlanKml()), 15, SEED, { growTo: 300_000 }).map((c) => ({ ...c, name: 'plan.kml' })),
      ...hostileXml({ depth: 5000, hugeCoordinates: 100_000 }).map((c) => ({ label: c.label, bytes: utf8(c.text), name: 'plan.kml' })),
    ];
    for (const { label, bytes, name } of cases) await send('plan', label, 'POST', `/api/properties/${propertyId}/plan-import?name=${name}`, bytes, 'application/geo+json');
  }, 300_000);

  it('settings: damaged JSON bodies and arbitrary IFD tables and price lists', async () => {
    const settings = async () => (await client.json<{ settings: { version: number } }>('GET', `/api/properties/${propertyId}/settings`)).body.settings;
    const good = JSON.stringify({ version: 0, ifdTable: sampleIfdTable(), priceList: [{ code: 'POST', description: 'Steel post', unit: 'each', unitPriceCents: 1250, supplierNote: '' }] });
    for (const { label, bytes } of mutate(utf8(good), 25, SEED, { growTo: 40_000 })) {
      const version = (await settings()).version;
      const body = new TextDecoder().decode(bytes).replace('"version":0', `"version":${version}`);
      await send('settings JSON', label, 'PATCH', `/api/properties/${propertyId}/settings`, body, 'application/json');
    }
    const table = fc.record({ aepPercent: fc.array(fc.oneof(fc.double(), fc.integer(), fc.jsonValue()), { maxLength: 4 }), durationsMin: fc.array(fc.oneof(fc.double(), fc.integer()), { maxLength: 5 }), intensitiesMmH: fc.array(fc.array(fc.oneof(fc.double(), fc.integer()), { maxLength: 5 }), { maxLength: 4 }) });
    const prices = fc.array(fc.record({ code: fc.string(), description: fc.string(), unit: fc.oneof(fc.constantFrom('each', 'm', 'roll', 'kg'), fc.string()), unitPriceCents: fc.oneof(fc.integer(), fc.double()), supplierNote: fc.string() }, { requiredKeys: [] }), { maxLength: 4 });
    const values = fc.sample(fc.record({ ifdTable: fc.oneof(table, fc.jsonValue()), priceList: fc.oneof(prices, fc.jsonValue()) }, { requiredKeys: [] }), { seed: SEED, numRuns: 30 });
    for (const [i, value] of values.entries()) {
      const version = (await settings()).version;
      await send('settings values', `fast-check sample ${i}: ${JSON.stringify(value).slice(0, 200)}`, 'PATCH', `/api/properties/${propertyId}/settings`, JSON.stringify({ version, ...value }), 'application/json');
    }
  }, 300_000);

  it('is still up and answering after every case', async () => {
    expect((await fetch(`${server.baseUrl}/api/health`)).status).toBe(200);
    expect(server.server.exitCode).toBeNull();
    expect(server.output()).not.toMatch(/Maximum call stack|heap out of memory/);
  });
});
