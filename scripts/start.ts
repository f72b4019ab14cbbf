// Starts the built app: migrates the database, optionally loads the demo property, starts the
// local e-mail catcher when no SMTP server is configured, then runs the server and says where it is.
//   tsx scripts/start.ts [--demo]
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { getConfig } from '../src/lib/server/config';
import { startMailCatcher } from '../src/lib/server/mail-catcher';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from './demo-accounts';
import { BUILT_SERVER } from './local-process';


async function run(command: string, args: string[]): Promise<void> {
  await new Promise<void>((resolve, reject) => {
    const child = spawn(command, args, { stdio: 'inherit' });
    child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`${command} ${args.join(' ')} exited with ${code}`))));
  });
}

async function waitForHealth(url: string, timeoutMs: number): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    try {
      if ((await fetch(`${url}/api/health`)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
  throw new Error(`The server did not answer at ${url} within ${timeoutMs / 1000} s.`);
}

async function main(): Promise<void> {
  if (!existsSync(BUILT_SERVER)) throw new Error(`${BUILT_SERVER} is missing: run "npm run build" first.`);
  const config = getConfig();
  await run(process.execPath, ['--import', 'tsx', 'scripts/db.ts', process.argv.includes('--demo') ? 'seed' : 'migrate']);
  const env: NodeJS.ProcessEnv = { ...process.env, HOST: process.env.HOST ?? '127.0.0.1', PORT: process.env.PORT ?? '4321' };
  if (!config.smtpUrl) {
    const catcher = await startMailCatcher({ dataDir: config.dataDir });
    env.SMTP_URL = catcher.url;
    console.log(`Local e-mail catcher on ${catcher.url}: messages are kept in ${catcher.folder}`);
  }
  const server = spawn(process.execPath, [BUILT_SERVER], { stdio: 'inherit', env });
  for (const signal of ['SIGINT', 'SIGTERM'] as const) process.on(signal, () => server.kill(signal));
  server.on('exit', (code) => process.exit(code ?? 0));
  const url = config.publicUrl ?? `http://${env.HOST === '0.0.0.0' ? 'localhost' : env.HOST}:${env.PORT}`;
  await waitForHealth(url, 30_000);
  console.log(`\nGullyline is running at ${url}`);
  if (process.argv.includes('--demo')) {
    console.log(`\nDemo sign-ins (invented people of the invented property Saltbush Rise), password "${DEMO_PASSWORD}":`);
    for (const account of DEMO_ACCOUNTS) console.log(`  ${account.role.padEnd(8)} ${account.email}`);
  }
  console.log('\nPress Ctrl+C to stop.');
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
