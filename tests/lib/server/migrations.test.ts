import { afterAll, describe, expect, it } from 'vitest';
import { closeDb, db, ensureMigrated } from '../../../src/lib/server/db';
import { bundledMigrations } from '../../../src/lib/server/migration-source';

afterAll(closeDb);

const TABLES = ['users', 'properties', 'memberships', 'invitations', 'audit_log', 'elevation_models', 'terrain_runs', 'drainage_lines', 'fence_lines', 'tracks', 'paddocks', 'crossings', 'property_settings'];

describe('migrations', () => {
  it('create every table, roll all the way back, and apply again', async () => {
    await ensureMigrated();
    for (const table of TABLES) expect(await db().schema.hasTable(table), table).toBe(true);

    const source = { migrationSource: bundledMigrations() };
    await db().migrate.rollback(source, true);
    for (const table of TABLES) expect(await db().schema.hasTable(table), table).toBe(false);

    const [, applied] = await db().migrate.latest(source);
    expect(applied).toEqual(await source.migrationSource.getMigrations([]));
    expect(applied[0]).toMatch(/^\d{14}_users\.ts$/);
  });

  it('turns on WAL and foreign keys for the connection', async () => {
    await ensureMigrated();
    const [journal] = await db().raw('PRAGMA journal_mode');
    const [foreignKeys] = await db().raw('PRAGMA foreign_keys');
    expect(journal.journal_mode).toBe('wal');
    expect(foreignKeys.foreign_keys).toBe(1);
  });

  it('refuses a membership with an unknown role or an unknown user', async () => {
    await ensureMigrated();
    const now = new Date().toISOString();
    const [user] = await db()('users').insert({ email: 'fk@test.example', name: 'FK', password_hash: 'x', created_at: now, updated_at: now }).returning('id');
    const [property] = await db()('properties').insert({ name: 'FK', crs: 'EPSG:7854', created_at: now, updated_at: now }).returning('id');
    await expect(db()('memberships').insert({ property_id: property.id, user_id: user.id, role: 'boss', created_at: now })).rejects.toThrow(/CHECK/);
    await expect(db()('memberships').insert({ property_id: property.id, user_id: 99_999, role: 'viewer', created_at: now })).rejects.toThrow(/FOREIGN KEY/);
  });
});
