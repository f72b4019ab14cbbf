import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type BetterSqlite3 from 'better-sqlite3';
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

/** The better-sqlite3 connection under knex, for `writeAtOnce`. */
export type RawConnection = BetterSqlite3.Database;

/**
 * Runs `work` as one SQLite transaction on the app's connection, synchronously. Knex awaits every
 * statement, and a knex transaction holds the one pooled connection across all those awaits: under
 * load each await waits its turn in the event loop, and meanwhile every other request's query
 * waits for the connection. Hot multi-statement writes (a fence edit, storing an analysis) go
 * through here instead: the connection is taken once, the statements run back to back, and it is
 * given back. A throw rolls the transaction back. `work` must not await.
 */
export async function writeAtOnce<T>(work: (connection: RawConnection) => T): Promise<T> {
  const client = db().client as { acquireConnection(): Promise<RawConnection>; releaseConnection(connection: RawConnection): Promise<unknown> };
  const connection = await client.acquireConnection();
  try {
    return connection.transaction(work)(connection);
  } finally {
    await client.releaseConnection(connection);
  }
}

/** A value as better-sqlite3 binds it, the way knex passes values (booleans as 0 and 1). */
export function sqlValue(value: unknown): unknown {
  return typeof value === 'boolean' ? Number(value) : value === undefined ? null : value;
}

/** `insert into table (…) values (…)` for the row's defined columns. */
export function insertRow(connection: RawConnection, table: string, row: Record<string, unknown>): BetterSqlite3.RunResult {
  const columns = Object.keys(row).filter((column) => row[column] !== undefined);
  return connection.prepare(`insert into "${table}" (${columns.map((c) => `"${c}"`).join(', ')}) values (${columns.map(() => '?').join(', ')})`).run(...columns.map((c) => sqlValue(row[c])));
}

/** `update table set … where … = ? and …` for the row's defined columns; `changes` says how many rows matched. */
export function updateRows(connection: RawConnection, table: string, row: Record<string, unknown>, where: Record<string, unknown>): BetterSqlite3.RunResult {
  const columns = Object.keys(row).filter((column) => row[column] !== undefined);
  const conditions = Object.keys(where);
  return connection
    .prepare(`update "${table}" set ${columns.map((c) => `"${c}" = ?`).join(', ')} where ${conditions.map((c) => `"${c}" = ?`).join(' and ')}`)
    .run(...columns.map((c) => sqlValue(row[c])), ...conditions.map((c) => sqlValue(where[c])));
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
