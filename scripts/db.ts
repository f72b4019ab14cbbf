// Database commands: `tsx scripts/db.ts migrate | rollback | seed`.
// Runs the same migrations the server bundles, loaded here from the migrations folder.
import { readdirSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { closeDb, db } from '../src/lib/server/db';
import { getConfig } from '../src/lib/server/config';
import { migrationSource } from '../src/lib/server/migration-source';
import { seedDemo } from './seed-demo';

async function folderMigrations() {
  const dir = path.resolve('migrations');
  const files = readdirSync(dir).filter((file) => /^\d+_.+\.ts$/.test(file));
  const modules = await Promise.all(files.map(async (file) => [file, await import(pathToFileURL(path.join(dir, file)).href)] as const));
  return migrationSource(Object.fromEntries(modules));
}

async function main(command: string | undefined): Promise<void> {
  const migrationSourceFromFolder = await folderMigrations();
  const where = getConfig().databaseFile;
  switch (command) {
    case 'migrate': {
      const [, applied] = await db().migrate.latest({ migrationSource: migrationSourceFromFolder });
      console.log(applied.length ? `Applied ${applied.length} migration(s) to ${where}:\n  ${applied.join('\n  ')}` : `Database ${where} is up to date.`);
      break;
    }
    case 'rollback': {
      const [, undone] = await db().migrate.rollback({ migrationSource: migrationSourceFromFolder });
      console.log(undone.length ? `Rolled back ${undone.length} migration(s):\n  ${undone.join('\n  ')}` : 'Nothing to roll back.');
      break;
    }
    case 'seed': {
      await db().migrate.latest({ migrationSource: migrationSourceFromFolder });
      await seedDemo();
      break;
    }
    default:
      console.error('Usage: tsx scripts/db.ts migrate | rollback | seed');
      process.exitCode = 2;
  }
}

main(process.argv[2])
  .catch((error: unknown) => {
    console.error(error instanceof Error ? error.message : error);
    process.exitCode = 1;
  })
  .finally(() => closeDb());
