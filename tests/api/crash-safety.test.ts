// The server killed with SIGKILL (no chance to tidy up) during a terrain run with an upload still
// arriving, during a burst of fence line edits, part way through a plan import and during a photo
// upload; started again on
// the same data folder, the database is whole, every edit it acknowledged is there, no row is
// half-written, a plan is stored whole or not at all, every file under the data folder belongs to
// a row, and the interrupted run reads as failed with the reason.
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import { tmpdir } from 'node:os';
import path from 'node:path';
import knex, { type Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sqliteSettings } from '../../src/lib/server/db';
import { TestClient, newAccount } from '../helpers/api-client';
import { startBuiltServer } from '../helpers/global-server';

const DEM = new Uint8Array(readFileSync('data-samples/saltbush-rise-dem.tif'));
const MANIFEST = JSON.parse(readFileSync('data-samples/saltbush-rise.json', 'utf8')) as { fenceLines: { name: string; pointsLonLat: [number, number][] }[] };
type Server = Awaited<ReturnType<typeof startBuiltServer>>;
type Run = { id: number; status: string; stage: string | null; percent: number; message: string | null };

let dataDir = '';
let server: Server | undefined;
let client: TestClient;
let account: ReturnType<typeof newAccount>;
let propertyId = 0;
let modelId = 0;
let killedRunId = 0;

async function start(): Promise<void> {
  // No per-person limit on heavy requests: the burst below is one person editing fast.
  server = await startBuiltServer(dataDir, { EXPENSIVE_REQUESTS_PER_MINUTE: '100000' });
  client = new TestClient(server.baseUrl);
  await client.signIn(account.email, account.password);
  expect(client.signedIn).toBe(true);
}

async function kill(): Promise<void> {
  const running = server!;
  const exited = new Promise((resolve) => running.server.once('exit', resolve));
  running.server.kill('SIGKILL');
  await exited;
  await running.stop();
  server = undefined;
}

/** Opens the data folder's database beside (or after) the server, runs `use`, and closes it. */
async function withDatabase<T>(use: (database: Knex) => Promise<T>): Promise<T> {
  const database = knex(sqliteSettings(path.join(dataDir, 'gullyline.sqlite')));
  try {
    return await use(database);
  } finally {
    await database.destroy();
  }
}

async function getRun(runId: number): Promise<Run> {
  return (await client.json<{ run: Run }>('GET', `/api/properties/${propertyId}/terrain-runs/${runId}`)).body.run;
}

async function waitForRun(runId: number, done: (run: Run) => boolean, timeoutMs: number): Promise<Run> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const run = await getRun(runId);
    if (done(run)) return run;
    if (Date.now() > deadline) throw new Error(`terrain run ${runId} still ${run.status} ${run.stage} ${run.percent}%`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

/** Sends the first half of an upload and never the rest, so the server is receiving a file when killed. */
function halfUpload(route = `/api/properties/${propertyId}/elevation-models?name=half.tif`, contentType = 'image/tiff', body: Uint8Array = DEM): Promise<void> {
  const url = new URL(`${server!.baseUrl}${route}`);
  const cookie = [...(client as unknown as { cookies: Map<string, string> }).cookies].map(([name, value]) => `${name}=${value}`).join('; ');
  return new Promise((resolve) => {
    const request = httpRequest(url, { method: 'POST', headers: { Cookie: cookie, Origin: server!.baseUrl, 'Content-Type': contentType, 'Content-Length': body.length } });
    request.on('error', () => undefined);
    request.write(body.subarray(0, body.length / 2), () => resolve());
  });
}

/** Files under the data folder that no row owns; an empty list is the goal. */
async function orphanFiles(database: Knex): Promise<string[]> {
  const list = (relative: string) => (existsSync(path.join(dataDir, relative)) ? readdirSync(path.join(dataDir, relative)) : []);
  const orphans = list('uploads/incoming').map((name) => `uploads/incoming/${name}`);
  const photos = new Set((await database('inspection_photos').select('storage_key', 'thumbnail_key')).flatMap((row: { storage_key: string; thumbnail_key: string }) => [row.storage_key, row.thumbnail_key]));
  for (const folder of list('photos')) for (const name of list(`photos/${folder}`)) if (!photos.has(`photos/${folder}/${name}`)) orphans.push(`photos/${folder}/${name}`);
  const models = await database('elevation_models').select('id', 'stored_file');
  for (const name of list('elevation-models')) {
    const model = models.find((m: { id: number }) => String(m.id) === name);
    if (!model) orphans.push(`elevation-models/${name}`);
    else for (const file of list(`elevation-models/${name}`)) if (`elevation-models/${name}/${file}` !== model.stored_file) orphans.push(`elevation-models/${name}/${file}`);
  }
  const runs = await database('terrain_runs').select('id', 'status');
  for (const name of list('terrain-runs')) {
    const run = runs.find((r: { id: number }) => String(r.id) === name);
    if (!run || !['succeeded', 'running', 'queued'].includes(run.status)) orphans.push(`terrain-runs/${name} (${run?.status ?? 'no run'})`);
  }
  return orphans;
}

async function integrity(database: Knex): Promise<string> {
  const rows = (await database.raw('PRAGMA integrity_check')) as { integrity_check: string }[];
  return rows.map((row) => row.integrity_check).join('; ');
}

beforeAll(async () => {
  dataDir = mkdtempSync(path.join(tmpdir(), 'gullyline-crash-'));
  account = newAccount('crash');
  server = await startBuiltServer(dataDir, { EXPENSIVE_REQUESTS_PER_MINUTE: '100000' });
  client = new TestClient(server.baseUrl);
  await client.signUp(account);
  await client.signIn(account.email, account.password);
  propertyId = (await client.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Crash Creek', crs: 'EPSG:7854' })).body.property.id;
}, 120_000);

afterAll(async () => {
  await server?.stop();
  if (dataDir && !process.env.KEEP_TEST_DATA) rmSync(dataDir, { recursive: true, force: true });
});

describe('killed during a terrain run, with an upload arriving', () => {
  it('starts again whole: the run reads as failed with the reason, no file is left without its row', async () => {
    const upload = await client.request('POST', `/api/properties/${propertyId}/elevation-models?name=saltbush.tif`, DEM, { 'Content-Type': 'image/tiff' });
    expect(upload.status).toBe(201);
    const accepted = (await upload.json()) as { elevationModel: { id: number }; run: { id: number } };
    modelId = accepted.elevationModel.id;
    killedRunId = accepted.run.id;
    await waitForRun(killedRunId, (run) => run.status === 'running' && run.percent > 0, 60_000);
    await halfUpload();
    await new Promise((resolve) => setTimeout(resolve, 200));
    expect(readdirSync(path.join(dataDir, 'uploads/incoming')).length, 'the half upload is being received').toBeGreaterThan(0);
    await kill();

    await start();
    const run = await getRun(killedRunId);
    expect(run.status).toBe('failed');
    expect(run.message).toMatch(/restarted.*Start it again/);
    // The Terrain panel reads the model list: its latest run says the same.
    const models = await client.json<{ elevationModels: { id: number; latestRun: Run | null }[] }>('GET', `/api/properties/${propertyId}/elevation-models`);
    const latest = models.body.elevationModels.find((model) => model.id === modelId)?.latestRun;
    expect(latest).toMatchObject({ id: killedRunId, status: 'failed', message: run.message });
    await withDatabase(async (database) => {
      expect(await integrity(database)).toBe('ok');
      expect(await orphanFiles(database)).toEqual([]);
      expect(existsSync(path.join(dataDir, `elevation-models/${modelId}/source.tif`))).toBe(true);
    });
    // The person starts it again and it finishes.
    const again = await client.json<{ run: Run }>('POST', `/api/properties/${propertyId}/terrain-runs`, { elevationModelId: modelId });
    expect(again.status).toBe(201);
    const finished = await waitForRun(again.body.run.id, (r) => !['queued', 'running'].includes(r.status), 240_000);
    expect(finished.status).toBe('succeeded');
  }, 360_000);
});

describe('killed during a burst of fence line edits', () => {
  it('keeps every acknowledged edit, no half-written fence line or crossing, and a whole database', async () => {
    const base = MANIFEST.fenceLines.map((fence) => fence.pointsLonLat);
    const shift = (points: [number, number][], by: number) => points.map(([lon, lat]) => [lon + by, lat] as [number, number]);
    // One line per editor, each across the creek, so every edit also redesigns crossings.
    const lines: { id: number; version: number }[] = [];
    for (const [i, points] of base.entries()) {
      const { status, body } = await client.json<{ fenceLine: { id: number; version: number } }>('POST', `/api/properties/${propertyId}/fence-lines`, { name: `Editor ${i}`, coordinates: points });
      expect(status).toBe(201);
      lines.push({ id: body.fenceLine.id, version: body.fenceLine.version });
    }
    const acknowledged: { kind: 'change' | 'create'; id: number; name: string; version: number }[] = [];
    let stop = false;
    const editor = async (i: number) => {
      const line = lines[i]!;
      for (let n = 1; !stop; n++) {
        const name = `Editor ${i} edit ${n}`;
        const response = await client
          .json<{ fenceLine: { id: number; version: number } }>('PATCH', `/api/properties/${propertyId}/fence-lines/${line.id}`, { name, version: line.version, coordinates: shift(base[i]!, (n % 3) * 0.00004) })
          .catch(() => undefined);
        if (!response) return; // the server is gone
        if (response.status !== 200) throw new Error(`edit refused: ${response.status} ${JSON.stringify(response.body)}`);
        line.version = response.body.fenceLine.version;
        acknowledged.push({ kind: 'change', id: line.id, name, version: line.version });
      }
    };
    const creator = async () => {
      for (let n = 1; !stop; n++) {
        const name = `New line ${n}`;
        const response = await client.json<{ fenceLine: { id: number; version: number } }>('POST', `/api/properties/${propertyId}/fence-lines`, { name, coordinates: shift(base[n % base.length]!, 0.0001 * n) }).catch(() => undefined);
        if (!response) return;
        if (response.status !== 201) throw new Error(`create refused: ${response.status} ${JSON.stringify(response.body)}`);
        acknowledged.push({ kind: 'create', id: response.body.fenceLine.id, name, version: response.body.fenceLine.version });
      }
    };
    const burst = Promise.all([...lines.map((_, i) => editor(i)), creator()]);
    const deadline = Date.now() + 20_000;
    while (acknowledged.length < 12 && Date.now() < deadline) await new Promise((resolve) => setTimeout(resolve, 50));
    // Killed at once, with requests in flight.
    await kill();
    stop = true;
    await burst;
    expect(acknowledged.length).toBeGreaterThanOrEqual(6);
    console.log(`killed after ${acknowledged.length} acknowledged edits (${acknowledged.filter((e) => e.kind === 'create').length} new lines)`);

    await start();
    await withDatabase(async (database) => {
      expect(await integrity(database)).toBe('ok');
      const stored = new Map<number, { name: string; version: number; geometry: string }>(
        (await database('fence_lines').where({ property_id: propertyId }).select('id', 'name', 'version', 'geometry')).map((row: { id: number; name: string; version: number; geometry: string }) => [row.id, row]),
      );
      // The last acknowledged state of each line is there, or one edit after it that was in flight.
      const last = new Map<number, (typeof acknowledged)[number]>();
      for (const edit of acknowledged) last.set(edit.id, edit);
      for (const edit of last.values()) {
        const row = stored.get(edit.id);
        expect(row, `${edit.kind} "${edit.name}" is stored`).toBeDefined();
        expect(row!.version).toBeGreaterThanOrEqual(edit.version);
        if (row!.version === edit.version) expect(row!.name).toBe(edit.name);
      }
      for (const row of stored.values()) {
        const geometry = JSON.parse(row.geometry) as { type: string; coordinates: number[][] };
        expect(geometry.type).toBe('LineString');
        expect(geometry.coordinates.length).toBeGreaterThanOrEqual(2);
        for (const point of geometry.coordinates) expect(point.every(Number.isFinite)).toBe(true);
      }
      const strays = await database('crossings').leftJoin('fence_lines', 'fence_lines.id', 'crossings.fence_line_id').whereNull('fence_lines.id').count<{ n: number }[]>({ n: '*' });
      expect(Number(strays[0]!.n)).toBe(0);
      const crossings = await database('crossings').where({ property_id: propertyId }).count<{ n: number }[]>({ n: '*' });
      console.log(`after the restart: ${stored.size} fence lines, ${crossings[0]!.n} crossings`);
      for (const crossing of await database('crossings').where({ property_id: propertyId }).select('inputs', 'design')) {
        expect(() => JSON.parse(crossing.inputs)).not.toThrow();
        if (crossing.design !== null) expect(() => JSON.parse(crossing.design)).not.toThrow();
      }
      expect(await orphanFiles(database)).toEqual([]);
    });
    // The app works on: the fence lines read back through the API.
    const listed = await client.json<{ fenceLines: { id: number }[] }>('GET', `/api/properties/${propertyId}/fence-lines`);
    expect(listed.status).toBe(200);
  }, 240_000);
});

describe('killed during a plan import', () => {
  it('stores the whole plan or none of it', async () => {
    const base = MANIFEST.fenceLines[0]!.pointsLonLat;
    // Forty lines across the creek, each a little further east: a long write, then their crossings.
    const features = Array.from({ length: 40 }, (_, n) => ({
      type: 'Feature',
      geometry: { type: 'LineString', coordinates: base.map(([lon, lat]) => [lon + 0.0002 * (n + 1), lat]) },
      properties: { featureType: 'fence-line', name: `Imported ${n + 1}`, status: 'planned' },
    }));
    const plan = JSON.stringify({ type: 'FeatureCollection', features });
    // How long the whole import takes here, into a property of its own; the kill comes part way.
    const scratch = (await client.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Scratch', crs: 'EPSG:7854' })).body.property.id;
    const started = performance.now();
    expect((await client.request('POST', `/api/properties/${scratch}/plan-import?name=plan.geojson`, plan, { 'Content-Type': 'application/geo+json' })).status).toBe(201);
    const tookMs = performance.now() - started;
    const sent = client.request('POST', `/api/properties/${propertyId}/plan-import?name=plan.geojson`, plan, { 'Content-Type': 'application/geo+json' }).catch(() => undefined);
    await new Promise((resolve) => setTimeout(resolve, tookMs * 0.3));
    await kill();
    const answer = await sent;

    await start();
    await withDatabase(async (database) => {
      expect(await integrity(database)).toBe('ok');
      const imported = await database('fence_lines').where({ property_id: propertyId }).where('name', 'like', 'Imported %').count<{ n: number }[]>({ n: '*' });
      const count = Number(imported[0]!.n);
      console.log(`plan import (${Math.round(tookMs)} ms uncut) killed after ${Math.round(tookMs * 0.3)} ms: ${answer ? `answered ${answer.status}` : 'cut off'}; ${count} of 40 lines stored`);
      expect([0, 40]).toContain(count);
      if (answer?.status === 201) expect(count).toBe(40);
      const audit = await database('audit_log').where({ property_id: propertyId, action: 'plan.import' }).count<{ n: number }[]>({ n: '*' });
      expect(Number(audit[0]!.n)).toBe(count === 40 ? 1 : 0);
      expect(await orphanFiles(database)).toEqual([]);
    });
  }, 120_000);
});

describe('killed during a photo upload', () => {
  it('keeps no photo row and no photo file without its row: neither the half-received upload nor one stored but never committed', async () => {
    // A check to photograph, straight into the database (the crossing is not needed for photos).
    const checkId = await withDatabase(async (database) => {
      const now = new Date().toISOString();
      const [event] = await database('rain_events').insert({ property_id: propertyId, fell_on: '2026-12-01', rainfall_mm: 90, scope: 'property', created_at: now }).returning('id');
      const [round] = await database('inspection_rounds').insert({ property_id: propertyId, rain_event_id: (event as { id: number }).id, created_at: now }).returning('id');
      const [check] = await database('inspection_checks')
        .insert({ property_id: propertyId, round_id: (round as { id: number }).id, position: 1, crossing_label: 'Crossing 1', selected_by: 'property' })
        .returning('id');
      return (check as { id: number }).id;
    });
    const boundary = 'gullyline-crash-photo';
    const form = Buffer.concat([
      Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="checkId"\r\n\r\n${checkId}\r\n--${boundary}\r\nContent-Disposition: form-data; name="photo"; filename="creek.jpg"\r\nContent-Type: image/jpeg\r\n\r\n`),
      Buffer.alloc(400_000, 7),
      Buffer.from(`\r\n--${boundary}--\r\n`),
    ]);
    await halfUpload(`/api/properties/${propertyId}/photos`, `multipart/form-data; boundary=${boundary}`, new Uint8Array(form));
    // What a kill between writing a photo's two objects and committing its row leaves behind.
    const folder = path.join(dataDir, 'photos', String(propertyId));
    mkdirSync(folder, { recursive: true });
    for (const name of ['0b9d6c2e-stored-not-committed.jpg', '0b9d6c2e-stored-not-committed-thumb.jpg', '.1f2e3d4c-half-written.part']) writeFileSync(path.join(folder, name), 'x');
    await new Promise((resolve) => setTimeout(resolve, 200));
    await kill();

    await start();
    await withDatabase(async (database) => {
      expect(await integrity(database)).toBe('ok');
      expect(await database('inspection_photos').where({ check_id: checkId }).count<{ n: number }[]>({ n: '*' })).toEqual([{ n: 0 }]);
      expect(await orphanFiles(database)).toEqual([]);
    });
    expect(readdirSync(folder)).toEqual([]);
  }, 120_000);
});
