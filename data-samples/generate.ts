/**
 * Generate the invented "Saltbush Rise" demo scenario into `data-samples/` (or `--out <dir>`):
 * elevation model (GeoTIFF), two GPS tracks (GPX), a planned subdivision (KML) and a manifest
 * (JSON). Deterministic: the same seed gives byte-identical files.
 *
 *   npm run demo:generate
 *   npx tsx data-samples/generate.ts --out /tmp/saltbush
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { buildDemoScenario } from './lib/build-scenario';
import { SCENARIO_SEED } from './lib/scenario-constants';

/**
 * Write every file of the demo scenario into a directory (created if missing).
 *
 * @param outDir - directory to write into
 * @param seed - the scenario seed (default: the fixed demo seed)
 * @returns the paths written, in a fixed order
 */
export function writeDemoScenario(outDir: string, seed: number = SCENARIO_SEED): string[] {
  mkdirSync(outDir, { recursive: true });
  return buildDemoScenario(seed).map((file) => {
    const path = join(outDir, file.name);
    writeFileSync(path, file.bytes);
    return path;
  });
}

function parseOutDir(argv: readonly string[]): string {
  const i = argv.indexOf('--out');
  if (i === -1) return dirname(fileURLToPath(import.meta.url));
  const value = argv[i + 1];
  if (!value) throw new Error('--out needs a directory');
  return resolve(value);
}

if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  for (const path of writeDemoScenario(parseOutDir(process.argv.slice(2)))) console.log(`wrote ${path}`);
}
