import { existsSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';

/**
 * Starts one of our worker threads (`src/lib/server/jobs/<name>.ts`): the bundle beside the built
 * server (dist/workers/, made by scripts/build-worker.mjs) in production, else the TypeScript
 * source through tsx's loader (vitest, `astro dev`, scripts).
 */
export function startWorker(name: 'terrain-worker' | 'analysis-worker', data?: unknown): Worker {
  // Never undefined: geotiff's `web-worker` dependency reads `workerData.mod` in any worker thread.
  const workerData = data ?? {};
  const built = path.resolve(path.dirname(process.argv[1] ?? '.'), `../workers/${name}.mjs`);
  if (import.meta.env?.PROD && existsSync(built)) return new Worker(built, { workerData });
  const source = pathToFileURL(path.resolve(`src/lib/server/jobs/${name}.ts`)).href;
  const bootstrap = `import('tsx/esm/api').then(({ register }) => { register(); return import(${JSON.stringify(source)}); });`;
  return new Worker(bootstrap, { eval: true, workerData });
}
