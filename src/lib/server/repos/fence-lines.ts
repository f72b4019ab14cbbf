import type { Knex } from 'knex';
import { boundsOf, lineLengthM } from '../../geo/measure';
import { fenceLineSchemas, wireSpecSchema, type FenceLine, type FenceLineInput, type FenceStatus } from '../../schemas/plan';
import { checkFenceLine, cleanFenceLine } from '../../crossings/geometry/fence-checks';
import { getConfig } from '../config';
import { db, insertRow, updateRows, writeAtOnce } from '../db';
import { ConflictError, NotFoundError, ValidationError } from '../http';
import { auditRow, recordAudit } from './audit-log';

type FenceRow = {
  id: number;
  property_id: number;
  name: string;
  status: FenceStatus;
  geometry: string;
  length_m: number;
  wire_spec: string;
  version: number;
  updated_at: string;
};

function rowToFence(row: FenceRow): FenceLine {
  return {
    id: row.id,
    name: row.name,
    status: row.status,
    coordinates: (JSON.parse(row.geometry) as { coordinates: [number, number][] }).coordinates,
    lengthM: row.length_m,
    // Through the schema, so a row stored with fewer fields (older rows, hand-made ones) gets the defaults.
    wireSpec: wireSpecSchema.parse(JSON.parse(row.wire_spec)),
    version: row.version,
    updatedAt: row.updated_at,
  };
}

/**
 * A fence line's vertices made usable: repeated vertices (a double click) are dropped; a line
 * that crosses itself or has fewer than two distinct points is refused with where and why.
 * @throws ValidationError naming `coordinates`
 */
export function usableFenceCoordinates(coordinates: [number, number][]): [number, number][] {
  const cleaned = cleanFenceLine(coordinates);
  const problems = checkFenceLine(cleaned).filter((problem) => problem.code !== 'repeated-vertex');
  if (problems.length) throw new ValidationError({ coordinates: problems.map((problem) => problem.message).join(' ') }, 'The fence line cannot be used as drawn.');
  return cleaned;
}

function geometryColumns(coordinates: [number, number][]) {
  const [minLon, minLat, maxLon, maxLat] = boundsOf(coordinates);
  return {
    geometry: JSON.stringify({ type: 'LineString', coordinates }),
    length_m: lineLengthM(coordinates),
    min_lon: minLon,
    min_lat: minLat,
    max_lon: maxLon,
    max_lat: maxLat,
  };
}

export async function listFenceLines(propertyId: number, trx: Knex = db()): Promise<FenceLine[]> {
  return (await trx<FenceRow>('fence_lines').where({ property_id: propertyId }).orderBy('id')).map(rowToFence);
}

/** @throws NotFoundError (also for another property's fence line) */
export async function getFenceLine(propertyId: number, id: number, trx: Knex = db()): Promise<FenceLine> {
  const row = await trx<FenceRow>('fence_lines').where({ id, property_id: propertyId }).first();
  if (!row) throw new NotFoundError('fence line');
  return rowToFence(row);
}

/** The fence line schemas with the server's vertex limit (MAX_FENCE_VERTICES). */
export function serverFenceLineSchemas() {
  const maxVertices = getConfig().maxFenceVertices;
  if (schemas?.maxVertices !== maxVertices) schemas = { maxVertices, ...fenceLineSchemas(maxVertices) };
  return schemas;
}
let schemas: (ReturnType<typeof fenceLineSchemas> & { maxVertices: number }) | undefined;

/**
 * Refuses adding `adding` fence lines to a property that would then hold more than
 * MAX_FENCE_LINES_PER_PROPERTY.
 * @throws ConflictError (409) saying how many there are and what to do
 */
export async function checkRoomForFenceLines(propertyId: number, adding: number, trx: Knex = db()): Promise<void> {
  const max = getConfig().maxFenceLinesPerProperty;
  const [row] = await trx('fence_lines').where({ property_id: propertyId }).count<{ n: number }[]>({ n: '*' });
  const count = Number(row?.n ?? 0);
  if (count + adding <= max) return;
  const what = adding === 1 ? 'another fence line' : `${adding} fence lines`;
  throw new ConflictError(
    `This property has ${count} fence line${count === 1 ? '' : 's'} and holds at most ${max}, so ${what} cannot be added. Delete fence lines that are no longer needed (retired ones, for example) and try again.`,
  );
}

/** @throws ConflictError when the property already holds MAX_FENCE_LINES_PER_PROPERTY fence lines */
export async function createFenceLine(propertyId: number, input: FenceLineInput, userId: number | null, trx?: Knex): Promise<FenceLine> {
  const write = async (t: Knex) => {
    await checkRoomForFenceLines(propertyId, 1, t);
    const now = new Date().toISOString();
    const [row] = await t<FenceRow>('fence_lines')
      .insert({
        property_id: propertyId,
        name: input.name,
        status: input.status,
        wire_spec: JSON.stringify(input.wireSpec),
        ...geometryColumns(usableFenceCoordinates(input.coordinates)),
        created_by: userId,
        created_at: now,
        updated_at: now,
      } as Partial<FenceRow>)
      .returning('*');
    const fence = rowToFence(row as FenceRow);
    await recordAudit({ propertyId, userId, action: 'fence_line.create', entityType: 'fence_line', entityId: fence.id, detail: { name: fence.name } }, t);
    return fence;
  };
  return trx ? write(trx) : db().transaction(write);
}

/**
 * Changes a fence line; the caller sends the version it read, and an edit made on stale data is
 * refused (409) with nothing changed.
 */
export async function updateFenceLine(
  propertyId: number,
  id: number,
  changes: Partial<FenceLineInput> & { version: number },
  userId: number,
): Promise<FenceLine> {
  const conflict = (version: number, name: string) =>
    new ConflictError(`Someone changed "${name}" since you opened it (now version ${version}). Reload it to see their change, then edit again.`);
  const current = await getFenceLine(propertyId, id);
  if (current.version !== changes.version) throw conflict(current.version, current.name);
  const merged = serverFenceLineSchemas().input.parse({ ...current, ...changes });
  const { version: _version, ...changed } = changes;
  // The update holds only if the version is still the one read; the audit entry goes with it.
  const saved = await writeAtOnce((connection) => {
    const row = {
      name: merged.name,
      status: merged.status,
      wire_spec: JSON.stringify(merged.wireSpec),
      ...geometryColumns(usableFenceCoordinates(merged.coordinates)),
      version: changes.version + 1,
      updated_at: new Date().toISOString(),
    };
    if (updateRows(connection, 'fence_lines', row, { id, property_id: propertyId, version: changes.version }).changes === 0) return false;
    insertRow(connection, 'audit_log', auditRow({ propertyId, userId, action: 'fence_line.update', entityType: 'fence_line', entityId: id, detail: { fields: Object.keys(changed) } }));
    return true;
  });
  if (!saved) {
    const now = await getFenceLine(propertyId, id);
    throw conflict(now.version, now.name);
  }
  return getFenceLine(propertyId, id);
}

/**
 * Deletes a fence line (its crossings and work order items go with it). With `version`, the one
 * the caller read, a deletion made on stale data is refused (409) with nothing changed.
 * @throws NotFoundError, ConflictError
 */
export async function deleteFenceLine(propertyId: number, id: number, userId: number, version?: number): Promise<void> {
  await db().transaction(async (trx) => {
    const fence = await getFenceLine(propertyId, id, trx);
    if (version !== undefined && fence.version !== version) {
      throw new ConflictError(`Someone changed "${fence.name}" since you opened it (now version ${fence.version}). Reload it to see their change, then delete it if you still mean to.`);
    }
    await trx('fence_lines').where({ id, property_id: propertyId }).delete();
    await recordAudit({ propertyId, userId, action: 'fence_line.delete', entityType: 'fence_line', entityId: id, detail: { name: fence.name } }, trx);
  });
}
