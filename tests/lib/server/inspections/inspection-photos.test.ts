import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db, ensureMigrated } from '../../../../src/lib/server/db';
import { addPhoto } from '../../../../src/lib/server/inspections/inspection-photos';
import type { PhotoStore } from '../../../../src/lib/server/photo-storage/photo-store';
import { insertRainEventWithRound, updateCheck } from '../../../../src/lib/server/repos/inspections';
import { createProperty } from '../../../../src/lib/server/repos/properties';
import { createUser } from '../../../../src/lib/server/repos/users';

let propertyId = 0;
let userId = 0;
let roundId = 0;

/** A store in memory that records what it holds and can be told to act in the middle of a write. */
function memoryStore(onPut?: (key: string, count: number) => Promise<void>) {
  const objects = new Map<string, Uint8Array>();
  let puts = 0;
  const store: PhotoStore = {
    kind: 'local-disk',
    async put(key, bytes) {
      puts += 1;
      await onPut?.(key, puts);
      objects.set(key, bytes);
    },
    async get(key) {
      return objects.get(key) ?? null;
    },
    async remove(key) {
      objects.delete(key);
    },
    async keys() {
      return [...objects.keys()];
    },
  };
  return { store, objects };
}

/** A check row of its own (the crossing is not needed for photos). */
async function newCheck(): Promise<number> {
  const position = ((await db()('inspection_checks').where({ round_id: roundId }).max<{ n: number | null }[]>({ n: 'position' }))[0]?.n ?? 0) + 1;
  const [row] = await db()('inspection_checks')
    .insert({ property_id: propertyId, round_id: roundId, crossing_id: null, position, crossing_label: `Check ${position}`, style: 'continuous-floodgate', selected_by: 'property', status: 'not-checked', note: '', version: 1 })
    .returning('id');
  return (row as { id: number }).id;
}

const photoBytes = () => sharp({ create: { width: 40, height: 30, channels: 3, background: '#a07850' } }).jpeg().toBuffer();

beforeAll(async () => {
  await ensureMigrated();
  userId = (await createUser({ email: 'photos@inspect.example', name: 'Pat Crew', passwordHash: 'hash' })).id;
  propertyId = (await createProperty({ name: 'Gidgee Creek', region: '', crs: 'EPSG:7854' }, userId)).id;
  ({ roundId } = await insertRainEventWithRound(propertyId, { fellOn: '2026-11-30', rainfallMm: 62, scope: 'property', paddockIds: [], note: '' }, [], userId, async () => undefined));
});
afterAll(closeDb);

describe('addPhoto', () => {
  it('writes both objects before the row exists, then the row and its audit entry', async () => {
    const checkId = await newCheck();
    const rowsAtPut: number[] = [];
    const { store, objects } = memoryStore(async () => {
      rowsAtPut.push(Number((await db()('inspection_photos').where({ check_id: checkId }).count<{ n: number }[]>({ n: '*' }))[0]!.n));
    });
    const photo = await addPhoto(propertyId, { checkId, keepLocation: false, fileName: 'photo.jpg', bytes: await photoBytes() }, userId, store);
    expect(rowsAtPut).toEqual([0, 0]);
    const row = await db()('inspection_photos').where({ id: photo.id }).first();
    expect([...objects.keys()].sort()).toEqual([row.storage_key, row.thumbnail_key].sort());
    expect(row.storage_key).toMatch(new RegExp(`^photos/${propertyId}/[0-9a-f-]{36}\\.jpg$`));
    const audit = await db()('audit_log').where({ action: 'inspection_photo.create', entity_id: String(photo.id) }).first();
    expect(JSON.parse(audit.detail)).toMatchObject({ checkId, roundId });
  });

  it('removes the stored objects when the row cannot be written (the check vanished meanwhile): no orphans', async () => {
    const checkId = await newCheck();
    const { store, objects } = memoryStore(async (_key, count) => {
      // Between the durable write and the row, someone removes the check.
      if (count === 2) await db()('inspection_checks').where({ id: checkId }).delete();
    });
    await expect(addPhoto(propertyId, { checkId, keepLocation: false, fileName: 'photo.jpg', bytes: await photoBytes() }, userId, store)).rejects.toThrow();
    expect(objects.size).toBe(0);
    expect(await db()('inspection_photos').where({ check_id: checkId }).first()).toBeUndefined();
  });

  it('removes the photo when its thumbnail cannot be stored', async () => {
    const checkId = await newCheck();
    const { store, objects } = memoryStore(async (_key, count) => {
      if (count === 2) throw new Error('disk full');
    });
    await expect(addPhoto(propertyId, { checkId, keepLocation: false, fileName: 'photo.jpg', bytes: await photoBytes() }, userId, store)).rejects.toThrow(/disk full/);
    expect(objects.size).toBe(0);
    expect(await db()('inspection_photos').where({ check_id: checkId }).first()).toBeUndefined();
  });

  it('stores nothing for a file that is not a photo', async () => {
    const checkId = await newCheck();
    const { store, objects } = memoryStore();
    await expect(addPhoto(propertyId, { checkId, keepLocation: false, fileName: 'photo.jpg', bytes: new TextEncoder().encode('hello') }, userId, store)).rejects.toMatchObject({ status: 415 });
    expect(objects.size).toBe(0);
  });
});

describe('updateCheck', () => {
  it('refuses a stale version and a status of the other style with 409, changing nothing', async () => {
    const checkId = await newCheck();
    const first = await updateCheck(propertyId, roundId, checkId, { status: 'tie-reset', note: 'Tie let go; re-set it.', version: 1 }, userId);
    expect(first).toMatchObject({ status: 'tie-reset', version: 2, checkedByName: 'Pat Crew' });
    await expect(updateCheck(propertyId, roundId, checkId, { status: 'damaged', note: '', version: 1 }, userId)).rejects.toMatchObject({ status: 409 });
    await expect(updateCheck(propertyId, roundId, checkId, { status: 'section-rehung', note: '', version: 2 }, userId)).rejects.toMatchObject({ status: 409 });
    expect(await db()('inspection_checks').where({ id: checkId }).first('status', 'version', 'note')).toEqual({ status: 'tie-reset', version: 2, note: 'Tie let go; re-set it.' });
  });
});
