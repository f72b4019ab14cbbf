// Bundles the worker threads (terrain runs, crossing analysis) beside the built server
// (dist/workers/), since Astro's build only bundles what pages and endpoints import, and the HTTP
// server that fronts Astro's handler (dist/server/serve.mjs). npm packages stay external, loaded
// from node_modules.
import { build } from 'esbuild';

/** @type {import('esbuild').BuildOptions} */
const nodeModule = { bundle: true, platform: 'node', format: 'esm', target: 'node20', packages: 'external', sourcemap: true, logLevel: 'warning' };

await build({
  ...nodeModule,
  entryPoints: ['src/lib/server/jobs/terrain-worker.ts', 'src/lib/server/jobs/analysis-worker.ts'],
  outdir: 'dist/workers',
  outExtension: { '.js': '.mjs' },
});
console.log('Built dist/workers/terrain-worker.mjs and analysis-worker.mjs');

// The HTTP server in front of Astro's handler (src/serve.ts); it loads ./entry.mjs at run time.
await build({ ...nodeModule, entryPoints: ['src/serve.ts'], outfile: 'dist/server/serve.mjs' });
console.log('Built dist/server/serve.mjs');
