/**
 * Load benchmark of the built server on loopback, with the demo property (invented) loaded:
 *
 *   npm run build && npm run bench:load [-- --duration 30 --connections 50 --max-requests 200000 --soak]
 *
 * Signs in the demo accounts (several sessions each), then keeps `connections` callers busy for
 * `duration` seconds (or until `max-requests`), each repeating a realistic mix: workspace reads
 * (elevation models, fence lines, crossings, drainage tiles), a crossing's design, a fence edit
 * (PATCH with the version read, moving a vertex, which re-finds its crossings), a plan export and
 * now and then a fresh sign-in. Prints requests per second, latency p50/p99 for reads and writes,
 * errors and 5xx, and whether the targets are met: no errors, no 5xx, read p99 under 250 ms,
 * write p99 under 500 ms. A second phase re-uploads the demo elevation model and measures reads
 * while its terrain run is in progress (target: read p99 under 500 ms).
 *
 * `--soak` runs the mix for 10 minutes instead, sampling the server's resident memory every 10 s,
 * and prints its growth from the 60 s sample to the last (target: under 10 %). The per-person
 * limit on heavy requests is raised for the benchmark: the mix exports far more often than a
 * person would.
 */
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { createHistogram, performance, type RecordableHistogram } from 'node:perf_hooks';
import Database from 'better-sqlite3';
import { createMulberry32 } from '../data-samples/lib/prng';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from './demo-accounts';
import { freePort } from './local-process';

const ENTRY = 'dist/server/entry.mjs';
const AUTH_SECRET = 'bench-secret-that-is-long-enough-for-authjs-0123456789';
const REQUEST_TIMEOUT_MS = 10_000;

function option(name: string, fallback: number): number {
  const at = process.argv.indexOf(`--${name}`);
  if (at < 0) return fallback;
  const value = Number(process.argv[at + 1]);
  if (!Number.isFinite(value) || value <= 0) throw new Error(`--${name} takes a positive number (got "${process.argv[at + 1] ?? ''}").`);
  return value;
}
const soak = process.argv.includes('--soak');
const durationS = option('duration', soak ? 600 : 30);
const connections = option('connections', 50);
const maxRequests = option('max-requests', soak ? 2_000_000 : 200_000);
const terrainPhaseS = option('terrain-duration', 20);


async function startServer(dataDir: string): Promise<{ server: ChildProcess; baseUrl: string }> {
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  // BENCH_PROFILE_DIR=folder writes a CPU profile of the server there (open it in Chrome's DevTools).
  const profile = process.env.BENCH_PROFILE_DIR ? ['--cpu-prof', `--cpu-prof-dir=${path.resolve(process.env.BENCH_PROFILE_DIR)}`, '--import', 'data:text/javascript,process.on("SIGTERM",()=>process.exit(0))'] : [];
  const server = spawn(process.execPath, [...profile, ENTRY], {
    env: { ...process.env, NODE_ENV: 'production', HOST: '127.0.0.1', PORT: String(port), DATA_DIR: dataDir, DATABASE_URL: '', AUTH_SECRET, EXPENSIVE_REQUESTS_PER_MINUTE: '1000000' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  server.stdout?.on('data', (chunk: Buffer) => (output = (output + chunk.toString()).slice(-20_000)));
  server.stderr?.on('data', (chunk: Buffer) => (output = (output + chunk.toString()).slice(-20_000)));
  process.on('exit', () => server.kill());
  const deadline = Date.now() + 30_000;
  for (;;) {
    try {
      if ((await fetch(`${baseUrl}/api/health`)).ok) return { server, baseUrl };
    } catch {
      // not listening yet
    }
    if (server.exitCode !== null || Date.now() > deadline) {
      server.kill();
      throw new Error(`The built server did not start:\n${output}`);
    }
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}

/** A signed-in caller: its cookie jar, as the browser keeps it. */
class Session {
  private readonly cookies = new Map<string, string>();
  constructor(
    readonly baseUrl: string,
    readonly email: string,
  ) {}

  async request(method: string, route: string, body?: unknown, headers: Record<string, string> = {}): Promise<Response> {
    const init: RequestInit = {
      method,
      redirect: 'manual',
      signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS),
      headers: { Origin: this.baseUrl, 'Accept-Encoding': 'gzip', Cookie: [...this.cookies].map(([name, value]) => `${name}=${value}`).join('; '), ...headers },
    };
    if (body !== undefined) {
      init.body = typeof body === 'string' ? body : body instanceof Uint8Array ? new Uint8Array(body) : JSON.stringify(body);
      (init.headers as Record<string, string>)['Content-Type'] ??= 'application/json';
    }
    const response = await fetch(this.baseUrl + route, init);
    for (const cookie of response.headers.getSetCookie()) {
      const [pair] = cookie.split(';');
      const at = pair!.indexOf('=');
      const value = pair!.slice(at + 1).trim();
      if (value === '' || /max-age=0/i.test(cookie)) this.cookies.delete(pair!.slice(0, at).trim());
      else this.cookies.set(pair!.slice(0, at).trim(), value);
    }
    return response;
  }

  /** Signs in through Auth.js as the sign-in page does (CSRF token, then the credentials callback). */
  async signIn(): Promise<Response> {
    const csrf = await this.request('GET', '/api/auth/csrf');
    const { csrfToken } = (await csrf.json()) as { csrfToken: string };
    const form = new URLSearchParams({ email: this.email, password: DEMO_PASSWORD, csrfToken, callbackUrl: '/app' }).toString();
    return this.request('POST', '/api/auth/callback/credentials', form, { 'Content-Type': 'application/x-www-form-urlencoded', 'X-Auth-Return-Redirect': '1' });
  }
}

type Kind = 'read' | 'write';

/**
 * The mix, as shares of requests (the rest are workspace reads): about what a team working in one
 * property does; fence edits come only from owner and manager sessions (half the connections), so
 * they are about SHARE.edit / 2 of all requests.
 */
const SHARE = { signIn: 0.02, edit: 0.12, export: 0.03, crossingDesign: 0.15 };
type Stats = {
  read: RecordableHistogram;
  write: RecordableHistogram;
  byName: Map<string, RecordableHistogram>;
  requests: number;
  errors: number;
  serverErrors: number;
  /** Crossings gone since their id was read (a terrain run or an edit found them again): 404, expected. */
  gone: number;
  firstErrors: string[];
};

function newStats(): Stats {
  return { read: createHistogram(), write: createHistogram(), byName: new Map(), requests: 0, errors: 0, serverErrors: 0, gone: 0, firstErrors: [] };
}

/**
 * Times one request (body read to the end); a 4xx, a 5xx or a failure counts as an error, except
 * a 404 for a crossing whose id may have been replaced (`mayBeGone`), which is counted apart.
 */
async function timed(stats: Stats, kind: Kind, name: string, send: () => Promise<Response>, mayBeGone = false): Promise<Response | undefined> {
  const started = performance.now();
  stats.requests += 1;
  const histogram = stats.byName.get(name) ?? createHistogram();
  stats.byName.set(name, histogram);
  const record = () => {
    const us = Math.max(1, Math.round((performance.now() - started) * 1000));
    stats[kind].record(us);
    histogram.record(us);
  };
  try {
    const response = await send();
    const body = await response.arrayBuffer();
    record();
    if (response.status >= 500) stats.serverErrors += 1;
    if (response.status === 404 && mayBeGone) {
      stats.gone += 1;
      return undefined;
    }
    if (response.status >= 400) {
      stats.errors += 1;
      if (stats.firstErrors.length < 5) stats.firstErrors.push(`${name}: ${response.status} ${Buffer.from(body).toString('utf8').slice(0, 200)}`);
      return undefined;
    }
    return new Response(body, { status: response.status, headers: response.headers });
  } catch (error) {
    record();
    stats.errors += 1;
    if (stats.firstErrors.length < 5) stats.firstErrors.push(`${name}: ${(error as Error).message}`);
    return undefined;
  }
}

/** What the workspace reads: the property, its crossings, and drainage tiles of the newest terrain run. */
type Workspace = { propertyId: number; crossingIds: number[]; runId: number | null; drainageTiles: string[] };

/** The z/x/y of the tile holding a point (OSM wiki, "Slippy map tilenames"). */
function tileOf([lon, lat]: [number, number], z: number): string {
  const n = 2 ** z;
  const rad = (lat * Math.PI) / 180;
  return `${z}/${Math.floor(((lon + 180) / 360) * n)}/${Math.floor(((1 - Math.log(Math.tan(rad) + 1 / Math.cos(rad)) / Math.PI) / 2) * n)}`;
}
type Caller = { session: Session; canEdit: boolean; fence?: { id: number; version: number; coordinates: [number, number][] } };

type Task = 'sign-in' | 'edit' | 'export' | 'design' | 'read';

/** What a roll in [0, 1) asks for: the shares of SHARE, reads for what the caller may not do. */
function taskFor(roll: number, mix: 'full' | 'reads', canEdit: boolean, hasCrossings: boolean): Task {
  let below = 0;
  for (const [task, share] of [['sign-in', SHARE.signIn], ['edit', SHARE.edit], ['export', SHARE.export], ['design', SHARE.crossingDesign]] as const) {
    below += share;
    if (roll >= below) continue;
    if (task === 'design') return hasCrossings ? 'design' : 'read';
    if (mix === 'reads' || (task === 'edit' && !canEdit)) return 'read';
    return task;
  }
  return 'read';
}

async function newestRun(session: Session, base: string): Promise<number | null> {
  const { elevationModels } = (await (await session.request('GET', `${base}/elevation-models`)).json()) as { elevationModels: { latestRun: { id: number; status: string } | null }[] };
  const runs = elevationModels.map((model) => model.latestRun).filter((run) => run?.status === 'succeeded');
  return runs.length ? Math.max(...runs.map((run) => run!.id)) : null;
}

/** One connection's loop: a weighted mix, until the time is up or the request cap is reached. */
async function runCaller(caller: Caller, workspace: Workspace, stats: Stats, endsAt: number, seed: number, mix: 'full' | 'reads'): Promise<void> {
  const random = createMulberry32(seed);
  const base = `/api/properties/${workspace.propertyId}`;
  const reads = ['elevation-models', 'fence-lines', 'crossings', 'drainage tile'];
  while (performance.now() < endsAt && stats.requests < maxRequests) {
    const { session } = caller;
    const task = taskFor(random(), mix, caller.canEdit && caller.fence !== undefined, workspace.crossingIds.length > 0);
    if (task === 'sign-in') {
      await timed(stats, 'write', 'sign-in', () => session.signIn());
    } else if (task === 'edit' && caller.fence) {
      const fence = caller.fence;
      // Nudge the middle vertex a few metres back and forth: the crossings of the line are found again.
      const moved = fence.coordinates.map(([lon, lat], index) => (index === 1 ? [lon + (random() - 0.5) * 0.0001, lat] : [lon, lat]) as [number, number]);
      const answer = await timed(stats, 'write', 'fence edit', () => session.request('PATCH', `${base}/fence-lines/${fence.id}`, { coordinates: moved, version: fence.version }));
      if (answer) {
        const { fenceLine } = (await answer.json()) as { fenceLine: { version: number; coordinates: [number, number][] } };
        caller.fence = { id: fence.id, version: fenceLine.version, coordinates: fenceLine.coordinates };
      }
    } else if (task === 'export') {
      await timed(stats, 'read', 'export', () => session.request('GET', `${base}/exports/plan.geojson`));
    } else if (task === 'design') {
      const id = workspace.crossingIds[Math.floor(random() * workspace.crossingIds.length)]!;
      const answer = await timed(stats, 'read', 'crossing design', () => session.request('GET', `${base}/crossings/${id}`), true);
      if (!answer) {
        // Crossings are found again after a terrain run: read the list again, as the workspace does.
        const list = await timed(stats, 'read', 'crossings', () => session.request('GET', `${base}/crossings`));
        if (list) workspace.crossingIds = ((await list.json()) as { features: { id: number }[] }).features.map((feature) => feature.id);
      }
    } else {
      const what = reads[Math.floor(random() * reads.length)]!;
      const tile = workspace.drainageTiles[Math.floor(random() * workspace.drainageTiles.length)];
      if (what === 'drainage tile' && tile && workspace.runId !== null) {
        const answer = await timed(stats, 'read', what, () => session.request('GET', `${base}/terrain-runs/${workspace.runId}/drainage/${tile}`), true);
        // A new terrain run replaces the drainage lines: the map asks the newest run's tiles.
        if (!answer) workspace.runId = await newestRun(session, base);
      } else {
        const route = what === 'drainage tile' ? 'crossings' : what;
        await timed(stats, 'read', route, () => session.request('GET', `${base}/${route}`));
      }
    }
  }
}

const ms = (histogram: RecordableHistogram, percentile: number) => (histogram.count ? histogram.percentile(percentile) / 1000 : NaN);
const fmt = (value: number) => (Number.isNaN(value) ? '—' : `${value.toFixed(1)} ms`);

function report(title: string, stats: Stats, elapsedS: number): { readP99: number; writeP99: number } {
  const readP99 = ms(stats.read, 99);
  const writeP99 = ms(stats.write, 99);
  console.log(`\n${title}`);
  console.log(`  requests        ${stats.requests} in ${elapsedS.toFixed(1)} s = ${(stats.requests / elapsedS).toFixed(0)} requests/s`);
  for (const [name, histogram] of [...stats.byName].sort(([a], [b]) => a.localeCompare(b))) {
    console.log(`    ${name.padEnd(18)} ${String(histogram.count).padStart(6)}  p50 ${fmt(ms(histogram, 50)).padStart(9)}  p99 ${fmt(ms(histogram, 99)).padStart(9)}`);
  }
  console.log(`  reads           ${stats.read.count}: p50 ${fmt(ms(stats.read, 50))}, p99 ${fmt(readP99)}, max ${fmt(stats.read.count ? stats.read.max / 1000 : NaN)}`);
  console.log(`  writes          ${stats.write.count}: p50 ${fmt(ms(stats.write, 50))}, p99 ${fmt(writeP99)}, max ${fmt(stats.write.count ? stats.write.max / 1000 : NaN)}`);
  console.log(`  errors          ${stats.errors} (5xx: ${stats.serverErrors})${stats.gone ? `; ${stats.gone} crossing(s) gone since read (404, list read again)` : ''}`);
  for (const line of stats.firstErrors) console.log(`    ${line}`);
  return { readP99, writeP99 };
}

function rssMb(pid: number): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  return Number(/VmRSS:\s+(\d+)/.exec(status)?.[1] ?? NaN) / 1024;
}

async function waitForTerrain(dataDir: string, timeoutMs: number): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  const database = new Database(path.join(dataDir, 'gullyline.sqlite'), { readonly: true });
  try {
    for (;;) {
      const busy = database.prepare("select count(*) as n from terrain_runs where status in ('queued', 'running')").get() as { n: number };
      // The crossings are designed after the run, in the analysis worker: wait for them too.
      const crossings = database.prepare('select count(*) as n from crossings').get() as { n: number };
      if (busy.n === 0 && crossings.n > 0) return;
      if (Date.now() > deadline) throw new Error('The demo terrain run did not finish in time.');
      await new Promise((resolve) => setTimeout(resolve, 250));
    }
  } finally {
    database.close();
  }
}

function terrainBusy(dataDir: string): boolean {
  const database = new Database(path.join(dataDir, 'gullyline.sqlite'), { readonly: true });
  try {
    return (database.prepare("select count(*) as n from terrain_runs where status in ('queued', 'running')").get() as { n: number }).n > 0;
  } finally {
    database.close();
  }
}

async function main(): Promise<void> {
  if (!existsSync(ENTRY)) throw new Error(`${ENTRY} is missing: run "npm run build" first (bench:load measures the built app).`);
  const dataDir = mkdtempSync(path.join(tmpdir(), 'gullyline-bench-load-'));
  let server: ChildProcess | undefined;
  try {
    execFileSync(process.execPath, ['--import', 'tsx', 'scripts/db.ts', 'seed'], { env: { ...process.env, DATA_DIR: dataDir, DATABASE_URL: '', NODE_ENV: 'test', AUTH_SECRET }, stdio: 'pipe' });
    const started = await startServer(dataDir);
    server = started.server;
    const { baseUrl } = started;
    await waitForTerrain(dataDir, 300_000);

    // Sessions: the demo accounts, each signed in several times (as on several devices).
    const sessionsPerAccount = Math.max(1, Math.ceil(connections / DEMO_ACCOUNTS.length / 3));
    const sessions: { session: Session; role: string }[] = [];
    for (const account of DEMO_ACCOUNTS) {
      for (let i = 0; i < sessionsPerAccount; i += 1) {
        const session = new Session(baseUrl, account.email);
        const answer = await session.signIn();
        if (!answer.ok) throw new Error(`Sign-in of ${account.email} failed: ${answer.status}`);
        sessions.push({ session, role: account.role });
      }
    }
    const manager = sessions.find((entry) => entry.role === 'manager')!.session;
    const { properties } = (await (await manager.request('GET', '/api/properties')).json()) as { properties: { id: number }[] };
    const propertyId = properties[0]!.id;
    const crossings = (await (await manager.request('GET', `/api/properties/${propertyId}/crossings`)).json()) as { features: { id: number; geometry: { coordinates: [number, number] } }[] };
    const fenceLines = ((await (await manager.request('GET', `/api/properties/${propertyId}/fence-lines`)).json()) as { fenceLines: { coordinates: [number, number][] }[] }).fenceLines;
    // The tiles a map open around the crossings asks for, at the zooms the workspace opens and reads at.
    const drainageTiles = [...new Set(crossings.features.flatMap((feature) => [12, 13, 14].map((z) => tileOf(feature.geometry.coordinates, z))))];
    const workspace: Workspace = { propertyId, crossingIds: crossings.features.map((feature) => feature.id), runId: await newestRun(manager, `/api/properties/${propertyId}`), drainageTiles };

    // Each editing connection edits its own fence line (a short copy of a demo line's start), so edits never conflict.
    const callers: Caller[] = [];
    for (let i = 0; i < connections; i += 1) {
      const { session, role } = sessions[i % sessions.length]!;
      const canEdit = role === 'owner' || role === 'manager';
      const caller: Caller = { session, canEdit };
      if (canEdit) {
        const source = fenceLines[i % fenceLines.length]!.coordinates;
        const [a, b] = [source[0]!, source[Math.min(1, source.length - 1)]!];
        const coordinates: [number, number][] = [a, [(a[0] + b[0]) / 2 + 0.0002, (a[1] + b[1]) / 2], b];
        const created = await session.request('POST', `/api/properties/${propertyId}/fence-lines`, { name: `Load test ${i + 1}`, coordinates });
        if (created.status !== 201) throw new Error(`Could not create a fence line for the benchmark: ${created.status} ${await created.text()}`);
        const { fenceLine } = (await created.json()) as { fenceLine: { id: number; version: number; coordinates: [number, number][] } };
        caller.fence = { id: fenceLine.id, version: fenceLine.version, coordinates: fenceLine.coordinates };
      }
      callers.push(caller);
    }
    const pid = server.pid!;
    console.log(
      `Demo property ${propertyId}: ${fenceLines.length} fence lines (+${callers.filter((c) => c.fence).length} for edits), ${workspace.crossingIds.length} crossings; ` +
        `${sessions.length} sessions of ${DEMO_ACCOUNTS.length} accounts; ${connections} connections, ${durationS} s, at most ${maxRequests} requests. Server RSS ${rssMb(pid).toFixed(0)} MB.`,
    );

    // Main phase (or soak).
    const stats = newStats();
    const t0 = performance.now();
    const endsAt = t0 + durationS * 1000;
    const samples: number[] = [];
    const sampler = setInterval(() => {
      samples.push(rssMb(pid));
      if (soak) console.log(`  ${((performance.now() - t0) / 1000).toFixed(0).padStart(4)} s  RSS ${samples.at(-1)!.toFixed(0)} MB, ${stats.requests} requests`);
    }, 10_000);
    await Promise.all(callers.map((caller, index) => runCaller(caller, workspace, stats, endsAt, 1000 + index, 'full')));
    clearInterval(sampler);
    const main = report(soak ? `Soak: ${durationS} s` : `Mixed load: ${durationS} s`, stats, (performance.now() - t0) / 1000);
    const verdicts: [string, boolean][] = [
      ['no errors', stats.errors === 0],
      ['no 5xx', stats.serverErrors === 0],
      ['read p99 < 250 ms', main.readP99 < 250],
      ['write p99 < 500 ms', main.writeP99 < 500],
    ];
    if (samples.length >= 2) {
      // The soak measures growth after a minute of warm-up (caches filled, code optimised).
      const baselineAt = soak ? Math.min(5, samples.length - 2) : 0;
      const baseline = samples[baselineAt]!;
      const growth = ((samples.at(-1)! - baseline) / baseline) * 100;
      console.log(
        `  server RSS      ${(baselineAt + 1) * 10} s sample ${baseline.toFixed(0)} MB, last ${samples.at(-1)!.toFixed(0)} MB, peak ${Math.max(...samples).toFixed(0)} MB: growth ${growth.toFixed(1)} %`,
      );
      if (soak) verdicts.push(['memory growth < 10 %', growth < 10]);
    }

    // Reads while a terrain run is in progress: the demo elevation model uploaded again.
    if (!soak) {
      const dem = readFileSync('data-samples/saltbush-rise-dem.tif');
      const upload = await manager.request('POST', `/api/properties/${propertyId}/elevation-models?name=saltbush-rise-dem-again.tif`, new Uint8Array(dem), { 'Content-Type': 'image/tiff' });
      if (upload.status !== 201) throw new Error(`Re-uploading the elevation model failed: ${upload.status} ${await upload.text()}`);
      const terrainStats = newStats();
      const t1 = performance.now();
      const terrainEndsAt = t1 + terrainPhaseS * 1000;
      let busySamples = 0;
      let idleSamples = 0;
      const watcher = setInterval(() => (terrainBusy(dataDir) ? (busySamples += 1) : (idleSamples += 1)), 500);
      await Promise.all(callers.map((caller, index) => runCaller(caller, workspace, terrainStats, terrainEndsAt, 5000 + index, 'reads')));
      clearInterval(watcher);
      const during = report(`Reads while a terrain run is in progress: ${terrainPhaseS} s`, terrainStats, (performance.now() - t1) / 1000);
      const share = busySamples / Math.max(1, busySamples + idleSamples);
      console.log(`  terrain run     in progress for ${(share * 100).toFixed(0)} % of the phase`);
      verdicts.push(['reads during a terrain run: no errors', terrainStats.errors === 0], ['reads during a terrain run: p99 < 500 ms', during.readP99 < 500]);
    }

    console.log('\nTargets');
    for (const [name, met] of verdicts) console.log(`  ${met ? 'met    ' : 'NOT MET'}  ${name}`);
    if (verdicts.some(([, met]) => !met)) process.exitCode = 1;
  } finally {
    if (server && server.exitCode === null) {
      server.kill('SIGTERM');
      await new Promise((resolve) => server!.once('exit', resolve));
    }
    if (process.env.KEEP_BENCH_DATA) console.log(`Data kept in ${dataDir}`);
    else rmSync(dataDir, { recursive: true, force: true });
  }
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exitCode = 1;
});
