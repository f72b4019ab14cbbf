import { mkdirSync } from 'node:fs';
import path from 'node:path';
import knex, { type Knex } from 'knex';
import { getConfig } from './config';
import { keepPreparedStatements } from './kept-statements';
import { bundledMigrations } from './migration-source';

/**
 * Knex settings for an SQLite file through better-sqlite3. Every pooled connection gets WAL
 * (readers never wait for the writer), foreign keys (SQLite leaves them off by default) and a
 * busy timeout, so a second process (a migration, a backup) waits instead of failing. It keeps its
 * prepared statements (kept-statements.ts).
 */
export function sqliteSettings(filename: string): Knex.Config {
  mkdirSync(path.dirname(filename), { recursive: true });
  return {
    client: 'better-sqlite3',
    connection: { filename },
    useNullAsDefault: true,
    pool: {
      min: 1,
      max: 1,
      afterCreate(connection: { pragma(sql: string): unknown; prepare(sql: string): unknown }, done: (error: Error | null, connection: unknown) => void) {
        try {
          connection.pragma('journal_mode = WAL');
          connection.pragma('foreign_keys = ON');
          connection.pragma('busy_timeout = 5000');
          connection.pragma('synchronous = NORMAL');
          done(null, keepPreparedStatements(connection));
        } catch (error) {
          done(error as Error, connection);
        }
      },
    },
  };
}

let instance: Knex | undefined;

/** The app's one configured knex instance (created on first use). */
export function db(): Knex {
  instance ??= knex(sqliteSettings(getConfig().databaseFile));
  return instance;
}

let migrated: Promise<void> | undefined;

/** Brings the schema up to date once per process; the server awaits it before its first request. */
export function ensureMigrated(): Promise<void> {
  migrated ??= db()
    .migrate.latest({ migrationSource: bundledMigrations() })
    .then(() => undefined);
  return migrated;
}

/** Closes the pool (tests and scripts that must exit). */
export async function closeDb(): Promise<void> {
  if (!instance) return;
  const closing = instance;
  instance = undefined;
  migrated = undefined;
  await closing.destroy();
}
