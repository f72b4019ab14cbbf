import type { Knex } from 'knex';
import { db } from '../db';

export type AuditEntry = {
  id: number;
  propertyId: number | null;
  userId: number | null;
  userName: string | null;
  action: string;
  entityType: string;
  entityId: string | null;
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
};

/** Records who did what; call inside the transaction that made the change. */
export async function recordAudit(entry: NewAuditEntry, trx: Knex = db()): Promise<void> {
  await trx('audit_log').insert({
    property_id: entry.propertyId ?? null,
    user_id: entry.userId ?? null,
    action: entry.action,
    entity_type: entry.entityType,
    entity_id: entry.entityId == null ? null : String(entry.entityId),
    detail: JSON.stringify(entry.detail ?? {}),
    created_at: new Date().toISOString(),
  });
}

export async function listAuditForProperty(propertyId: number, limit = 200, trx: Knex = db()): Promise<AuditEntry[]> {
  const rows = await trx<AuditRow>('audit_log as a')
    .leftJoin('users as u', 'u.id', 'a.user_id')
    .where('a.property_id', propertyId)
    .orderBy('a.id', 'desc')
    .limit(limit)
    .select('a.*', 'u.name as user_name');
  return rows.map((row) => ({
    id: row.id,
    propertyId: row.property_id,
    userId: row.user_id,
    userName: row.user_name,
    action: row.action,
    entityType: row.entity_type,
    entityId: row.entity_id,
    detail: JSON.parse(row.detail) as Record<string, unknown>,
    createdAt: row.created_at,
  }));
}
