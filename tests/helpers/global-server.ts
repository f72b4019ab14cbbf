import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { startMailCatcher } from '../../src/lib/server/mail-catcher';
import { freePort } from '../../scripts/local-process';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    dataDir: string;
  }
}

const ENTRY = 'dist/server/serve.mjs';


/**
 * Starts the built server (production mode) on a free loopback port over a data folder, and
 * waits until it answers. `extraEnv` adds or overrides settings.
 */
export async function startBuiltServer(dataDir: string, extraEnv: Record<string, string> = {}): Promise<{ server: ChildProcess; baseUrl: string; output: () => string; stop: () => Promise<void> }> {
  if (!existsSync(ENTRY)) throw new Error(`${ENTRY} is missing: run "npm run build" before the API and browser tests.`);
  const port = await freePort();
  // The server's e-mail goes to a local catcher that keeps each message in DATA_DIR/mail.
  const catcher = await startMailCatcher({ dataDir });
  const baseUrl = `http://127.0.0.1:${port}`;
  const server: ChildProcess = spawn(process.execPath, [ENTRY], {
    env: {
      ...process.env,
      NODE_ENV: 'production',
      HOST: '127.0.0.1',
      PORT: String(port),
      DATA_DIR: dataDir,
      DATABASE_URL: '',
      AUTH_SECRET: 'test-secret-that-is-long-enough-for-authjs-0123456789',
      SIGN_IN_MAX_FAILURES_PER_IP: '200',
      // Above what any one test account makes in a minute; tests/api/limits.test.ts goes past it.
      EXPENSIVE_REQUESTS_PER_MINUTE: '60',
      SMTP_URL: catcher.url,
      ...extraEnv,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  server.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  server.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  let stopping = false;
  // A server that dies while tests run (not killed by a test) takes its reason with it unless shown here.
  server.once('exit', (code, signal) => {
    if (!stopping && !server.killed) console.error(`\nThe test server on ${baseUrl} stopped unexpectedly (exit code ${code}, signal ${signal}). Its last output:\n${output.slice(-20_000)}`);
  });
  const stop = async () => {
    stopping = true;
    // A server already gone (exited, or killed by a signal) has nothing left to stop.
    if (server.exitCode === null && server.signalCode === null) {
      server.kill('SIGTERM');
      await new Promise((resolve) => server.once('exit', resolve));
    }
    await catcher.close();
  };

  const deadline = Date.now() + 30_000;
  for (;;) {
    try {
      if ((await fetch(`${baseUrl}/api/health`)).ok) break;
    } catch {
      // not listening yet
    }
    if (server.exitCode !== null || Date.now() > deadline) {
      server.kill();
      await catcher.close();
      throw new Error(`The built server did not start:\n${output}`);
    }
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
  return { server, baseUrl, output: () => output, stop };
}

/**
 * Starts the built server once per suite, in production mode, with a fresh data folder (its own
 * SQLite file) so the tests exercise exactly what ships.
 */
export default async function setup(project: TestProject) {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'gullyline-test-'));
  const { baseUrl, output, stop } = await startBuiltServer(dataDir);
  project.provide('baseUrl', baseUrl);
  project.provide('dataDir', dataDir);

  return async () => {
    await stop();
    if (process.env.KEEP_TEST_DATA) console.log(`Test data kept in ${dataDir}\nServer output:\n${output()}`);
    else rmSync(dataDir, { recursive: true, force: true });
  };
}
