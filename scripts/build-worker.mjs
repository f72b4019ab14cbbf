// Bundles the terrain worker beside the built server (dist/workers/), since Astro's build only
// bundles what pages and endpoints import. npm packages stay external, loaded from node_modules.
import { build } from 'esbuild';

await build({
  entryPoints: ['src/lib/server/jobs/terrain-worker.ts'],
  outfile: 'dist/workers/terrain-worker.mjs',
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  packages: 'external',
  sourcemap: true,
  logLevel: 'warning',
});
console.log('Built dist/workers/terrain-worker.mjs');
