// Database commands: `tsx scripts/db.ts migrate | rollback | seed [--copies N] | backup [folder] | restore <backup> [--target <data folder>] [--force]`.
// Runs the same migrations the server bundles, loaded here from the migrations folder.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { BackupError, createBackup, restoreBackup } from '../src/lib/server/backup';
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

const USAGE = `Usage: tsx scripts/db.ts migrate | rollback | seed [--copies N]
       npm run db:backup [-- <backup folder>]
       npm run db:restore -- <backup folder> [--target <data folder>] [--force]`;

function formatMb(bytes: number): string {
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

async function backup(args: string[]): Promise<void> {
  const { dataDir, databaseFile } = getConfig();
  const appVersion = (JSON.parse(readFileSync('package.json', 'utf8')) as { version: string }).version;
  const { folder, manifest } = await createBackup({ dataDir, databaseFile, appVersion, target: args[0] });
  console.log(`Backed up ${databaseFile} (${formatMb(manifest.database.bytes)}, ${manifest.migrations.length} migrations) and ${manifest.fileCount} file(s) (${formatMb(manifest.fileBytes)}) to\n  ${folder}`);
}

async function restore(args: string[], migrationSource: Awaited<ReturnType<typeof folderMigrations>>): Promise<void> {
  const force = args.includes('--force');
  const targetAt = args.indexOf('--target');
  const target = targetAt >= 0 ? args[targetAt + 1] : undefined;
  if (targetAt >= 0 && (!target || target.startsWith('--'))) throw new BackupError('Give the data folder after --target.');
  const positional = args.filter((arg, index) => !arg.startsWith('--') && !(targetAt >= 0 && index === targetAt + 1));
  const unknown = args.filter((arg) => arg.startsWith('--') && arg !== '--force' && arg !== '--target');
  if (unknown.length) throw new BackupError(`Unknown option ${unknown[0]}.\n${USAGE}`);
  if (positional.length !== 1) throw new BackupError(`Give one backup folder to restore.\n${USAGE}`);
  const backupDir = positional[0]!;
  const config = getConfig();
  const dataDir = path.resolve(target ?? config.dataDir);
  const databaseFile = dataDir === config.dataDir ? config.databaseFile : undefined;
  const { manifest, appliedMigrations } = await restoreBackup({ backupDir, dataDir, databaseFile, force, migrationSource });
  console.log(`Restored the backup of ${manifest.createdAt} (Gullyline ${manifest.appVersion}, ${manifest.fileCount} file(s)) into ${dataDir}.`);
  console.log('Integrity check: ok.');
  console.log(appliedMigrations.length ? `Applied ${appliedMigrations.length} pending migration(s):\n  ${appliedMigrations.join('\n  ')}` : 'No migrations were pending.');
}

async function main(command: string | undefined, args: string[]): Promise<void> {
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
      // --copies N: the demo property and N - 1 copies under numbered names (for bench:load).
      const copies = args[0] === '--copies' ? Number(args[1]) : 1;
      if (!Number.isInteger(copies) || copies < 1) throw new Error('--copies takes a whole number of 1 or more.');
      await seedDemo();
      for (let copy = 2; copy <= copies; copy += 1) await seedDemo(`Saltbush Rise (copy ${copy})`);
      break;
    }
    case 'backup':
      await backup(args);
      break;
    case 'restore':
      await restore(args, migrationSourceFromFolder);
      break;
    default:
      console.error(USAGE);
      process.exitCode = 2;
  }
}

main(process.argv[2], process.argv.slice(3))
  .catch((error: unknown) => {
    console.error(error instanceof Error ? error.message : error);
    process.exitCode = 1;
  })
  .finally(() => closeDb());
