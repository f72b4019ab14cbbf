import { createHash } from 'node:crypto';
import { createReadStream, existsSync } from 'node:fs';
import { copyFile, mkdir, readdir, readFile, rename, rm, stat, writeFile } from 'node:fs/promises';
import path from 'node:path';
import Database from 'better-sqlite3';
import knex, { type Knex } from 'knex';
import { z } from 'zod';
import { sqliteSettings } from './db';

/** A backup or restore that cannot go ahead; the message says why and what to do. Nothing was changed. */
export class BackupError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'BackupError';
  }
}

export const MANIFEST_FILE = 'manifest.json';
export const DATABASE_COPY = 'gullyline.sqlite';
export const FILES_FOLDER = 'files';

const fileEntrySchema = z.object({ path: z.string().min(1), bytes: z.number().int().nonnegative(), sha256: z.string().regex(/^[0-9a-f]{64}$/) });

export const manifestSchema = z.object({
  format: z.literal(1),
  createdAt: z.string(),
  appVersion: z.string(),
  migrations: z.array(z.string()),
  database: fileEntrySchema,
  files: z.array(fileEntrySchema),
  fileCount: z.number().int().nonnegative(),
  fileBytes: z.number().int().nonnegative(),
});
export type BackupManifest = z.infer<typeof manifestSchema>;
export type BackupFileEntry = z.infer<typeof fileEntrySchema>;

/** A folder name for a backup taken at `at`, sortable and safe on every file system: `2026-12-02T10-15-30Z`. */
export function backupFolderName(at: Date): string {
  return at.toISOString().replace(/\.\d{3}Z$/, 'Z').replace(/:/g, '-');
}

/**
 * Whether a path inside the data folder (relative, `/`-separated) stays out of a backup: the
 * backups themselves, uploads still arriving, the database (copied through SQLite instead) and
 * the development sign-in secret.
 */
export function isExcludedFromBackup(relative: string, databaseNames: ReadonlySet<string>): boolean {
  const top = relative.split('/')[0]!;
  if (top === 'backups' || top === 'auth-secret') return true;
  if (relative === 'uploads/incoming' || relative.startsWith('uploads/incoming/')) return true;
  return databaseNames.has(relative);
}

/** A safe relative path from a manifest: no absolute paths, no `..`, nothing escaping the folder. */
export function isSafeRelativePath(relative: string): boolean {
  if (relative.startsWith('/') || relative.includes('\\') || relative.includes('\0')) return false;
  return relative.split('/').every((part) => part !== '' && part !== '.' && part !== '..');
}

export async function sha256OfFile(file: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(file)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

async function listDataFiles(root: string, databaseNames: ReadonlySet<string>, relative = ''): Promise<string[]> {
  const entries = await readdir(path.join(root, relative), { withFileTypes: true }).catch((error: NodeJS.ErrnoException) => {
    if (error.code === 'ENOENT') return [];
    throw error;
  });
  const found: string[] = [];
  for (const entry of entries.sort((a, b) => a.name.localeCompare(b.name))) {
    const child = relative ? `${relative}/${entry.name}` : entry.name;
    if (isExcludedFromBackup(child, databaseNames)) continue;
    if (entry.isDirectory()) found.push(...(await listDataFiles(root, databaseNames, child)));
    else if (entry.isFile()) found.push(child);
  }
  return found;
}

/** Names (relative to the data folder) of the database file and its companions, when it lives there. */
function databaseNamesIn(dataDir: string, databaseFile: string): Set<string> {
  const relative = path.relative(dataDir, databaseFile).split(path.sep).join('/');
  return new Set(['', '-wal', '-shm', '-journal'].map((suffix) => relative + suffix));
}

export type BackupResult = { folder: string; manifest: BackupManifest };

/**
 * Takes a backup of a running Gullyline: the database through SQLite's online backup (a
 * consistent copy while the app goes on reading and writing), then the uploaded and derived
 * files of the data folder, then a manifest with checksums. Written to `<folder>.partial` and
 * renamed when complete, so a backup cut short is never taken for a whole one.
 *
 * @param options.target the backup folder; default `DATA_DIR/backups/<time>`
 * @throws BackupError when the database is missing or the target exists
 */
export async function createBackup(options: { dataDir: string; databaseFile: string; appVersion: string; target?: string; now?: Date }): Promise<BackupResult> {
  const { dataDir, databaseFile } = options;
  const now = options.now ?? new Date();
  if (!existsSync(databaseFile)) throw new BackupError(`There is no database at ${databaseFile}: check DATA_DIR (or DATABASE_URL) and try again.`);
  const folder = path.resolve(options.target ?? path.join(dataDir, 'backups', backupFolderName(now)));
  if (existsSync(folder)) throw new BackupError(`${folder} already exists: choose a new folder for the backup.`);
  const partial = `${folder}.partial`;
  await rm(partial, { recursive: true, force: true });
  await mkdir(path.join(partial, FILES_FOLDER), { recursive: true });
  try {
    const copy = path.join(partial, DATABASE_COPY);
    const source = new Database(databaseFile, { fileMustExist: true });
    try {
      source.pragma('busy_timeout = 5000');
      // Large steps: a write from another connection between steps makes SQLite start over.
      await source.backup(copy, { progress: () => 4096 });
    } finally {
      source.close();
    }
    const migrations = settleCopy(copy);
    const database = { path: DATABASE_COPY, bytes: (await stat(copy)).size, sha256: await sha256OfFile(copy) };

    const files: BackupFileEntry[] = [];
    for (const relative of await listDataFiles(dataDir, databaseNamesIn(dataDir, databaseFile))) {
      const target = path.join(partial, FILES_FOLDER, relative);
      await mkdir(path.dirname(target), { recursive: true });
      try {
        await copyFile(path.join(dataDir, relative), target);
      } catch (error) {
        // Removed while the backup ran (a replaced terrain run): the database copy no longer needs it.
        if ((error as NodeJS.ErrnoException).code === 'ENOENT') continue;
        throw error;
      }
      files.push({ path: relative, bytes: (await stat(target)).size, sha256: await sha256OfFile(target) });
    }
    const manifest: BackupManifest = {
      format: 1,
      createdAt: now.toISOString(),
      appVersion: options.appVersion,
      migrations,
      database,
      files,
      fileCount: files.length,
      fileBytes: files.reduce((sum, file) => sum + file.bytes, 0),
    };
    await writeFile(path.join(partial, MANIFEST_FILE), JSON.stringify(manifest, null, 2) + '\n');
    await rename(partial, folder);
    return { folder, manifest };
  } catch (error) {
    await rm(partial, { recursive: true, force: true });
    throw error;
  }
}

/** Makes the copy one self-contained file (no WAL beside it) and reads the migrations it has. */
function settleCopy(file: string): string[] {
  const copy = new Database(file);
  try {
    copy.pragma('journal_mode = DELETE');
    const hasTable = copy.prepare("select 1 from sqlite_master where type = 'table' and name = 'knex_migrations'").get();
    if (!hasTable) return [];
    return (copy.prepare('select name from knex_migrations order by id').all() as { name: string }[]).map((row) => row.name);
  } finally {
    copy.close();
  }
}

/**
 * Reads a backup's manifest and checks every file against its size and SHA-256.
 * @throws BackupError naming the first problem
 */
export async function verifyBackup(folder: string): Promise<BackupManifest> {
  const manifestFile = path.join(folder, MANIFEST_FILE);
  if (!existsSync(folder)) throw new BackupError(`There is no folder ${folder}: give the path of a backup folder (for example data/backups/2026-12-02T10-15-30Z).`);
  if (!existsSync(manifestFile)) throw new BackupError(`${folder} is not a Gullyline backup: it has no ${MANIFEST_FILE}.`);
  let raw: unknown;
  try {
    raw = JSON.parse(await readFile(manifestFile, 'utf8'));
  } catch {
    throw new BackupError(`The backup's ${MANIFEST_FILE} is not valid JSON: the backup is damaged. Nothing was restored.`);
  }
  const parsed = manifestSchema.safeParse(raw);
  if (!parsed.success) throw new BackupError(`The backup's ${MANIFEST_FILE} is not one Gullyline wrote (${parsed.error.issues[0]?.path.join('.')}: ${parsed.error.issues[0]?.message}). Nothing was restored.`);
  const manifest = parsed.data;
  const entries = [{ ...manifest.database, file: path.join(folder, DATABASE_COPY) }, ...manifest.files.map((entry) => ({ ...entry, file: path.join(folder, FILES_FOLDER, entry.path) }))];
  for (const entry of entries) {
    if (!isSafeRelativePath(entry.path)) throw new BackupError(`The backup lists a file outside its folder (${entry.path}). Nothing was restored.`);
    const size = await stat(entry.file).then((info) => info.size, () => undefined);
    if (size === undefined) throw new BackupError(`The backup is incomplete: ${entry.path} is missing. Nothing was restored.`);
    if (size !== entry.bytes || (await sha256OfFile(entry.file)) !== entry.sha256) {
      throw new BackupError(`The backup is damaged: ${entry.path} does not match its checksum in ${MANIFEST_FILE}. Nothing was restored; use another backup.`);
    }
  }
  return manifest;
}

export type RestoreResult = { manifest: BackupManifest; appliedMigrations: string[] };

/**
 * Restores a backup into a data folder: checks the backup first (nothing is touched when it is
 * damaged, made by a newer Gullyline, or the target holds data and `force` is not given), then
 * copies the database and files, checks the database's integrity and applies pending migrations.
 * With `force`, the target's database and files are replaced; its `backups` folder and
 * `auth-secret` are kept.
 * Stop the server that uses the target before restoring into it.
 *
 * @throws BackupError with the reason
 */
export async function restoreBackup(options: {
  backupDir: string;
  dataDir: string;
  databaseFile?: string;
  force?: boolean;
  migrationSource: Knex.MigrationSource<string>;
}): Promise<RestoreResult> {
  const backupDir = path.resolve(options.backupDir);
  const dataDir = path.resolve(options.dataDir);
  const databaseFile = path.resolve(options.databaseFile ?? path.join(dataDir, DATABASE_COPY));
  const manifest = await verifyBackup(backupDir);

  const known = new Set(await options.migrationSource.getMigrations([]));
  const unknown = manifest.migrations.filter((name) => !known.has(name));
  if (unknown.length) {
    throw new BackupError(`This backup was made by a newer Gullyline (version ${manifest.appVersion}, with migration ${unknown[0]}): restore it with that version or newer. Nothing was restored.`);
  }
  // The target's backups and its development sign-in secret stay: neither is part of a backup.
  const existing = (await readdir(dataDir).catch(() => [] as string[])).filter((name) => name !== 'backups' && name !== 'auth-secret');
  if (existsSync(databaseFile) && !existing.length) existing.push(path.basename(databaseFile));
  if (existing.length && !options.force) {
    throw new BackupError(`${dataDir} already holds data (${existing.slice(0, 3).join(', ')}${existing.length > 3 ? ', …' : ''}). Restore into an empty folder, or add --force to replace what is there. Nothing was restored.`);
  }
  if (backupDir === dataDir || (backupDir.startsWith(dataDir + path.sep) && !backupDir.startsWith(path.join(dataDir, 'backups') + path.sep))) {
    throw new BackupError('The backup lies inside the folder being restored: move it out (or into its backups folder) first. Nothing was restored.');
  }

  await mkdir(dataDir, { recursive: true });
  for (const name of existing) await rm(path.join(dataDir, name), { recursive: true, force: true });
  for (const suffix of ['', '-wal', '-shm', '-journal']) await rm(databaseFile + suffix, { force: true });
  await mkdir(path.dirname(databaseFile), { recursive: true });
  await copyFile(path.join(backupDir, DATABASE_COPY), databaseFile);
  for (const entry of manifest.files) {
    const target = path.join(dataDir, entry.path);
    await mkdir(path.dirname(target), { recursive: true });
    await copyFile(path.join(backupDir, FILES_FOLDER, entry.path), target);
  }

  const integrity = checkIntegrity(databaseFile);
  if (integrity !== 'ok') throw new BackupError(`The restored database fails SQLite's integrity check (${integrity}). Use another backup.`);
  const restored = knex(sqliteSettings(databaseFile));
  try {
    const [, applied] = (await restored.migrate.latest({ migrationSource: options.migrationSource })) as [number, string[]];
    return { manifest, appliedMigrations: applied };
  } finally {
    await restored.destroy();
  }
}

/** `PRAGMA integrity_check` of an SQLite file: `ok`, or SQLite's first findings. */
export function checkIntegrity(databaseFile: string): string {
  const connection = new Database(databaseFile, { fileMustExist: true });
  try {
    const rows = connection.pragma('integrity_check') as { integrity_check: string }[];
    return rows.map((row) => row.integrity_check).slice(0, 5).join('; ');
  } finally {
    connection.close();
  }
}
