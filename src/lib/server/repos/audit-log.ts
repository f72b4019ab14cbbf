import type { Knex } from 'knex';
import { CHANGE_GROUPS, type ChangeGroup } from '../../schemas/audit-log';
import { db } from '../db';

export type AuditEntry = {
  id: number;
  propertyId: number | null;
  userId: number | null;
  userName: string | null;
  action: string;
  entityType: string;
  entityId: string | null;
  /** The person an entry is about (memberships), when their account still exists. */
  subjectName: string | null;
  detail: Record<string, unknown>;
  createdAt: string;
};

export type NewAuditEntry = {
  propertyId?: number | null;
  userId?: number | null;
  action: string;
  entityType: string;
  entityId?: string | number | null;
  detail?: Record<string, unknown>;
};

type AuditRow = {
  id: number;
  property_id: number | null;
  user_id: number | null;
  user_name: string | null;
  action: string;
  entity_type: string;
  entity_id: string | null;
  detail: string;
  created_at: string;
  subject_name: string | null;
};

/** Records who did what; call inside the transaction that made the change. */
export async function recordAudit(entry: NewAuditEntry, trx: Knex = db()): Promise<void> {
  await trx('audit_log').insert(auditRow(entry));
}

/** The `audit_log` row of an entry (for writes made with `writeAtOnce`, through `insertRow`). */
export function auditRow(entry: NewAuditEntry): Record<string, unknown> {
  return {
    property_id: entry.propertyId ?? null,
    user_id: entry.userId ?? null,
    action: entry.action,
    entity_type: entry.entityType,
    entity_id: entry.entityId == null ? null : String(entry.entityId),
    detail: JSON.stringify(entry.detail ?? {}),
    created_at: new Date().toISOString(),
  };
}

export type AuditFilter = {
  /** Only actions of this change-log group (see CHANGE_GROUPS). */
  group?: ChangeGroup;
  userId?: number;
  /** Entries older than this id: the next page of a newest-first list. */
  beforeId?: number;
  limit?: number;
};

/** A property's entries, newest first, with who made them. */
export async function listAuditForProperty(propertyId: number, filter: AuditFilter = {}, trx: Knex = db()): Promise<AuditEntry[]> {
  const query = trx<AuditRow>('audit_log as a')
    .leftJoin('users as u', 'u.id', 'a.user_id')
    // Membership entries are about a person: name them rather than show an id.
    .leftJoin('users as s', function joinSubject() {
      this.on('a.entity_type', '=', trx.raw('?', ['user'])).andOn(trx.raw('s.id = cast(a.entity_id as integer)'));
    })
    .where('a.property_id', propertyId)
    .orderBy('a.id', 'desc')
    .limit(filter.limit ?? 200)
    .select('a.*', 'u.name as user_name', 's.name as subject_name');
  // The subject is the action up to its dot: `fence_line.update` → `fence_line`.
  if (filter.group) {
    const subjects = [...CHANGE_GROUPS[filter.group].subjects];
    query.whereRaw(`substr(a.action, 1, instr(a.action, '.') - 1) in (${subjects.map(() => '?').join(', ')})`, subjects);
  }
  if (filter.userId) query.where('a.user_id', filter.userId);
  if (filter.beforeId) query.where('a.id', '<', filter.beforeId);
  const rows = await query;
  return rows.map((row) => ({
    id: row.id,
    propertyId: row.property_id,
    userId: row.user_id,
    userName: row.user_name,
    action: row.action,
    entityType: row.entity_type,
    entityId: row.entity_id,
    subjectName: row.subject_name,
    detail: JSON.parse(row.detail) as Record<string, unknown>,
    createdAt: row.created_at,
  }));
}

/** Everyone who has an entry on the property, for the change log's "who" filter. */
export async function listAuditAuthors(propertyId: number, trx: Knex = db()): Promise<{ id: number; name: string }[]> {
  return trx('audit_log as a')
    .join('users as u', 'u.id', 'a.user_id')
    .where('a.property_id', propertyId)
    .distinct('u.id as id', 'u.name as name')
    .orderBy('u.name');
}
