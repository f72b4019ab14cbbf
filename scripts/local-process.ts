import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { createServer } from 'node:net';

/** A TCP port free on loopback right now, for a server started by a test or a benchmark. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      probe.close(() => (typeof address === 'object' && address ? resolve(address.port) : reject(new Error('no port'))));
    });
  });
}

/**
 * Flags for Debian's Chromium in a closed network (STACK.md): no background calls home, WebGL 2
 * through SwiftShader so MapLibre renders without a GPU. Shared by the browser tests and bench:map.
 */
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--use-angle=swiftshader',
  '--enable-unsafe-swiftshader',
];

/** The built app's server entry (`npm run build`). */
export const BUILT_SERVER = 'dist/server/serve.mjs';

/**
 * Starts the built server in production mode on a free loopback port over a data folder, with
 * `env` added to or overriding its settings, and waits until `/api/health` answers. Shared by the
 * API and browser tests and the benchmarks. `output()` is what it printed (the last megabyte).
 * @throws Error with that output when it exits or does not answer within 30 s
 */
export async function spawnBuiltServer(options: { dataDir: string; env?: Record<string, string>; nodeArgs?: string[] }): Promise<{ server: ChildProcess; baseUrl: string; output: () => string }> {
  if (!existsSync(BUILT_SERVER)) throw new Error(`${BUILT_SERVER} is missing: run "npm run build" first.`);
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const server = spawn(process.execPath, [...(options.nodeArgs ?? []), BUILT_SERVER], {
    env: { ...process.env, NODE_ENV: 'production', HOST: '127.0.0.1', PORT: String(port), DATA_DIR: options.dataDir, DATABASE_URL: '', ...options.env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  const keep = (chunk: Buffer) => (output = (output + chunk.toString()).slice(-1_000_000));
  server.stdout?.on('data', keep);
  server.stderr?.on('data', keep);
  const deadline = Date.now() + 30_000;
  for (;;) {
    try {
      if ((await fetch(`${baseUrl}/api/health`)).ok) return { server, baseUrl, output: () => output };
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
