import type { ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { startMailCatcher } from '../../src/lib/server/mail-catcher';
import { spawnBuiltServer } from '../../scripts/local-process';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    dataDir: string;
  }
}

/**
 * Starts the built server (production mode) on a free loopback port over a data folder, and
 * waits until it answers. `extraEnv` adds or overrides settings.
 */
export async function startBuiltServer(dataDir: string, extraEnv: Record<string, string> = {}): Promise<{ server: ChildProcess; baseUrl: string; output: () => string; stop: () => Promise<void> }> {
  // The server's e-mail goes to a local catcher that keeps each message in DATA_DIR/mail.
  const catcher = await startMailCatcher({ dataDir });
  const env = {
    AUTH_SECRET: 'test-secret-that-is-long-enough-for-authjs-0123456789',
    SIGN_IN_MAX_FAILURES_PER_IP: '200',
    // Above what any one test account makes in a minute; tests/api/limits.test.ts goes past it.
    EXPENSIVE_REQUESTS_PER_MINUTE: '60',
    SMTP_URL: catcher.url,
    ...extraEnv,
  };
  const { server, baseUrl, output } = await spawnBuiltServer({ dataDir, env }).catch(async (error: unknown) => {
    await catcher.close();
    throw error;
  });
  let stopping = false;
  // A server that dies while tests run (not killed by a test) takes its reason with it unless shown here.
  server.once('exit', (code, signal) => {
    if (!stopping && !server.killed) console.error(`\nThe test server on ${baseUrl} stopped unexpectedly (exit code ${code}, signal ${signal}). Its last output:\n${output().slice(-20_000)}`);
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
  return { server, baseUrl, output, stop };
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
