import { copyFileSync, mkdirSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getConfig } from '../../../src/lib/server/config';
import { closeDb, db, ensureMigrated } from '../../../src/lib/server/db';
import { recoverTerrainRuns, whenTerrainIdle } from '../../../src/lib/server/jobs/terrain-jobs';
import { createProperty } from '../../../src/lib/server/repos/properties';
import { findRunById } from '../../../src/lib/server/repos/terrain';
import { createUser } from '../../../src/lib/server/repos/users';

let propertyId = 0;
let modelId = 0;

beforeAll(async () => {
  await ensureMigrated();
  const user = await createUser({ email: 'jobs@test.example', name: 'Jobs', passwordHash: 'x' });
  propertyId = (await createProperty({ name: 'Jobs', region: '', crs: 'EPSG:7854' }, user.id)).id;
  const stored = 'elevation-models/1/source.tif';
  mkdirSync(path.join(getConfig().dataDir, 'elevation-models/1'), { recursive: true });
  copyFileSync('data-samples/saltbush-rise-dem.tif', path.join(getConfig().dataDir, stored));
  [modelId] = (await db()('elevation_models')
    .insert({
      property_id: propertyId, name: 'dem.tif', stored_file: stored, size_bytes: 1, crs: 'EPSG:7854', crs_name: 'GDA2020 / MGA zone 54',
      width: 600, height: 600, cell_size_m: 5, extent_west: 141.63, extent_south: -31.46, extent_east: 141.67, extent_north: -31.42, created_at: new Date().toISOString(),
    })
    .returning('id')
    .then((rows) => rows.map((row: { id: number }) => row.id))) as [number];
});
afterAll(closeDb);

async function insertRun(status: 'queued' | 'running'): Promise<number> {
  const [row] = await db()('terrain_runs')
    .insert({ property_id: propertyId, elevation_model_id: modelId, status, stage: status === 'running' ? 'fill' : null, percent: 40, threshold_ha: 5, created_at: new Date().toISOString() })
    .returning('id');
  return (row as { id: number }).id;
}

describe('terrain runs after a restart', () => {
  it('marks a run that was working as failed with the reason, and finishes a queued one in a worker thread', async () => {
    const interrupted = await insertRun('running');
    const waiting = await insertRun('queued');

    await recoverTerrainRuns();
    const failed = await findRunById(interrupted);
    expect(failed?.status).toBe('failed');
    expect(failed?.message).toMatch(/server restarted while this run was working\. Start it again/);

    await whenTerrainIdle();
    const finished = await findRunById(waiting);
    expect(finished?.status, finished?.message ?? '').toBe('succeeded');
    expect(finished?.summary?.drainageLineCount).toBeGreaterThan(10);
    const [counted] = await db()('drainage_lines').where({ terrain_run_id: waiting }).count<{ n: number }[]>({ n: '*' });
    expect(Number(counted?.n)).toBe(finished?.summary?.drainageLineCount);
    // The property without an extent took the model's.
    const property = await db()('properties').where({ id: propertyId }).first('extent_west');
    expect(property.extent_west).toBeCloseTo(141.6313, 3);
  }, 60_000);
});
