import type { Knex } from 'knex';
import type { CreatePropertyInput, PropertySummary, UpdatePropertyInput } from '../../schemas/property';
import type { Role } from '../../schemas/roles';
import { db } from '../db';
import { ConflictError, NotFoundError } from '../http';
import { recordAudit } from './audit-log';

type PropertyRow = {
  id: number;
  name: string;
  region: string;
  crs: string;
  extent_west: number | null;
  extent_south: number | null;
  extent_east: number | null;
  extent_north: number | null;
  version: number;
  created_at: string;
  updated_at: string;
};

function rowToProperty(row: PropertyRow, role: Role): PropertySummary {
  const { extent_west: w, extent_south: s, extent_east: e, extent_north: n } = row;
  return {
    id: row.id,
    name: row.name,
    region: row.region,
    crs: row.crs,
    extentWgs84: w === null || s === null || e === null || n === null ? null : [w, s, e, n],
    version: row.version,
    role,
    createdAt: row.created_at,
    updatedAt: row.updated_at,
  };
}

/** Properties the user is a member of, with their role on each, newest first. */
export async function listPropertiesForUser(userId: number, trx: Knex = db()): Promise<PropertySummary[]> {
  const rows = await trx<PropertyRow & { role: Role }>('properties as p')
    .join('memberships as m', 'm.property_id', 'p.id')
    .where('m.user_id', userId)
    .orderBy('p.id', 'desc')
    .select('p.*', 'm.role');
  return rows.map((row) => rowToProperty(row, row.role));
}

/** One property as seen by a member with `role` (the caller has checked the membership). */
export async function getProperty(id: number, role: Role, trx: Knex = db()): Promise<PropertySummary> {
  const row = await trx<PropertyRow>('properties').where({ id }).first();
  if (!row) throw new NotFoundError('property');
  return rowToProperty(row, role);
}

/** Creates a property with its creator as owner, in one transaction. */
export async function createProperty(
  input: CreatePropertyInput & { extentWgs84?: [number, number, number, number] | null },
  ownerId: number,
): Promise<PropertySummary> {
  return db().transaction(async (trx) => {
    const now = new Date().toISOString();
    const [w, s, e, n] = input.extentWgs84 ?? [null, null, null, null];
    const [row] = await trx<PropertyRow>('properties')
      .insert({
        name: input.name,
        region: input.region,
        crs: input.crs,
        extent_west: w,
        extent_south: s,
        extent_east: e,
        extent_north: n,
        created_by: ownerId,
        created_at: now,
        updated_at: now,
      } as Partial<PropertyRow>)
      .returning('*');
    const property = row as PropertyRow;
    await trx('memberships').insert({ property_id: property.id, user_id: ownerId, role: 'owner', created_at: now });
    await recordAudit(
      { propertyId: property.id, userId: ownerId, action: 'property.create', entityType: 'property', entityId: property.id, detail: { name: input.name, crs: input.crs } },
      trx,
    );
    return rowToProperty(property, 'owner');
  });
}

/**
 * Changes a property's name, region or CRS. The caller sends the version it read; an edit made
 * on stale data is refused rather than silently overwriting someone else's change.
 * @throws ConflictError when the version is stale
 */
export async function updateProperty(id: number, input: UpdatePropertyInput, userId: number, role: Role): Promise<PropertySummary> {
  return db().transaction(async (trx) => {
    const { version, ...changes } = input;
    const updated = await trx('properties')
      .where({ id, version })
      .update({ ...changes, version: version + 1, updated_at: new Date().toISOString() });
    if (updated === 0) {
      await getProperty(id, role, trx);
      throw new ConflictError('Someone else changed this property since you opened it. Reload to see their change, then edit again.');
    }
    await recordAudit({ propertyId: id, userId, action: 'property.update', entityType: 'property', entityId: id, detail: changes }, trx);
    return getProperty(id, role, trx);
  });
}
