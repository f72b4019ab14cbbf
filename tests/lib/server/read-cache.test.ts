import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { closeDb, db, ensureMigrated } from '../../../src/lib/server/db';
import { forgetKeptAnswers, keptJsonAnswer, keptValue, readGeneration } from '../../../src/lib/server/read-cache';
import { createFenceLine, deleteFenceLine, listFenceLines, updateFenceLine } from '../../../src/lib/server/repos/fence-lines';
import { createPaddock } from '../../../src/lib/server/repos/paddocks';
import { createProperty } from '../../../src/lib/server/repos/properties';
import { createUser } from '../../../src/lib/server/repos/users';
import { fenceLineInputSchema } from '../../../src/lib/schemas/plan';

let ownerId = 0;
let propertyId = 0;
let otherPropertyId = 0;

const line: [number, number][] = [
  [141.6, -31.4],
  [141.61, -31.4],
];

beforeAll(async () => {
  await ensureMigrated();
  ownerId = (await createUser({ email: 'cache-owner@test.example', name: 'Cass Cache', passwordHash: 'hash' })).id;
  propertyId = (await createProperty({ name: 'Kept Creek', region: '', crs: 'EPSG:7854' }, ownerId)).id;
  otherPropertyId = (await createProperty({ name: 'Other Creek', region: '', crs: 'EPSG:7854' }, ownerId)).id;
});
beforeEach(forgetKeptAnswers);
afterAll(closeDb);

describe('the read generation, kept by SQLite triggers', () => {
  it('moves on every insert, update and delete of a fence line, and only for its property', async () => {
    const start = await readGeneration(propertyId, 'plan');
    const other = await readGeneration(otherPropertyId, 'plan');
    const fence = await createFenceLine(propertyId, fenceLineInputSchema.parse({ name: 'Kept north', coordinates: line }), ownerId);
    const afterCreate = await readGeneration(propertyId, 'plan');
    expect(afterCreate).toBeGreaterThan(start);
    const updated = await updateFenceLine(propertyId, fence.id, { name: 'Kept north 2', version: fence.version }, ownerId);
    const afterUpdate = await readGeneration(propertyId, 'plan');
    expect(afterUpdate).toBeGreaterThan(afterCreate);
    await deleteFenceLine(propertyId, fence.id, ownerId, updated.version);
    expect(await readGeneration(propertyId, 'plan')).toBeGreaterThan(afterUpdate);
    expect(await readGeneration(otherPropertyId, 'plan')).toBe(other);
  });

  it('moves the plan counter for paddocks and crossings written by any path, even plain SQL', async () => {
    const before = await readGeneration(propertyId, 'plan');
    await createPaddock(propertyId, { name: 'Kept paddock', rings: [[[141.6, -31.4], [141.61, -31.4], [141.61, -31.41], [141.6, -31.4]]] }, ownerId);
    const afterPaddock = await readGeneration(propertyId, 'plan');
    expect(afterPaddock).toBeGreaterThan(before);
    await db()('paddocks').where({ property_id: propertyId }).update({ name: 'Renamed by a script' });
    expect(await readGeneration(propertyId, 'plan')).toBeGreaterThan(afterPaddock);
  });

  it('keeps terrain changes on their own counter: a run’s progress does not move the plan’s', async () => {
    const plan = await readGeneration(propertyId, 'plan');
    const terrain = await readGeneration(propertyId, 'terrain');
    const now = new Date().toISOString();
    const [model] = await db()('elevation_models')
      .insert({ property_id: propertyId, name: 'dem.tif', stored_file: 'x.tif', size_bytes: 1, crs: 'EPSG:7854', crs_name: 'GDA2020 / MGA zone 54', width: 1, height: 1, cell_size_m: 1, extent_west: 0, extent_south: 0, extent_east: 1, extent_north: 1, uploaded_by: ownerId, created_at: now })
      .returning('id');
    expect(model).toBeDefined();
    expect(await readGeneration(propertyId, 'terrain')).toBeGreaterThan(terrain);
    expect(await readGeneration(propertyId, 'plan')).toBe(plan);
  });
});

describe('kept answers', () => {
  it('computes once while nothing changes, and again after a change', async () => {
    let computed = 0;
    const read = () => keptValue('fence-names', propertyId, 'plan', async () => ((computed += 1), (await listFenceLines(propertyId)).map((fence) => fence.name)));
    const first = await read();
    expect(await read()).toBe(first);
    expect(computed).toBe(1);
    await createFenceLine(propertyId, fenceLineInputSchema.parse({ name: 'Kept south', coordinates: line }), ownerId);
    expect(await read()).toContain('Kept south');
    expect(computed).toBe(2);
  });

  it('serves the same JSON plain or gzipped, as the client asks, and the change at once after a write', async () => {
    const answer = (encoding: string) =>
      keptJsonAnswer(new Request('http://localhost/x', { headers: { 'Accept-Encoding': encoding } }), 'fence-lines', propertyId, 'plan', 'application/json', async () => ({
        fenceLines: await listFenceLines(propertyId),
        padding: 'x'.repeat(10_000),
      }));
    const plain = await answer('identity');
    expect(plain.headers.get('Content-Encoding')).toBeNull();
    const plainBody = (await plain.json()) as { fenceLines: { name: string }[] };
    const zipped = await answer('gzip, deflate');
    expect(zipped.headers.get('Content-Encoding')).toBe('gzip');
    const { gunzipSync } = await import('node:zlib');
    expect(JSON.parse(gunzipSync(Buffer.from(await zipped.arrayBuffer())).toString('utf8'))).toEqual(plainBody);

    const fence = (await listFenceLines(propertyId)).find((f) => f.name === 'Kept south')!;
    await updateFenceLine(propertyId, fence.id, { name: 'Kept south renamed', version: fence.version }, ownerId);
    const after = (await (await answer('identity')).json()) as { fenceLines: { name: string }[] };
    expect(after.fenceLines.map((f) => f.name)).toContain('Kept south renamed');
    expect(after.fenceLines.map((f) => f.name)).not.toContain('Kept south');
  });
});
