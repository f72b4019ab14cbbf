// The whole test suite, as the README's test command and CI run it:
// system tools (Chromium, GDAL) → type check and lint → build → unit, API and browser tests.
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';

const SYSTEM_TOOLS = [
  { binary: '/usr/bin/chromium', debianPackage: 'chromium', why: 'browser tests' },
  { binary: '/usr/bin/gdalinfo', debianPackage: 'gdal-bin', why: 'reference raster values (GDAL)' },
];

function step(title, command, args) {
  console.log(`\n▶ ${title}`);
  const result = spawnSync(command, args, { stdio: 'inherit' });
  if (result.status !== 0) {
    console.error(`\n✖ ${title} failed.`);
    process.exit(result.status ?? 1);
  }
}

function ensureSystemTools() {
  const missing = SYSTEM_TOOLS.filter((tool) => !existsSync(tool.binary));
  if (missing.length === 0) return;
  const packages = missing.map((tool) => tool.debianPackage);
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  if (!isRoot) {
    console.error(`Missing for the tests: ${missing.map((t) => `${t.binary} (${t.why})`).join(', ')}.`);
    console.error(`Install them with: sudo apt-get update && sudo apt-get install -y ${packages.join(' ')}`);
    process.exit(1);
  }
  console.log(`▶ Installing ${packages.join(', ')} from Debian's packages`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  execFileSync('apt-get', ['update'], { stdio: 'inherit', env });
  execFileSync('apt-get', ['install', '-y', '--no-install-recommends', ...packages], { stdio: 'inherit', env });
}

ensureSystemTools();
step('Type check (astro check)', 'npx', ['astro', 'check']);
step('Lint (eslint)', 'npx', ['eslint', '.']);
step('Build', 'npm', ['run', 'build']);
step('Unit tests', 'npx', ['vitest', 'run', '--project', 'unit']);
step('API tests (built server, real SQLite)', 'npx', ['vitest', 'run', '--project', 'api']);
step('Browser tests (Chromium)', 'npx', ['vitest', 'run', '--project', 'e2e']);
console.log('\n✔ All tests passed.');
