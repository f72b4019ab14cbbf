import type { Knex } from 'knex';
import type { Member } from '../../schemas/property';
import type { Role } from '../../schemas/roles';
import { db } from '../db';
import { ConflictError, NotFoundError } from '../http';
import { recordAudit } from './audit-log';

type MemberRow = { user_id: number; email: string; name: string; role: Role; created_at: string };

function rowToMember(row: MemberRow): Member {
  return { userId: row.user_id, email: row.email, name: row.name, role: row.role, since: row.created_at };
}

/** The user's role on the property, or undefined when they are not a member. */
export async function findRole(propertyId: number, userId: number, trx: Knex = db()): Promise<Role | undefined> {
  const row = await trx('memberships').where({ property_id: propertyId, user_id: userId }).first('role');
  return row?.role as Role | undefined;
}

export async function listMembers(propertyId: number, trx: Knex = db()): Promise<Member[]> {
  const rows = await trx<MemberRow>('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where('m.property_id', propertyId)
    .orderByRaw("CASE m.role WHEN 'owner' THEN 0 WHEN 'manager' THEN 1 WHEN 'crew' THEN 2 ELSE 3 END")
    .orderBy('u.name')
    .select('m.user_id', 'u.email', 'u.name', 'm.role', 'm.created_at');
  return rows.map(rowToMember);
}

/** Adds a member (or changes the role of an existing one). */
export async function addMember(propertyId: number, userId: number, role: Role, byUserId: number | null, trx?: Knex): Promise<void> {
  const write = async (t: Knex) => {
    await t('memberships')
      .insert({ property_id: propertyId, user_id: userId, role, created_at: new Date().toISOString() })
      .onConflict(['property_id', 'user_id'])
      .merge({ role });
    await recordAudit({ propertyId, userId: byUserId, action: 'membership.add', entityType: 'user', entityId: userId, detail: { role } }, t);
  };
  if (trx) await write(trx);
  else await db().transaction(write);
}

/**
 * Changes a member's role; a property always keeps at least one owner.
 * @throws NotFoundError when the user is not a member, ConflictError for the last owner
 */
export async function changeRole(propertyId: number, userId: number, role: Role, byUserId: number): Promise<Member> {
  return db().transaction(async (trx) => {
    const current = await findRole(propertyId, userId, trx);
    if (!current) throw new NotFoundError('member');
    if (current === 'owner' && role !== 'owner') await assertAnotherOwner(propertyId, trx);
    await trx('memberships').where({ property_id: propertyId, user_id: userId }).update({ role });
    await recordAudit(
      { propertyId, userId: byUserId, action: 'membership.change_role', entityType: 'user', entityId: userId, detail: { from: current, to: role } },
      trx,
    );
    const members = await listMembers(propertyId, trx);
    return members.find((member) => member.userId === userId)!;
  });
}

/** @throws NotFoundError when the user is not a member, ConflictError for the last owner */
export async function removeMember(propertyId: number, userId: number, byUserId: number): Promise<void> {
  await db().transaction(async (trx) => {
    const current = await findRole(propertyId, userId, trx);
    if (!current) throw new NotFoundError('member');
    if (current === 'owner') await assertAnotherOwner(propertyId, trx);
    await trx('memberships').where({ property_id: propertyId, user_id: userId }).delete();
    await recordAudit({ propertyId, userId: byUserId, action: 'membership.remove', entityType: 'user', entityId: userId, detail: { role: current } }, trx);
  });
}

async function assertAnotherOwner(propertyId: number, trx: Knex): Promise<void> {
  const row = await trx('memberships').where({ property_id: propertyId, role: 'owner' }).count<{ n: number }[]>({ n: '*' });
  if (Number(row[0]?.n ?? 0) <= 1) {
    throw new ConflictError('A property needs at least one owner. Make someone else an owner first.');
  }
}

/** Whether the user is an owner or manager of any property (developer pages). */
export async function managesAnyProperty(userId: number, trx: Knex = db()): Promise<boolean> {
  return Boolean(await trx('memberships').where({ user_id: userId }).whereIn('role', ['owner', 'manager']).first('user_id'));
}
