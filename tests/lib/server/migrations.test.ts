import { afterAll, describe, expect, it } from 'vitest';
import { closeDb, db, ensureMigrated } from '../../../src/lib/server/db';
import { bundledMigrations } from '../../../src/lib/server/migration-source';

afterAll(closeDb);

const TABLES = ['users', 'properties', 'memberships', 'invitations', 'audit_log', 'elevation_models', 'terrain_runs', 'drainage_lines', 'fence_lines', 'tracks', 'paddocks', 'crossings', 'property_settings', 'outbox', 'revoked_sessions', 'work_orders', 'work_order_items', 'rain_events', 'inspection_rounds', 'inspection_checks', 'inspection_photos', 'read_generations'];

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

  it('gives paddocks a version and a change time, the rows already there taking their creation time', async () => {
    await ensureMigrated();
    const source = { migrationSource: bundledMigrations() };
    const migrations = await source.migrationSource.getMigrations([]);
    const before = migrations.indexOf('20261203000100_paddock_versions.ts');
    expect(before).toBeGreaterThan(0);
    // Back to the schema before it, with one paddock imported then.
    while ((await db().migrate.currentVersion(source)) !== migrations[before - 1]!.slice(0, 14)) await db().migrate.down(source);
    expect(await db().schema.hasColumn('paddocks', 'version')).toBe(false);
    const now = '2026-12-01T10:00:00.000Z';
    const [user] = await db()('users').insert({ email: 'paddock-mig@test.example', name: 'M', password_hash: 'x', created_at: now, updated_at: now }).returning('id');
    const [property] = await db()('properties').insert({ name: 'Old paddocks', crs: 'EPSG:7854', created_at: now, updated_at: now }).returning('id');
    await db()('paddocks').insert({ property_id: property.id, name: 'Old', geometry: '{}', area_ha: 1, min_lon: 0, min_lat: 0, max_lon: 0, max_lat: 0, created_at: now });
    await db().migrate.latest(source);
    expect(await db()('paddocks').where({ property_id: property.id }).first('version', 'updated_at')).toEqual({ version: 1, updated_at: now });
    await db()('properties').where({ id: property.id }).delete();
    await db()('users').where({ id: user.id }).delete();
  });

  it('copies the list figures of designs stored before they had columns of their own', async () => {
    await ensureMigrated();
    const source = { migrationSource: bundledMigrations() };
    const migrations = await source.migrationSource.getMigrations([]);
    const at = migrations.indexOf('20261205000400_crossing_design_figures.ts');
    expect(at).toBeGreaterThan(0);
    while ((await db().migrate.currentVersion(source)) !== migrations[at - 1]!.slice(0, 14)) await db().migrate.down(source);
    const now = '2026-12-01T10:00:00.000Z';
    const [user] = await db()('users').insert({ email: 'figures-mig@test.example', name: 'M', password_hash: 'x', created_at: now, updated_at: now }).returning('id');
    const [property] = await db()('properties').insert({ name: 'Old designs', crs: 'EPSG:7854', created_at: now, updated_at: now }).returning('id');
    const [fence] = await db()('fence_lines')
      .insert({ property_id: property.id, name: 'F', status: 'planned', geometry: '{}', length_m: 1, wire_spec: '{}', min_lon: 0, min_lat: 0, max_lon: 0, max_lat: 0, created_at: now, updated_at: now })
      .returning('id');
    const crossing = { property_id: property.id, fence_line_id: fence.id, kind: 'crossing', lon: 0, lat: 0, chainage_m: 1 };
    const design = { status: 'designed', provisional: true, floods: { levelM: 101.25 }, layout: { style: 'separate', floodgate: { lengthM: 18.5 } }, profile: [1, 2, 3] };
    const [designed] = await db()('crossings').insert({ ...crossing, design: JSON.stringify(design) }).returning('id');
    const [bare] = await db()('crossings').insert({ ...crossing, design: null }).returning('id');
    await db().migrate.latest(source);
    const figures = ['design_provisional', 'design_style', 'design_flood_level_m', 'design_floodgate_length_m'];
    expect(await db()('crossings').where({ id: designed.id }).first(...figures)).toEqual({ design_provisional: 1, design_style: 'separate', design_flood_level_m: 101.25, design_floodgate_length_m: 18.5 });
    expect(await db()('crossings').where({ id: bare.id }).first(...figures)).toEqual({ design_provisional: 0, design_style: null, design_flood_level_m: null, design_floodgate_length_m: null });
    await db()('properties').where({ id: property.id }).delete();
    await db()('users').where({ id: user.id }).delete();
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
