import { existsSync, mkdirSync, readdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getConfig } from '../../../src/lib/server/config';
import { removeLeftoverFiles } from '../../../src/lib/server/data-cleanup';
import { closeDb, db, ensureMigrated } from '../../../src/lib/server/db';
import { createProperty } from '../../../src/lib/server/repos/properties';
import { createUser } from '../../../src/lib/server/repos/users';

const file = (relative: string) => {
  const full = path.join(getConfig().dataDir, relative);
  mkdirSync(path.dirname(full), { recursive: true });
  writeFileSync(full, 'x');
};
const exists = (relative: string) => existsSync(path.join(getConfig().dataDir, relative));

let propertyId = 0;
beforeAll(async () => {
  await ensureMigrated();
  const user = await createUser({ email: 'cleanup@test.example', name: 'Cleanup', passwordHash: 'x' });
  propertyId = (await createProperty({ name: 'Cleanup', region: '', crs: 'EPSG:7854' }, user.id)).id;
});
afterAll(closeDb);

async function model(): Promise<number> {
  const [row] = await db()('elevation_models')
    .insert({
      property_id: propertyId, name: 'dem.tif', stored_file: 'pending', size_bytes: 1, crs: 'EPSG:7854', crs_name: 'GDA2020 / MGA zone 54',
      width: 1, height: 1, cell_size_m: 5, extent_west: 141, extent_south: -32, extent_east: 142, extent_north: -31, created_at: new Date().toISOString(),
    })
    .returning('id');
  return (row as { id: number }).id;
}

async function run(modelId: number, status: string): Promise<number> {
  const [row] = await db()('terrain_runs').insert({ property_id: propertyId, elevation_model_id: modelId, status, percent: 0, threshold_ha: 5, created_at: new Date().toISOString() }).returning('id');
  return (row as { id: number }).id;
}

describe('removeLeftoverFiles', () => {
  it('removes uploads never accepted and folders no row owns, and keeps every file a row owns', async () => {
    const kept = await model();
    const [succeeded, running, failed, cancelled] = [await run(kept, 'succeeded'), await run(kept, 'running'), await run(kept, 'failed'), await run(kept, 'cancelled')];
    file(`elevation-models/${kept}/source.tif`);
    file('elevation-models/9999/source.tif'); // moved in by a transaction that never committed
    for (const id of [succeeded, running, failed, cancelled, 8888]) file(`terrain-runs/${id}/hillshade.png`);
    file('uploads/incoming/0b3c.part');
    file('backups/2026-12-02T10-15-30Z/manifest.json');

    expect(await removeLeftoverFiles()).toBe(5);
    expect(readdirSync(path.join(getConfig().dataDir, 'uploads/incoming'))).toEqual([]);
    expect(exists(`elevation-models/${kept}/source.tif`)).toBe(true);
    expect(exists('elevation-models/9999')).toBe(false);
    expect(exists(`terrain-runs/${succeeded}/hillshade.png`)).toBe(true);
    expect(exists(`terrain-runs/${running}/hillshade.png`)).toBe(true);
    for (const id of [failed, cancelled, 8888]) expect(exists(`terrain-runs/${id}`), `run ${id}`).toBe(false);
    expect(exists('backups/2026-12-02T10-15-30Z/manifest.json')).toBe(true);
    expect(await removeLeftoverFiles()).toBe(0);
  });

  it('removes photos no row names (stored by an upload killed before its row), and keeps the others', async () => {
    const userId = (await db()('users').first('id')).id as number;
    const now = new Date().toISOString();
    const [event] = await db()('rain_events').insert({ property_id: propertyId, fell_on: '2026-12-01', rainfall_mm: 80, scope: 'property', created_at: now }).returning('id');
    const [round] = await db()('inspection_rounds').insert({ property_id: propertyId, rain_event_id: (event as { id: number }).id, created_at: now }).returning('id');
    const [check] = await db()('inspection_checks')
      .insert({ property_id: propertyId, round_id: (round as { id: number }).id, position: 1, crossing_label: 'Check 1', selected_by: 'property' })
      .returning('id');
    const owned = { storage_key: `photos/${propertyId}/owned-0000-0001.jpg`, thumbnail_key: `photos/${propertyId}/owned-0000-0001-thumb.jpg` };
    await db()('inspection_photos').insert({
      ...owned, property_id: propertyId, check_id: (check as { id: number }).id, content_type: 'image/jpeg', size_bytes: 1, width: 1, height: 1, uploaded_by: userId, created_at: now,
    });
    for (const key of [owned.storage_key, owned.thumbnail_key, `photos/${propertyId}/orphan-0000-0002.jpg`, `photos/${propertyId}/orphan-0000-0002-thumb.jpg`]) file(key);
    file(`photos/${propertyId}/.0c1d-half.part`);

    expect(await removeLeftoverFiles()).toBe(2);
    expect(readdirSync(path.join(getConfig().dataDir, `photos/${propertyId}`)).sort()).toEqual(['owned-0000-0001-thumb.jpg', 'owned-0000-0001.jpg']);
  });
});
