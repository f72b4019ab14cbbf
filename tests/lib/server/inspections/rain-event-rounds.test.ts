import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db, ensureMigrated } from '../../../../src/lib/server/db';
import { insertRainEventWithRound, type RoundCrossing } from '../../../../src/lib/server/repos/inspections';
import { createProperty } from '../../../../src/lib/server/repos/properties';
import { createUser } from '../../../../src/lib/server/repos/users';

let propertyId = 0;
let userId = 0;
let crossingIds: number[] = [];

beforeAll(async () => {
  await ensureMigrated();
  userId = (await createUser({ email: 'rounds@inspect.example', name: 'Rowan Manager', passwordHash: 'hash' })).id;
  propertyId = (await createProperty({ name: 'Coolabah Run', region: '', crs: 'EPSG:7854' }, userId)).id;
  const now = new Date().toISOString();
  const [fence] = await db()('fence_lines')
    .insert({ property_id: propertyId, name: 'Long boundary', status: 'built', geometry: JSON.stringify({ type: 'LineString', coordinates: [[141.6, -31.4], [141.7, -31.4]] }), length_m: 9500, wire_spec: '{}', min_lon: 141.6, min_lat: -31.4, max_lon: 141.7, max_lat: -31.4, created_at: now, updated_at: now })
    .returning('id');
  // A big station: more crossings than SQLite takes in one compound insert (500 terms).
  const rows = Array.from({ length: 620 }, (_, i) => ({ property_id: propertyId, fence_line_id: fence.id, kind: 'crossing', lon: 141.6 + i * 0.0001, lat: -31.4, chainage_m: i * 15, upstream_area_m2: (i + 1) * 10_000 }));
  for (let start = 0; start < rows.length; start += 100) await db()('crossings').insert(rows.slice(start, start + 100));
  crossingIds = (await db()('crossings').where({ property_id: propertyId }).orderBy('id').pluck('id')) as number[];
});
afterAll(closeDb);

const asRound = (ids: number[]): RoundCrossing[] => ids.map((id, i) => ({ id, catchmentHa: 620 - i, selectedBy: 'property', label: `Long boundary #${id}`, style: null }));

describe('insertRainEventWithRound', () => {
  it('opens a round of 620 crossings in the order given', async () => {
    const ordered = [...crossingIds].reverse();
    const { roundId, crossingIds: kept } = await insertRainEventWithRound(propertyId, { fellOn: '2026-11-30', rainfallMm: 90, scope: 'property', paddockIds: [], note: '' }, asRound(ordered), userId, async () => undefined);
    expect(kept).toEqual(ordered);
    const checks = (await db()('inspection_checks').where({ round_id: roundId }).orderBy('position').select('crossing_id', 'position')) as { crossing_id: number; position: number }[];
    expect(checks).toHaveLength(620);
    expect(checks.map((check) => check.crossing_id)).toEqual(ordered);
    expect(checks.at(-1)!.position).toBe(620);
  });

  it('leaves out a crossing that a new analysis removed after the list was read', async () => {
    const [gone, ...rest] = crossingIds.slice(0, 4) as [number, ...number[]];
    await db()('crossings').where({ id: gone }).delete();
    let counted = -1;
    const { roundId, crossingIds: kept } = await insertRainEventWithRound(propertyId, { fellOn: '2026-12-01', rainfallMm: 30, scope: 'property', paddockIds: [], note: '' }, asRound([gone, ...rest]), userId, async ({ crossingCount }) => {
      counted = crossingCount;
    });
    expect(kept).toEqual(rest);
    expect(counted).toBe(3);
    expect((await db()('inspection_checks').where({ round_id: roundId }).orderBy('position').pluck('crossing_id')) as number[]).toEqual(rest);
  });
});
