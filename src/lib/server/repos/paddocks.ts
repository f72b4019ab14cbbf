import { booleanPointInPolygon, polygon } from '@turf/turf';
import type { Knex } from 'knex';
import { boundsOf, orientRing, polygonAreaHa } from '../../geo/measure';
import { paddocksFromFences } from '../../geo/paddocks-from-fences';
import type { Paddock, PaddockInput, PaddocksFromFencesResult, PaddockUpdate } from '../../schemas/paddock';
import { db } from '../db';
import { ConflictError, NotFoundError, ValidationError } from '../http';
import { recordAudit } from './audit-log';

type PaddockRow = { id: number; property_id: number; name: string; geometry: string; area_ha: number; version: number; updated_at: string };

const rowToPaddock = (row: PaddockRow): Paddock => ({
  id: row.id,
  name: row.name,
  rings: (JSON.parse(row.geometry) as { coordinates: [number, number][][] }).coordinates,
  areaHa: row.area_ha,
  version: row.version,
  updatedAt: row.updated_at,
});

/** The stored form of a boundary: outer ring counterclockwise, holes clockwise (RFC 7946), geodesic area, bounds. */
export function paddockGeometryColumns(rings: readonly (readonly (readonly [number, number])[])[]) {
  const oriented = rings.map((ring, i) => orientRing(ring, i === 0));
  const [minLon, minLat, maxLon, maxLat] = boundsOf(oriented[0]!);
  return {
    geometry: JSON.stringify({ type: 'Polygon', coordinates: oriented }),
    area_ha: polygonAreaHa(oriented),
    min_lon: minLon,
    min_lat: minLat,
    max_lon: maxLon,
    max_lat: maxLat,
  };
}

export async function listPaddocks(propertyId: number, trx: Knex = db()): Promise<Paddock[]> {
  return (await trx<PaddockRow>('paddocks').where({ property_id: propertyId }).orderBy('id')).map(rowToPaddock);
}

/** @throws NotFoundError (also for another property's paddock) */
export async function getPaddock(propertyId: number, id: number, trx: Knex = db()): Promise<Paddock> {
  const row = await trx<PaddockRow>('paddocks').where({ id, property_id: propertyId }).first();
  if (!row) throw new NotFoundError('paddock');
  return rowToPaddock(row);
}

/** Stores a paddock whose rings have been checked (`paddockInputSchema`), with its audit entry. */
export async function createPaddock(propertyId: number, input: PaddockInput, userId: number | null, trx?: Knex): Promise<Paddock> {
  const write = async (t: Knex) => {
    const now = new Date().toISOString();
    const [row] = await t('paddocks')
      .insert({ property_id: propertyId, name: input.name, ...paddockGeometryColumns(input.rings), version: 1, created_at: now, updated_at: now })
      .returning('*');
    const paddock = rowToPaddock(row as PaddockRow);
    await recordAudit({ propertyId, userId, action: 'paddock.create', entityType: 'paddock', entityId: paddock.id, detail: { name: paddock.name, areaHa: paddock.areaHa } }, t);
    return paddock;
  };
  return trx ? write(trx) : db().transaction(write);
}

/**
 * Renames a paddock or redraws its boundary; the caller sends the version it read, and an edit
 * made on stale data is refused (409) with nothing changed.
 */
export async function updatePaddock(propertyId: number, id: number, changes: PaddockUpdate, userId: number): Promise<Paddock> {
  return db().transaction(async (trx) => {
    const current = await getPaddock(propertyId, id, trx);
    if (current.version !== changes.version) {
      throw new ConflictError(`Someone changed "${current.name}" since you opened it (now version ${current.version}). Reload it to see their change, then edit again.`);
    }
    await trx('paddocks')
      .where({ id, property_id: propertyId, version: changes.version })
      .update({
        ...(changes.name === undefined ? {} : { name: changes.name }),
        ...(changes.rings === undefined ? {} : paddockGeometryColumns(changes.rings)),
        version: changes.version + 1,
        updated_at: new Date().toISOString(),
      });
    const { version: _version, ...changed } = changes;
    await recordAudit({ propertyId, userId, action: 'paddock.update', entityType: 'paddock', entityId: id, detail: { fields: Object.keys(changed) } }, trx);
    return getPaddock(propertyId, id, trx);
  });
}

/**
 * Deletes a paddock. With `version`, the one the caller read, a deletion made on stale data is
 * refused (409) with nothing changed.
 * @throws NotFoundError, ConflictError
 */
export async function deletePaddock(propertyId: number, id: number, userId: number, version?: number): Promise<void> {
  await db().transaction(async (trx) => {
    const paddock = await getPaddock(propertyId, id, trx);
    if (version !== undefined && paddock.version !== version) {
      throw new ConflictError(`Someone changed "${paddock.name}" since you opened it (now version ${paddock.version}). Reload it to see their change, then delete it if you still mean to.`);
    }
    await trx('paddocks').where({ id, property_id: propertyId }).delete();
    await recordAudit({ propertyId, userId, action: 'paddock.delete', entityType: 'paddock', entityId: id, detail: { name: paddock.name } }, trx);
  });
}

/**
 * Makes a paddock of every area the fence lines close off (`paddocksFromFences`, ends within
 * 5 m joined) unless a paddock already holds a point inside it. Uses the given fence lines, or
 * every one that is not retired. All the paddocks are made in one transaction, each with its
 * audit entry, and named "Paddock <n>" after the property's paddocks already there.
 * @throws ValidationError naming `fenceLineIds` when one is not a fence line of this property
 */
export async function createPaddocksFromFences(propertyId: number, fenceLineIds: number[] | undefined, userId: number): Promise<PaddocksFromFencesResult> {
  return db().transaction(async (trx) => {
    const query = trx('fence_lines').where({ property_id: propertyId });
    const rows = (await (fenceLineIds ? query.whereIn('id', fenceLineIds) : query.whereNot({ status: 'retired' })).select('id', 'geometry')) as { id: number; geometry: string }[];
    const missing = (fenceLineIds ?? []).filter((id) => !rows.some((row) => row.id === id));
    if (missing.length) throw new ValidationError({ fenceLineIds: `No fence line with id ${missing.join(', ')} on this property.` });
    const areas = paddocksFromFences(rows.map((row) => (JSON.parse(row.geometry) as { coordinates: [number, number][] }).coordinates));
    const existing = (await listPaddocks(propertyId, trx)).map((paddock) => polygon(paddock.rings));
    const fresh = areas.filter((area) => !existing.some((paddock) => booleanPointInPolygon(area.insidePoint, paddock)));
    const names = new Set((await trx('paddocks').where({ property_id: propertyId }).pluck('name')) as string[]);
    const paddocks: Paddock[] = [];
    let n = 0;
    for (const area of fresh) {
      do n += 1;
      while (names.has(`Paddock ${n}`));
      paddocks.push(await createPaddock(propertyId, { name: `Paddock ${n}`, rings: area.rings }, userId, trx));
    }
    const detail = { fenceLines: rows.length, enclosedAreas: areas.length, paddockIds: paddocks.map((paddock) => paddock.id) };
    await recordAudit({ propertyId, userId, action: 'paddock.from_fences', entityType: 'paddock', entityId: null, detail }, trx);
    return { paddocks, enclosedAreas: areas.length, alreadyCovered: areas.length - fresh.length };
  });
}

/**
 * Stores paddocks read from a file (rings turned to RFC 7946 winding, area on the ellipsoid); the
 * caller records the audit entry, in the same transaction.
 */
export async function createPaddocks(propertyId: number, paddocks: readonly { name: string; rings: [number, number][][] }[], trx: Knex): Promise<number[]> {
  const now = new Date().toISOString();
  const ids: number[] = [];
  for (const paddock of paddocks) {
    const [row] = await trx('paddocks')
      .insert({ property_id: propertyId, name: paddock.name.slice(0, 120), ...paddockGeometryColumns(paddock.rings), version: 1, created_at: now, updated_at: now })
      .returning('id');
    ids.push((row as { id: number }).id);
  }
  return ids;
}
