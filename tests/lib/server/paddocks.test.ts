/**
 * The paddock and track repositories against a real SQLite file after the migrations. Areas are
 * checked against GeographicLib (geographiclib-geodesic) and plain geometry (1 km² = 100 ha).
 */
import geographiclib from 'geographiclib-geodesic';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { paddockInputSchema, type PaddockInput } from '../../../src/lib/schemas/paddock';
import { fenceLineInputSchema } from '../../../src/lib/schemas/plan';
import { closeDb, db, ensureMigrated } from '../../../src/lib/server/db';
import { ConflictError, NotFoundError, ValidationError } from '../../../src/lib/server/http';
import { listAuditForProperty } from '../../../src/lib/server/repos/audit-log';
import { createFenceLine } from '../../../src/lib/server/repos/fence-lines';
import { createPaddock, createPaddocksFromFences, deletePaddock, getPaddock, listPaddocks, updatePaddock } from '../../../src/lib/server/repos/paddocks';
import { createProperty } from '../../../src/lib/server/repos/properties';
import { deleteTrack, getTrack, storeImportedFile } from '../../../src/lib/server/repos/tracks';
import { createUser } from '../../../src/lib/server/repos/users';
import { destination } from '../crossings/geometry/helpers';

// The audit write can be made to fail, to show that a paddock is never stored without its entry.
const failAudit = vi.hoisted(() => ({ on: false }));
vi.mock('../../../src/lib/server/repos/audit-log', async (importOriginal) => {
  const original = await importOriginal<typeof import('../../../src/lib/server/repos/audit-log')>();
  return {
    ...original,
    recordAudit: (...args: Parameters<typeof original.recordAudit>) => (failAudit.on ? Promise.reject(new Error('audit log unavailable')) : original.recordAudit(...args)),
  };
});

type P = [number, number];
const sw: P = [141.64, -31.44];
const se = destination(sw, 90, 1000);
const nw = destination(sw, 0, 1000);
const ne = destination(nw, 90, 1000);

/** GeographicLib's area of the corners, hectares. */
function geographicLibAreaHa(corners: P[]): number {
  const polygon = geographiclib.Geodesic.WGS84.Polygon(false);
  for (const [lon, lat] of corners) polygon.AddPoint(lat, lon);
  return Math.abs(polygon.Compute(false, true).area!) / 10_000;
}

const input = (value: unknown): PaddockInput => paddockInputSchema.parse(value);
const count = async (table: string, propertyId: number) => Number((await db()(table).where({ property_id: propertyId }).count<{ n: number }[]>({ n: '*' }))[0]!.n);

let userId = 0;
let propertyId = 0;
let otherPropertyId = 0;

beforeAll(async () => {
  await ensureMigrated();
  userId = (await createUser({ email: 'paddocks@test.example', name: 'Paddocks', passwordHash: 'x' })).id;
  propertyId = (await createProperty({ name: 'Paddocks', region: '', crs: 'EPSG:7854' }, userId)).id;
  otherPropertyId = (await createProperty({ name: 'Elsewhere', region: '', crs: 'EPSG:7854' }, userId)).id;
});
afterAll(closeDb);

describe('paddocks', () => {
  it('stores a drawn paddock with its geodesic area, counterclockwise and closed, with an audit entry', async () => {
    // Drawn clockwise and left open.
    const paddock = await createPaddock(propertyId, input({ name: 'Home', rings: [[sw, nw, ne, se]] }), userId);
    expect(paddock).toMatchObject({ name: 'Home', version: 1 });
    // Analytic 100 ha; GeographicLib's area of the same corners within 1e-9.
    expect(paddock.areaHa).toBeCloseTo(100, 1);
    expect(paddock.areaHa).toBeCloseTo(geographicLibAreaHa([sw, se, ne, nw]), 7);
    expect(paddock.rings[0]).toEqual([sw, se, ne, nw, sw]);
    expect(await getPaddock(propertyId, paddock.id)).toEqual(paddock);
    const [entry] = await listAuditForProperty(propertyId);
    expect(entry).toMatchObject({ action: 'paddock.create', entityId: String(paddock.id) });
  });

  it('keeps another property\'s paddock out of sight', async () => {
    const [home] = await listPaddocks(propertyId);
    await expect(getPaddock(otherPropertyId, home!.id)).rejects.toBeInstanceOf(NotFoundError);
    await expect(deletePaddock(otherPropertyId, home!.id, userId)).rejects.toBeInstanceOf(NotFoundError);
  });

  it('stores nothing when the audit entry cannot be written', async () => {
    const before = await count('paddocks', propertyId);
    failAudit.on = true;
    try {
      await expect(createPaddock(propertyId, input({ name: 'Ghost', rings: [[sw, se, ne]] }), userId)).rejects.toThrow(/audit log unavailable/);
    } finally {
      failAudit.on = false;
    }
    expect(await count('paddocks', propertyId)).toBe(before);
  });

  it('redraws a paddock, recomputing its area, and refuses an edit made on stale data', async () => {
    const paddock = await createPaddock(propertyId, input({ name: 'Redrawn', rings: [[sw, se, ne, nw]] }), userId);
    const triangle = await updatePaddock(propertyId, paddock.id, { rings: input({ name: 'x', rings: [[sw, se, ne]] }).rings, version: 1 }, userId);
    expect(triangle.version).toBe(2);
    expect(triangle.areaHa).toBeCloseTo(geographicLibAreaHa([sw, se, ne]), 7);
    const renamed = await updatePaddock(propertyId, paddock.id, { name: 'Triangle', version: 2 }, userId);
    expect(renamed).toMatchObject({ name: 'Triangle', version: 3, areaHa: triangle.areaHa });
    await expect(updatePaddock(propertyId, paddock.id, { name: 'Lost', version: 2 }, userId)).rejects.toThrow(ConflictError);
    await expect(updatePaddock(propertyId, paddock.id, { name: 'Lost', version: 2 }, userId)).rejects.toThrow(/since you opened it \(now version 3\)\. Reload it/);
    expect((await getPaddock(propertyId, paddock.id)).name).toBe('Triangle');
    const actions = (await listAuditForProperty(propertyId)).slice(0, 2).map((e) => [e.action, e.detail]);
    expect(actions).toEqual([['paddock.update', { fields: ['name'] }], ['paddock.update', { fields: ['rings'] }]]);
  });

  it('deletes a paddock with an audit entry', async () => {
    const paddock = await createPaddock(propertyId, input({ name: 'Gone', rings: [[sw, se, ne]] }), userId);
    await deletePaddock(propertyId, paddock.id, userId);
    await expect(getPaddock(propertyId, paddock.id)).rejects.toBeInstanceOf(NotFoundError);
    expect((await listAuditForProperty(propertyId))[0]).toMatchObject({ action: 'paddock.delete', detail: { name: 'Gone' } });
  });
});

describe('paddocks from fence lines', () => {
  let fenced = 0;
  const fenceIds: number[] = [];

  beforeAll(async () => {
    fenced = (await createProperty({ name: 'Fenced', region: '', crs: 'EPSG:7854' }, userId)).id;
    const sides: P[][] = [[sw, se], [se, ne], [ne, nw], [nw, destination(sw, 0, 3)]]; // the west fence stops 3 m short
    for (const [k, coordinates] of sides.entries()) {
      fenceIds.push((await createFenceLine(fenced, fenceLineInputSchema.parse({ name: `Side ${k}`, coordinates }), userId)).id);
    }
  });

  it('refuses a fence line of another property, naming it, and makes nothing', async () => {
    const elsewhere = await createFenceLine(otherPropertyId, fenceLineInputSchema.parse({ name: 'Theirs', coordinates: [sw, se] }), userId);
    const error = await createPaddocksFromFences(fenced, [...fenceIds, elsewhere.id], userId).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ValidationError);
    expect((error as ValidationError).fields).toEqual({ fenceLineIds: `No fence line with id ${elsewhere.id} on this property.` });
    expect(await count('paddocks', fenced)).toBe(0);
  });

  it('makes one paddock of four fences closing a square (ends 3 m apart joined), then none the second time', async () => {
    const first = await createPaddocksFromFences(fenced, undefined, userId);
    expect(first).toMatchObject({ enclosedAreas: 1, alreadyCovered: 0 });
    expect(first.paddocks).toHaveLength(1);
    expect(first.paddocks[0]!.name).toBe('Paddock 1');
    // Analytic 100 ha; the 3 m gap closed at the mean of the two ends moves the corner 1.5 m: < 0.1 ha.
    expect(first.paddocks[0]!.areaHa).toBeCloseTo(100, 0);
    const again = await createPaddocksFromFences(fenced, fenceIds, userId);
    expect(again).toEqual({ paddocks: [], enclosedAreas: 1, alreadyCovered: 1 });
    const actions = (await listAuditForProperty(fenced)).map((e) => e.action);
    expect(actions.slice(0, 3)).toEqual(['paddock.from_fences', 'paddock.from_fences', 'paddock.create']);
  });

  it('leaves retired fence lines out unless they are named', async () => {
    const middle = await createFenceLine(fenced, fenceLineInputSchema.parse({ name: 'Old middle', status: 'retired', coordinates: [destination(sw, 90, 500), destination(nw, 90, 500)] }), userId);
    // The square is covered already; the middle fence would split it in two new halves.
    expect((await createPaddocksFromFences(fenced, undefined, userId)).enclosedAreas).toBe(1);
    await db()('paddocks').where({ property_id: fenced }).delete();
    const split = await createPaddocksFromFences(fenced, [...fenceIds, middle.id], userId);
    expect(split.paddocks.map((p) => p.name)).toEqual(['Paddock 1', 'Paddock 2']);
    for (const paddock of split.paddocks) expect(paddock.areaHa).toBeCloseTo(50, 0);
  });
});

describe('tracks', () => {
  it('deletes a track with an audit entry, and only the property\'s own', async () => {
    const { trackIds } = await storeImportedFile(propertyId, 'old.gpx', { format: 'gpx', lines: [{ name: 'Old fence', kind: 'track', coordinates: [sw, se], description: '' }], polygons: [], skipped: [] }, userId);
    const id = trackIds[0]!;
    await expect(deleteTrack(otherPropertyId, id, userId)).rejects.toBeInstanceOf(NotFoundError);
    await deleteTrack(propertyId, id, userId);
    await expect(getTrack(propertyId, id)).rejects.toBeInstanceOf(NotFoundError);
    expect((await listAuditForProperty(propertyId))[0]).toMatchObject({ action: 'track.delete', detail: { name: 'Old fence', sourceFile: 'old.gpx' } });
  });

  it('stores an imported paddock at version 1 with its change time', async () => {
    const { paddockIds } = await storeImportedFile(propertyId, 'plan.kml', { format: 'kml', lines: [], polygons: [{ name: 'Imported', rings: [[sw, se, ne, sw]], description: '' }], skipped: [] }, userId);
    const paddock = await getPaddock(propertyId, paddockIds[0]!);
    expect(paddock.version).toBe(1);
    expect(Date.parse(paddock.updatedAt)).toBeGreaterThan(Date.now() - 60_000);
  });
});
