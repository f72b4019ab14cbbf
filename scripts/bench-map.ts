/**
 * Benchmark of the property workspace in headless Chromium, on a generated property of 2 000
 * fence lines, 20 000 drainage segments and 500 crossings (scripts/bench-map-property.ts:
 * invented, seeded, deterministic), served by the built server as it ships.
 *
 *   npm run build && npm run bench:map -- [seed]
 *
 * Prints, for three loads of the workspace, the time from navigation start to the map's first
 * `idle` with the plan drawn, and where that time went (requests, long tasks) for the median
 * load; then the JavaScript the landing page and the workspace page download, gzip (level 9) and
 * brotli (quality 11) compressed, the workspace's split into MapLibre and its own code. Targets:
 * first idle under 3 s, landing page under 20 KB of JavaScript, the workspace's own code under
 * 300 KB (gzip; KB = 1000 bytes). A missed target is printed as MISSED; the exit code is non-zero
 * only when the benchmark itself fails. KEEP_BENCH_DATA=1 keeps the data folder and server log;
 * BENCH_TRACE=1 adds a load under Chromium's tracing and prints which threads were busy and in
 * what (for a load far over its target). On a shared machine the figures include waiting for a
 * core: the load average and the CPU time the server and the browser used during each load are
 * printed beside the wall time.
 */
import type { ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import path from 'node:path';
import { brotliCompressSync, constants as zlibConstants, gzipSync } from 'node:zlib';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { BENCH_PROPERTY, seedBenchProperty } from './bench-map-property';
import { BUILT_SERVER, CHROMIUM_ARGS, spawnBuiltServer } from './local-process';

const seed = Number(process.argv[2] ?? 20261202);
const RUNS = 3;
const KB = 1000;
const TARGETS = { firstIdleMs: 3000, landingJsBytes: 20 * KB, workspaceOwnJsBytes: 300 * KB };
const AUTH_SECRET = 'bench-secret-that-is-long-enough-for-authjs-0123456789';
/**
 * The sources that hold the plan; "drawn" means each has its features. An id ending in "-" stands
 * for every source it begins (the drainage lines are one vector-tile source per terrain run).
 */
const PLAN_SOURCES = ['plan-fence-lines', 'drainage-', 'plan-crossings'];


type Marks = { publishedMs: number | null; firstIdleMs: number | null; readyIdleMs: number | null; idleCount: number; longTasks: { startMs: number; durationMs: number }[] };
type ResourceTiming = { name: string; type: string; startMs: number; ttfbMs: number; endMs: number; bytes: number };
type LoadResult = {
  readyIdleMs: number;
  marks: Marks;
  navigation: { responseEndMs: number; domContentLoadedMs: number };
  resources: ResourceTiming[];
  drawn: Record<string, number>;
  panelRows: { fences: number; crossings: number };
  webgl: string;
};
type ShippedScript = { name: string; rawBytes: number; gzipBytes: number; brotliBytes: number; maplibre: boolean };

/**
 * Runs in the page before any of its scripts: watches for the map the workspace publishes as
 * `window.__gullylineMap` (once loaded and fitted) and stamps, in ms since navigation start, its
 * first `idle` and its first `idle` at which every plan source holds features. MapLibre fires
 * `idle` only when no source is loading (GeoJSON parsed and tiled in its worker, the hillshade
 * image and contours loaded), no transition runs and the frame is drawn. Plain JavaScript in a
 * string: a function handed to the page would carry tsx's helpers, which the page lacks.
 */
const INSTRUMENT_PAGE = `(() => {
  const sourceIds = ${JSON.stringify(PLAN_SOURCES)};
  const marks = { publishedMs: null, firstIdleMs: null, readyIdleMs: null, idleCount: 0, longTasks: [] };
  window.__benchMarks = marks;
  new PerformanceObserver((list) => {
    for (const entry of list.getEntries()) marks.longTasks.push({ startMs: entry.startTime, durationMs: entry.duration });
  }).observe({ type: 'longtask', buffered: true });
  // A GeoJSON source holds its features once given them; a vector source once its tiles in view are loaded.
  const hasFeatures = (map) => sourceIds.every((pattern) => {
    const ids = Object.keys(map.getStyle().sources).filter((id) => (pattern.endsWith('-') ? id.startsWith(pattern) : id === pattern));
    return ids.length > 0 && ids.every((id) => {
      const source = map.getSource(id);
      if (source && source.type === 'vector') {
        const layer = map.getStyle().layers.find((l) => l.source === id);
        return map.querySourceFeatures(id, { sourceLayer: layer && layer['source-layer'] }).length > 0;
      }
      const data = source && source.serialize ? source.serialize().data : undefined;
      return !!data && Array.isArray(data.features) && data.features.length > 0;
    });
  });
  let published;
  Object.defineProperty(window, '__gullylineMap', {
    configurable: true,
    get: () => published,
    set: (map) => {
      published = map;
      if (!map || marks.publishedMs !== null) return;
      marks.publishedMs = performance.now();
      const onIdle = () => {
        const now = performance.now();
        marks.idleCount += 1;
        if (marks.firstIdleMs === null) marks.firstIdleMs = now;
        if (hasFeatures(map)) {
          marks.readyIdleMs = now;
          map.off('idle', onIdle);
        }
      };
      map.on('idle', onIdle);
      // Already idle when published (the first fit needed no camera move): no idle event follows.
      if (map.loaded()) onIdle();
    },
  });
})();`;

/** CPU seconds used so far by each live process under `rootPid` (Linux /proc; empty elsewhere), by pid. */
function cpuByProcess(rootPid: number): Map<number, { parent: number; cpuS: number }> {
  const all = new Map<number, { parent: number; cpuS: number }>();
  if (!existsSync('/proc/self/stat')) return all;
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      // Fields after the command name: state ppid … utime stime cutime cstime (clock ticks of 1/100 s).
      const stat = readFileSync(`/proc/${entry}/stat`, 'utf8');
      const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      const ticks = Number(fields[11]) + Number(fields[12]) + Number(fields[13]) + Number(fields[14]);
      all.set(Number(entry), { parent: Number(fields[1]), cpuS: ticks / 100 });
    } catch {
      // the process ended meanwhile
    }
  }
  const under = new Map<number, { parent: number; cpuS: number }>();
  const isUnder = (pid: number): boolean => pid === rootPid || (all.has(pid) && pid !== 1 && isUnder(all.get(pid)!.parent));
  for (const [pid, info] of all) if (isUnder(pid)) under.set(pid, info);
  return under;
}

/** CPU seconds of the server's processes and of the browser's (everything else under this process but itself). */
function cpuSplit(serverPid: number): { serverS: number; browserS: number } {
  let [serverS, browserS] = [0, 0];
  const server = cpuByProcess(serverPid);
  for (const [pid, info] of cpuByProcess(process.pid)) {
    if (pid === process.pid) continue;
    if (server.has(pid)) serverS += info.cpuS;
    else browserS += info.cpuS;
  }
  return { serverS, browserS };
}


function startServer(dataDir: string): Promise<{ server: ChildProcess; baseUrl: string; output: () => string }> {
  return spawnBuiltServer({ dataDir, env: { AUTH_SECRET } });
}

/** A new tab with the HTTP cache off, so every load downloads everything, as a first visit does. */
async function uncachedPage(context: BrowserContext): Promise<Page> {
  const page = await context.newPage();
  const cdp = await context.newCDPSession(page);
  await cdp.send('Network.enable');
  await cdp.send('Network.setCacheDisabled', { cacheDisabled: true });
  return page;
}

/** Records the same-origin JavaScript a page downloads (any script response, module preloads included). */
function recordScripts(page: Page, origin: string): () => Promise<ShippedScript[]> {
  const pending: Promise<ShippedScript | null>[] = [];
  page.on('response', (response) => {
    // A blob: script (MapLibre's worker, made from code inside its chunk) is not downloaded.
    if (!/^https?:/.test(response.url())) return;
    const url = new URL(response.url());
    const isScript = response.request().resourceType() === 'script' || /javascript/.test(response.headers()['content-type'] ?? '');
    if (url.origin !== origin || !isScript) return;
    pending.push(response.body().then((body) => compressed(url.pathname, body), () => null));
  });
  return async () => {
    const scripts = (await Promise.all(pending)).filter((s): s is ShippedScript => s !== null);
    // Scripts written into the page itself (Astro's island loader, small hoisted scripts).
    const inline = await page.$$eval('script:not([src])', (nodes) =>
      (nodes as HTMLScriptElement[]).filter((node) => !node.type || /module|javascript/.test(node.type)).map((node) => node.textContent ?? ''),
    );
    const inlineText = inline.join('\n');
    if (inlineText.trim()) scripts.push(compressed(`(${inline.length} inline <script> in the HTML)`, Buffer.from(inlineText)));
    return scripts;
  };
}

function compressed(name: string, body: Buffer): ShippedScript {
  return {
    name,
    rawBytes: body.byteLength,
    gzipBytes: gzipSync(body, { level: 9 }).byteLength,
    brotliBytes: brotliCompressSync(body, { params: { [zlibConstants.BROTLI_PARAM_QUALITY]: 11, [zlibConstants.BROTLI_PARAM_SIZE_HINT]: body.byteLength } }).byteLength,
    // MapLibre's chunk by its name, or by the banner it carries into the bundle.
    maplibre: /maplibre/i.test(name) || body.subarray(0, 4096).toString('latin1').includes('MapLibre GL JS'),
  };
}

/** Requests MapLibre's workers make (drainage tiles, contours): absent from the page's own resource timings. */
const WORKER_FETCHED = /\/drainage\/\d+\/\d+\/\d+$|\/contours\.geojson$/;

async function loadWorkspace(page: Page, url: string): Promise<LoadResult> {
  const fromWorkers: Promise<{ url: string; startEpochMs: number; ttfbMs: number; durationMs: number; bytes: number }>[] = [];
  page.on('requestfinished', (request) => {
    if (!WORKER_FETCHED.test(new URL(request.url()).pathname)) return;
    const timing = request.timing();
    fromWorkers.push(
      request
        .response()
        .then((response) => response?.body().then((body) => body.byteLength, () => 0) ?? 0)
        .then((bytes) => ({ url: request.url(), startEpochMs: timing.startTime, ttfbMs: timing.responseStart, durationMs: timing.responseEnd, bytes })),
    );
  });
  await page.goto(url, { waitUntil: 'commit' });
  await page.waitForFunction(() => (window as unknown as { __benchMarks?: Marks }).__benchMarks?.readyIdleMs != null, undefined, { timeout: 120_000, polling: 500 });
  const timeOrigin = await page.evaluate(() => performance.timeOrigin);
  const workerResources: ResourceTiming[] = (await Promise.all(fromWorkers)).map((r) => {
    const startMs = r.startEpochMs - timeOrigin;
    return { name: new URL(r.url).pathname, type: 'worker', startMs, ttfbMs: r.ttfbMs, endMs: startMs + r.durationMs, bytes: r.bytes };
  });
  const load = await page.evaluate((sourceIds) => {
    const marks = (window as unknown as { __benchMarks: Marks }).__benchMarks;
    const [navigation] = performance.getEntriesByType('navigation') as PerformanceNavigationTiming[];
    const resources = (performance.getEntriesByType('resource') as PerformanceResourceTiming[]).map((entry) => ({
      name: new URL(entry.name).pathname + new URL(entry.name).search,
      type: entry.initiatorType,
      startMs: entry.startTime,
      ttfbMs: entry.responseStart - entry.startTime,
      endMs: entry.responseEnd,
      bytes: entry.decodedBodySize,
    }));
    type BenchMap = {
      querySourceFeatures(id: string, options?: { sourceLayer?: string }): { id?: string | number }[];
      getStyle(): { sources: Record<string, { type: string }>; layers: { source?: string; 'source-layer'?: string }[] };
    };
    const map = (window as unknown as { __gullylineMap: BenchMap }).__gullylineMap;
    const style = map.getStyle();
    const gl = document.createElement('canvas').getContext('webgl2');
    const glInfo = gl?.getExtension('WEBGL_debug_renderer_info');
    // Distinct features drawn in the loaded tiles (a line crossing tiles comes back once per tile).
    // (Inline arrows only: a named function here would carry tsx's helpers, which the page lacks.)
    const drawn = Object.fromEntries(
      sourceIds.map((pattern) => [
        pattern,
        new Set(
          Object.keys(style.sources)
            .filter((id) => (pattern.endsWith('-') ? id.startsWith(pattern) : id === pattern))
            .flatMap((id) => map.querySourceFeatures(id, { sourceLayer: style.layers.find((layer) => layer.source === id)?.['source-layer'] }).map((f) => `${id}:${f.id}`)),
        ).size,
      ]),
    );
    return {
      readyIdleMs: marks.readyIdleMs!,
      marks,
      navigation: navigation
        ? { responseEndMs: navigation.responseEnd, domContentLoadedMs: navigation.domContentLoadedEventEnd }
        : { responseEndMs: NaN, domContentLoadedMs: NaN },
      resources,
      drawn,
      panelRows: { fences: document.querySelectorAll('[data-testid="fence-row"]').length, crossings: document.querySelectorAll('[data-testid="crossing-row"]').length },
      webgl: String(gl ? gl.getParameter(glInfo ? glInfo.UNMASKED_RENDERER_WEBGL : gl.RENDERER) : 'no WebGL 2'),
    };
  }, PLAN_SOURCES);
  return { ...load, resources: [...load.resources, ...workerResources] };
}

const s = (ms: number): string => `${(ms / 1000).toFixed(2)} s`;
const kb = (bytes: number): string => `${(bytes / KB).toFixed(1)} KB`;
const verdict = (ok: boolean): string => (ok ? 'PASS' : 'MISSED');

function printLoad(label: string, load: LoadResult, cpu: { serverS: number; browserS: number; wallS: number }): void {
  const { marks, navigation } = load;
  console.log(
    `${label}: first idle with the plan drawn ${s(load.readyIdleMs)} ` +
      `(HTML ${s(navigation.responseEndMs)}, DOMContentLoaded ${s(navigation.domContentLoadedMs)}, ` +
      `map loaded and fitted ${s(marks.publishedMs ?? NaN)}, its first idle ${s(marks.firstIdleMs ?? NaN)}, ${marks.idleCount} idle event(s); ` +
      `CPU over the ${cpu.wallS.toFixed(1)} s load: server ${cpu.serverS.toFixed(1)} s, browser ${cpu.browserS.toFixed(1)} s)`,
  );
}

function printWhereTimeWent(load: LoadResult): void {
  console.log('\nwhere the time went (median load; ms since navigation start; TTFB = request start to first byte; * fetched by a MapLibre worker):');
  console.log(`  ${'request'.padEnd(58)} ${'start'.padStart(7)} ${'TTFB'.padStart(7)} ${'end'.padStart(7)} ${'body'.padStart(11)}`);
  for (const r of [...load.resources].sort((a, b) => a.startMs - b.startMs)) {
    if (r.startMs > load.readyIdleMs) continue;
    const shown = r.type === 'worker' ? `* ${r.name}` : r.name;
    const name = shown.length > 58 ? `…${shown.slice(-57)}` : shown;
    console.log(`  ${name.padEnd(58)} ${r.startMs.toFixed(0).padStart(7)} ${r.ttfbMs.toFixed(0).padStart(7)} ${r.endMs.toFixed(0).padStart(7)} ${kb(r.bytes).padStart(11)}`);
  }
  const before = load.marks.longTasks.filter((task) => task.startMs < load.readyIdleMs);
  const total = before.reduce((sum, task) => sum + task.durationMs, 0);
  console.log(`  long tasks on the main thread before the idle: ${before.length}, ${total.toFixed(0)} ms in all; longest:`);
  for (const task of [...before].sort((a, b) => b.durationMs - a.durationMs).slice(0, 6)) {
    console.log(`    ${task.durationMs.toFixed(0).padStart(6)} ms from ${task.startMs.toFixed(0)} ms`);
  }
}

function printScripts(title: string, scripts: ShippedScript[]): void {
  console.log(`\n${title}`);
  console.log(`  ${'file'.padEnd(64)} ${'raw'.padStart(10)} ${'gzip -9'.padStart(10)} ${'brotli 11'.padStart(10)}`);
  for (const script of [...scripts].sort((a, b) => b.gzipBytes - a.gzipBytes)) {
    const name = `${script.name}${script.maplibre ? ' [MapLibre]' : ''}`;
    console.log(`  ${name.padEnd(64)} ${kb(script.rawBytes).padStart(10)} ${kb(script.gzipBytes).padStart(10)} ${kb(script.brotliBytes).padStart(10)}`);
  }
}

/** Each API request of the load again, one at a time from here: the server's time alone, and its answer's size. */
async function probeApi(origin: string, context: BrowserContext, load: LoadResult): Promise<void> {
  const cookie = (await context.cookies(origin)).map((c) => `${c.name}=${c.value}`).join('; ');
  const paths = [...new Set(load.resources.filter((r) => r.name.startsWith('/api/')).map((r) => r.name))];
  console.log('\nthe same API requests one at a time, nothing else running in the server:');
  console.log(`  ${'request'.padEnd(58)} ${'time'.padStart(8)} ${'body'.padStart(11)} ${'gzip -6'.padStart(10)} fetched in the load`);
  for (const apiPath of paths) {
    const started = performance.now();
    const response = await fetch(`${origin}${apiPath}`, { headers: { cookie } });
    const body = Buffer.from(await response.arrayBuffer());
    const ms = performance.now() - started;
    const times = load.resources.filter((r) => r.name === apiPath).length;
    const name = apiPath.length > 58 ? `…${apiPath.slice(-57)}` : apiPath;
    console.log(`  ${name.padEnd(58)} ${`${ms.toFixed(0)} ms`.padStart(8)} ${kb(body.byteLength).padStart(11)} ${kb(gzipSync(body).byteLength).padStart(10)} ${times}×${response.ok ? '' : ` (HTTP ${response.status})`}`);
  }
}

type TraceEvent = { ph: string; name: string; pid: number; tid: number; ts: number; dur?: number; args?: { name?: string } };

/**
 * One more load under Chromium's tracing: for each busy thread (the page's main thread, the GPU
 * process's, MapLibre's workers…) its busy time and the events it spent it in, by self time.
 */
async function traceLoad(browser: Browser, context: BrowserContext, url: string): Promise<void> {
  const page = await uncachedPage(context);
  await browser.startTracing(page, { categories: ['devtools.timeline', 'disabled-by-default-devtools.timeline', 'v8.execute', 'toplevel'] });
  const load = await loadWorkspace(page, url);
  const { traceEvents } = JSON.parse((await browser.stopTracing()).toString()) as { traceEvents: TraceEvent[] };
  await page.close();
  const threadNames = new Map<string, string>();
  const byThread = new Map<string, TraceEvent[]>();
  for (const event of traceEvents) {
    const key = `${event.pid}:${event.tid}`;
    if (event.ph === 'M' && event.name === 'thread_name') threadNames.set(key, event.args?.name ?? key);
    if (event.ph !== 'X' || typeof event.dur !== 'number') continue;
    const events = byThread.get(key) ?? [];
    events.push(event);
    byThread.set(key, events);
  }
  const threads = [...byThread].map(([key, events]) => {
    // Self time: an event's duration less its children's (events nest on a thread).
    events.sort((a, b) => a.ts - b.ts || b.dur! - a.dur!);
    const self = new Map<string, number>();
    const stack: TraceEvent[] = [];
    let busyUs = 0;
    for (const event of events) {
      while (stack.length && stack.at(-1)!.ts + stack.at(-1)!.dur! <= event.ts) stack.pop();
      const parent = stack.at(-1);
      if (parent) self.set(parent.name, (self.get(parent.name) ?? 0) - event.dur!);
      else busyUs += event.dur!;
      self.set(event.name, (self.get(event.name) ?? 0) + event.dur!);
      stack.push(event);
    }
    return { name: threadNames.get(key) ?? key, busyMs: busyUs / 1000, self };
  });
  threads.sort((a, b) => b.busyMs - a.busyMs);
  console.log(`\ntraced load (first idle ${s(load.readyIdleMs)}): busiest threads, and their time by event (self time)`);
  for (const thread of threads.slice(0, 6)) {
    const top = [...thread.self].sort((a, b) => b[1] - a[1]).slice(0, 4);
    console.log(`  ${thread.name.padEnd(28)} ${`${thread.busyMs.toFixed(0)} ms`.padStart(9)}  ${top.map(([name, us]) => `${name} ${(us / 1000).toFixed(0)}`).join(', ')}`);
  }
}

const sum = (scripts: ShippedScript[], key: 'rawBytes' | 'gzipBytes' | 'brotliBytes'): number => scripts.reduce((total, script) => total + script[key], 0);
const totals = (scripts: ShippedScript[]): string => `${kb(sum(scripts, 'gzipBytes'))} gzip, ${kb(sum(scripts, 'brotliBytes'))} brotli, ${kb(sum(scripts, 'rawBytes'))} raw`;

async function main(): Promise<void> {
  if (!existsSync(BUILT_SERVER)) {
    console.error(`${BUILT_SERVER} is missing: run "npm run build" first (bench:map measures the built app).`);
    process.exitCode = 1;
    return;
  }
  const keep = Boolean(process.env.KEEP_BENCH_DATA);
  const dataDir = mkdtempSync(path.join(tmpdir(), 'gullyline-bench-map-'));
  // The app's server modules read the configuration on first use: point them at the new folder first.
  Object.assign(process.env, { DATA_DIR: dataDir, DATABASE_URL: '', AUTH_SECRET });
  let server: Awaited<ReturnType<typeof startServer>> | undefined;
  let browser: Browser | undefined;
  try {
    const seedStarted = performance.now();
    const seeded = await seedBenchProperty(seed);
    await seeded.close();
    const c = seeded.counts;
    console.log(
      `generated (seed ${seed}): ${c.fenceLines} fence lines (${c.fenceKm.toFixed(0)} km, ${c.fenceVertices} vertices), ` +
        `${c.drainageSegments} drainage segments (${c.drainageVertices} vertices), ${c.crossings} crossings ` +
        `(${Object.entries(seeded.designStatuses).map(([status, n]) => `${n} ${status}`).join(', ')}), ` +
        `a ${BENCH_PROPERTY.sizeM / 1000} km square at ${BENCH_PROPERTY.centreWgs84.join(', ')}; stored in ${s(performance.now() - seedStarted)}`,
    );

    const serverStarted = performance.now();
    server = await startServer(dataDir);
    console.log(`server: ${server.baseUrl} (built app, NODE_ENV=production), answering in ${s(performance.now() - serverStarted)}`);
    const origin = server.baseUrl;
    const workspaceUrl = `${origin}/app/properties/${seeded.propertyId}`;

    browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
    const viewport = { width: 1280, height: 800 };

    // The landing page, signed out, as a first visit.
    const landingContext = await browser.newContext({ viewport });
    const landingPage = await uncachedPage(landingContext);
    const landingScripts = recordScripts(landingPage, origin);
    await landingPage.goto(`${origin}/`, { waitUntil: 'networkidle' });
    const landing = await landingScripts();
    await landingContext.close();

    // The workspace, signed in through the sign-in page.
    const context = await browser.newContext({ viewport });
    await context.addInitScript({ content: INSTRUMENT_PAGE });
    const signIn = await context.newPage();
    await signIn.goto(`${origin}/sign-in`);
    await signIn.getByLabel('E-mail').fill(BENCH_PROPERTY.ownerEmail);
    await signIn.getByLabel('Password').fill(BENCH_PROPERTY.ownerPassword);
    await signIn.getByRole('button', { name: 'Sign in' }).click();
    await signIn.waitForURL('**/app');
    await signIn.close();

    console.log(
      `\nfirst idle = ms from navigation start (performance.timeOrigin) to the first MapLibre "idle" event at which the sources ` +
        `${PLAN_SOURCES.join(', ')} all hold features: everything fetched, parsed, tiled and drawn (hillshade and contours too). ` +
        `Each load is a new tab with the HTTP cache disabled (every script and API answer downloaded, as a first visit), ` +
        `signed in, viewport ${viewport.width}×${viewport.height}. Load average before: ${loadavg().map((n) => n.toFixed(1)).join(' ')} (${availableParallelism()} cores).`,
    );
    const loads: LoadResult[] = [];
    let workspace: ShippedScript[] = [];
    const serverPid = server.server.pid!;
    for (let run = 1; run <= RUNS; run++) {
      const page = await uncachedPage(context);
      const scripts = run === 1 ? recordScripts(page, origin) : null;
      const [cpuBefore, wallBefore] = [cpuSplit(serverPid), performance.now()];
      const load = await loadWorkspace(page, workspaceUrl);
      const cpuAfter = cpuSplit(serverPid);
      const cpu = { serverS: cpuAfter.serverS - cpuBefore.serverS, browserS: cpuAfter.browserS - cpuBefore.browserS, wallS: (performance.now() - wallBefore) / 1000 };
      if (scripts) {
        await page.waitForLoadState('networkidle');
        workspace = await scripts();
      }
      printLoad(`run ${run}`, load, cpu);
      if (run === 1) {
        console.log(
          `  drawn: ${Object.entries(load.drawn).map(([id, n]) => `${id} ${n} features`).join(', ')}; ` +
            `side panel: ${load.panelRows.fences} fence rows, ${load.panelRows.crossings} crossing rows; WebGL: ${load.webgl}`,
        );
      }
      loads.push(load);
      await page.close();
    }
    const byTime = [...loads].sort((a, b) => a.readyIdleMs - b.readyIdleMs);
    const median = byTime[Math.floor(byTime.length / 2)]!;
    console.log(`median first idle: ${s(median.readyIdleMs)} — target under ${s(TARGETS.firstIdleMs)}: ${verdict(median.readyIdleMs < TARGETS.firstIdleMs)}`);
    console.log(`load average after: ${loadavg().map((n) => n.toFixed(1)).join(' ')}`);
    printWhereTimeWent(median);
    await probeApi(origin, context, median);
    if (process.env.BENCH_TRACE) await traceLoad(browser, context, workspaceUrl);

    const mapLibre = workspace.filter((script) => script.maplibre);
    const own = workspace.filter((script) => !script.maplibre);
    printScripts(`JavaScript shipped, landing page / (signed out): ${totals(landing)}`, landing);
    printScripts(`JavaScript shipped, workspace page /app/properties/:id (until the first idle and the network is quiet): ${totals(workspace)}`, workspace);
    console.log(`  of which MapLibre: ${totals(mapLibre)}; the workspace's own code: ${totals(own)}`);

    const landingGzip = sum(landing, 'gzipBytes');
    const ownGzip = sum(own, 'gzipBytes');
    console.log('\ntargets:');
    const target = (label: string, value: string, limit: string, ok: boolean) => console.log(`  ${label.padEnd(32)} ${value.padStart(10)}  < ${limit.padEnd(9)} ${verdict(ok)}`);
    target(`first idle (median of ${RUNS})`, s(median.readyIdleMs), s(TARGETS.firstIdleMs), median.readyIdleMs < TARGETS.firstIdleMs);
    target('landing page JavaScript (gzip)', kb(landingGzip), kb(TARGETS.landingJsBytes), landingGzip < TARGETS.landingJsBytes);
    target('workspace own JavaScript (gzip)', kb(ownGzip), kb(TARGETS.workspaceOwnJsBytes), ownGzip < TARGETS.workspaceOwnJsBytes);
  } finally {
    await browser?.close();
    if (server) {
      const { server: child, output } = server;
      if (child.exitCode === null) {
        child.kill('SIGTERM');
        await new Promise((resolve) => child.once('exit', resolve));
      }
      if (keep) writeFileSync(path.join(dataDir, 'server.log'), output());
    }
    if (keep) console.log(`\nData kept in ${dataDir} (server log in server.log).`);
    else rmSync(dataDir, { recursive: true, force: true });
  }
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? (error.stack ?? error.message) : error);
  process.exitCode = 1;
});
