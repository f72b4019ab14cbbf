import { createHash, randomBytes } from 'node:crypto';
import type { Knex } from 'knex';
import type { FenceStatus } from '../../schemas/plan';
import { hasRole, type Role } from '../../schemas/roles';
import type {
  CreateWorkOrderInput,
  ItemState,
  SetItemStateInput,
  UpdateWorkOrderInput,
  WorkOrder,
  WorkOrderItem,
  WorkOrderStatus,
} from '../../schemas/work-order';
import { fenceStatusFromWork, orderStatusAfter, summariseProgress } from '../../work-orders/progress';
import { db } from '../db';
import { ConflictError, NotFoundError, ValidationError, type FieldErrors } from '../http';
import { recordAudit } from './audit-log';

type OrderRow = {
  id: number;
  property_id: number;
  title: string;
  notes: string;
  assignee_user_id: number | null;
  contractor_email: string | null;
  target_date: string | null;
  status: WorkOrderStatus;
  version: number;
  link_token_hash: string | null;
  link_expires_at: string | null;
  link_revoked_at: string | null;
  sent_at: string | null;
  created_by: number | null;
  updated_by: number | null;
  created_at: string;
  updated_at: string;
};

type ItemRow = {
  id: number;
  work_order_id: number;
  fence_line_id: number | null;
  crossing_id: number | null;
  position: number;
  state: ItemState;
  note: string;
  state_by: number | null;
  state_at: string | null;
};

/** The fence lines and crossings of a property, numbered as the plan exports number them (plan-numbering.ts). */
type PlanIndex = {
  fences: Map<number, { id: number; no: number; name: string; status: FenceStatus; lengthM: number }>;
  crossings: Map<number, { id: number; fenceLineId: number; tag: string; style: string | null; position: [number, number] }>;
};

async function planIndex(propertyId: number, trx: Knex): Promise<PlanIndex> {
  const fenceRows = await trx('fence_lines').where({ property_id: propertyId }).orderBy('id').select('id', 'name', 'status', 'length_m');
  const fences: PlanIndex['fences'] = new Map(
    fenceRows.map((row, i) => [row.id as number, { id: row.id, no: i + 1, name: row.name, status: row.status, lengthM: row.length_m }]),
  );
  const crossingRows: { id: number; fence_line_id: number; chainage_m: number; lon: number; lat: number; style: string | null }[] = await trx('crossings')
    .where({ property_id: propertyId })
    .orderBy([{ column: 'fence_line_id' }, { column: 'chainage_m' }, { column: 'id' }])
    .select('id', 'fence_line_id', 'chainage_m', 'lon', 'lat', 'design_style as style');
  const crossings: PlanIndex['crossings'] = new Map();
  const alongFence = new Map<number, number>();
  for (const row of crossingRows) {
    const no = (alongFence.get(row.fence_line_id) ?? 0) + 1;
    alongFence.set(row.fence_line_id, no);
    const fenceNo = fences.get(row.fence_line_id)?.no ?? 0;
    crossings.set(row.id, { id: row.id, fenceLineId: row.fence_line_id, tag: `F${fenceNo} X${no}`, style: row.style, position: [row.lon, row.lat] });
  }
  return { fences, crossings };
}

function rowToItem(row: ItemRow & { state_by_name: string | null }, index: PlanIndex): WorkOrderItem {
  const crossing = row.crossing_id === null ? undefined : index.crossings.get(row.crossing_id);
  const fenceLineId = crossing ? crossing.fenceLineId : row.fence_line_id!;
  const fence = index.fences.get(fenceLineId)!;
  return {
    id: row.id,
    kind: crossing ? 'crossing' : 'fence-line',
    fenceLineId,
    fenceName: fence.name,
    fenceStatus: fence.status,
    crossingId: crossing?.id ?? null,
    label: crossing ? `Crossing ${crossing.tag} on ${fence.name}` : `Fence line F${fence.no} ${fence.name}`,
    style: crossing?.style ?? null,
    lengthM: crossing ? null : fence.lengthM,
    position: crossing?.position ?? null,
    state: row.state,
    note: row.note,
    stateByName: row.state_by_name,
    stateAt: row.state_at,
  };
}

function rowToOrder(
  row: OrderRow & { assignee_name: string | null; created_by_name: string | null; updated_by_name: string | null },
  items: WorkOrderItem[],
  now: Date,
): WorkOrder {
  return {
    id: row.id,
    propertyId: row.property_id,
    title: row.title,
    notes: row.notes,
    assigneeUserId: row.assignee_user_id,
    assigneeName: row.assignee_name,
    contractorEmail: row.contractor_email,
    targetDate: row.target_date,
    status: row.status,
    version: row.version,
    sentAt: row.sent_at,
    link: row.link_expires_at
      ? { expiresAt: row.link_expires_at, revoked: row.link_revoked_at !== null, expired: Date.parse(row.link_expires_at) <= now.getTime() }
      : null,
    createdByName: row.created_by_name,
    updatedByName: row.updated_by_name,
    createdAt: row.created_at,
    updatedAt: row.updated_at,
    items,
    progress: summariseProgress(items.map((item) => item.state)),
  };
}

const selectOrders = (trx: Knex) =>
  trx<OrderRow>('work_orders as o')
    .leftJoin('users as a', 'a.id', 'o.assignee_user_id')
    .leftJoin('users as c', 'c.id', 'o.created_by')
    .leftJoin('users as u', 'u.id', 'o.updated_by')
    .select('o.*', 'a.name as assignee_name', 'c.name as created_by_name', 'u.name as updated_by_name');

async function ordersWithItems(propertyId: number, rows: Awaited<ReturnType<typeof selectOrders>>, trx: Knex, now: Date): Promise<WorkOrder[]> {
  if (rows.length === 0) return [];
  const index = await planIndex(propertyId, trx);
  const itemRows: (ItemRow & { state_by_name: string | null })[] = await trx('work_order_items as i')
    .leftJoin('users as s', 's.id', 'i.state_by')
    .whereIn(
      'i.work_order_id',
      rows.map((row) => row.id),
    )
    .orderBy([{ column: 'i.work_order_id' }, { column: 'i.position' }])
    .select('i.*', 's.name as state_by_name');
  return rows.map((row) =>
    rowToOrder(
      row,
      itemRows.filter((item) => item.work_order_id === row.id).map((item) => rowToItem(item, index)),
      now,
    ),
  );
}

/** The property's work orders, newest first, each with its items and progress. */
export async function listWorkOrders(propertyId: number, trx: Knex = db(), now = new Date()): Promise<WorkOrder[]> {
  const rows = await selectOrders(trx).where('o.property_id', propertyId).orderBy('o.id', 'desc');
  return ordersWithItems(propertyId, rows, trx, now);
}

/** @throws NotFoundError (also for another property's order) */
export async function getWorkOrder(propertyId: number, id: number, trx: Knex = db(), now = new Date()): Promise<WorkOrder> {
  const row = await selectOrders(trx).where({ 'o.id': id, 'o.property_id': propertyId }).first();
  if (!row) throw new NotFoundError('work order');
  return (await ordersWithItems(propertyId, [row], trx, now))[0]!;
}

/**
 * Checks who does the work and what the order holds, against the property: the assignee must be
 * a member who may mark work (crew or above), and every fence line and crossing must be the
 * property's and not retired. Problems come back per field, together.
 */
async function checkContents(
  propertyId: number,
  input: { assigneeUserId?: number | null; fenceLineIds?: number[]; crossingIds?: number[] },
  trx: Knex,
): Promise<void> {
  const fields: FieldErrors = {};
  if (input.assigneeUserId) {
    const member = await trx('memberships').where({ property_id: propertyId, user_id: input.assigneeUserId }).first('role');
    if (!member) fields.assigneeUserId = 'That person is not a member of this property. Invite them, or send the order to a contractor by e-mail.';
    else if (!hasRole(member.role as Role, 'crew')) fields.assigneeUserId = 'That member is a viewer and cannot mark work. Give them the crew role first, or choose someone else.';
  }
  if (input.fenceLineIds?.length) {
    if (new Set(input.fenceLineIds).size !== input.fenceLineIds.length) fields.fenceLineIds = 'A fence line is listed twice.';
    const found = await trx('fence_lines').where({ property_id: propertyId }).whereIn('id', input.fenceLineIds).select('id', 'name', 'status');
    const missing = input.fenceLineIds.filter((id) => !found.some((row) => row.id === id));
    const retired = found.filter((row) => row.status === 'retired');
    if (missing.length) fields.fenceLineIds = `No fence line ${missing.join(', ')} on this property. Reload the list and choose again.`;
    else if (retired.length) fields.fenceLineIds = `"${retired[0].name}" is retired; retired fence lines are not built.`;
  }
  if (input.crossingIds?.length) {
    if (new Set(input.crossingIds).size !== input.crossingIds.length) fields.crossingIds = 'A crossing is listed twice.';
    const found = await trx('crossings').where({ property_id: propertyId }).whereIn('id', input.crossingIds).pluck('id');
    const missing = input.crossingIds.filter((id) => !found.includes(id));
    if (missing.length) fields.crossingIds = `No crossing ${missing.join(', ')} on this property. Reload the list and choose again.`;
  }
  if (Object.keys(fields).length) throw new ValidationError(fields, 'The work order needs attention.');
}

async function writeItems(orderId: number, fenceLineIds: number[], crossingIds: number[], trx: Knex): Promise<void> {
  await trx('work_order_items').where({ work_order_id: orderId }).delete();
  const rows = [
    ...fenceLineIds.map((fenceLineId) => ({ fence_line_id: fenceLineId, crossing_id: null })),
    ...crossingIds.map((crossingId) => ({ fence_line_id: null, crossing_id: crossingId })),
  ].map((row, position) => ({ work_order_id: orderId, position, ...row }));
  if (rows.length) await trx('work_order_items').insert(rows);
}

export async function createWorkOrder(propertyId: number, input: CreateWorkOrderInput, userId: number): Promise<WorkOrder> {
  return db().transaction(async (trx) => {
    await checkContents(propertyId, input, trx);
    const now = new Date().toISOString();
    const [row] = await trx('work_orders')
      .insert({
        property_id: propertyId, title: input.title, notes: input.notes, assignee_user_id: input.assigneeUserId, contractor_email: input.contractorEmail,
        target_date: input.targetDate, status: 'draft', version: 1, created_by: userId, updated_by: userId, created_at: now, updated_at: now,
      })
      .returning('id');
    const id = (row as { id: number }).id;
    await writeItems(id, input.fenceLineIds, input.crossingIds, trx);
    await recordAudit(
      { propertyId, userId, action: 'work_order.create', entityType: 'work_order', entityId: id, detail: { title: input.title, fenceLineIds: input.fenceLineIds, crossingIds: input.crossingIds } },
      trx,
    );
    return getWorkOrder(propertyId, id, trx);
  });
}

/** Reads an order for a change and refuses a stale version (409), with nothing changed. */
export async function lockForChange(propertyId: number, id: number, version: number, trx: Knex): Promise<WorkOrder> {
  const order = await getWorkOrder(propertyId, id, trx);
  if (order.version !== version) {
    throw new ConflictError(`Someone changed "${order.title}" since you opened it (now version ${order.version}). Reload it to see their change, then try again.`);
  }
  return order;
}

/**
 * Changes a draft or sent order, cancels it (`status: 'cancelled'`) or withdraws its contractor
 * link (`revokeLink`). The items of a sent order stay as they are once work has been marked on
 * them; a done or cancelled order no longer changes.
 * @throws ConflictError on a stale version or an order that can no longer change, ValidationError
 */
export async function updateWorkOrder(propertyId: number, id: number, changes: UpdateWorkOrderInput, userId: number): Promise<WorkOrder> {
  return db().transaction(async (trx) => {
    const order = await lockForChange(propertyId, id, changes.version, trx);
    if (order.status === 'done' || order.status === 'cancelled') {
      throw new ConflictError(`"${order.title}" is ${order.status} and no longer changes. Make a new work order for more work.`);
    }
    const { version, status, revokeLink, fenceLineIds, crossingIds, ...fields } = changes;
    // One person does the work: naming a member clears the contractor, and the other way round.
    const assignee = fields.assigneeUserId !== undefined || fields.contractorEmail !== undefined;
    const nextAssignee = {
      assigneeUserId: fields.assigneeUserId !== undefined ? fields.assigneeUserId : fields.contractorEmail ? null : order.assigneeUserId,
      contractorEmail: fields.contractorEmail !== undefined ? fields.contractorEmail : fields.assigneeUserId ? null : order.contractorEmail,
    };
    const nextFences = fenceLineIds ?? order.items.filter((item) => item.kind === 'fence-line').map((item) => item.fenceLineId);
    const nextCrossings = crossingIds ?? order.items.filter((item) => item.kind === 'crossing').map((item) => item.crossingId!);
    const itemsChange = fenceLineIds !== undefined || crossingIds !== undefined;
    if (itemsChange) {
      if (nextFences.length + nextCrossings.length === 0) throw new ValidationError({ fenceLineIds: 'Choose at least one fence line or crossing.' }, 'The work order needs attention.');
      if (order.items.some((item) => item.state !== 'not-started')) {
        throw new ConflictError('Work has been marked on this order, so its fence lines and crossings stay as they are. Make a new work order for other work.');
      }
    }
    await checkContents(propertyId, { assigneeUserId: assignee ? nextAssignee.assigneeUserId : undefined, fenceLineIds: fenceLineIds, crossingIds: crossingIds }, trx);
    const now = new Date().toISOString();
    await trx('work_orders')
      .where({ id, version })
      .update({
        ...(fields.title !== undefined ? { title: fields.title } : {}),
        ...(fields.notes !== undefined ? { notes: fields.notes } : {}),
        ...(fields.targetDate !== undefined ? { target_date: fields.targetDate } : {}),
        assignee_user_id: nextAssignee.assigneeUserId,
        contractor_email: nextAssignee.contractorEmail,
        ...(status === 'cancelled' ? { status: 'cancelled' } : {}),
        // A contractor's link ends with the order, with a change of contractor, or when withdrawn.
        ...(revokeLink || status === 'cancelled' || (assignee && nextAssignee.contractorEmail !== order.contractorEmail) ? { link_revoked_at: now } : {}),
        version: version + 1,
        updated_by: userId,
        updated_at: now,
      });
    if (itemsChange) await writeItems(id, nextFences, nextCrossings, trx);
    const action = status === 'cancelled' ? 'work_order.cancel' : 'work_order.update';
    const changed = Object.keys(changes).filter((key) => key !== 'version');
    await recordAudit({ propertyId, userId, action, entityType: 'work_order', entityId: id, detail: { fields: changed } }, trx);
    if (status === 'cancelled') await moveFenceStatuses(propertyId, [...new Set(order.items.map((item) => item.fenceLineId))], id, userId, trx);
    return getWorkOrder(propertyId, id, trx);
  });
}

/** Deletes a draft or cancelled order; a sent or done one is a record of work and stays. */
export async function deleteWorkOrder(propertyId: number, id: number, userId: number): Promise<void> {
  await db().transaction(async (trx) => {
    const order = await getWorkOrder(propertyId, id, trx);
    if (order.status === 'sent' || order.status === 'done') {
      throw new ConflictError(`"${order.title}" has been sent, so it stays as a record of the work. Cancel it instead.`);
    }
    await trx('work_orders').where({ id }).delete();
    await recordAudit({ propertyId, userId, action: 'work_order.delete', entityType: 'work_order', entityId: id, detail: { title: order.title, status: order.status } }, trx);
  });
}

/** SHA-256 of a link token, hex: all the database keeps. */
export function hashLinkToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/**
 * Marks an order sent (from draft, or sent again), with a new contractor link when a contractor
 * does the work; the old link stops working. Returns the new token (only ever held in memory and
 * in the e-mail). Call inside the transaction that queues the e-mail.
 */
export async function markSent(
  order: WorkOrder,
  userId: number,
  linkExpiryMs: number,
  trx: Knex,
  now = new Date(),
): Promise<{ token: string | null; linkExpiresAt: Date | null }> {
  const token = order.contractorEmail ? randomBytes(32).toString('base64url') : null;
  const linkExpiresAt = token ? new Date(now.getTime() + linkExpiryMs) : null;
  const updated = await trx('work_orders')
    .where({ id: order.id, version: order.version })
    .update({
      status: 'sent',
      sent_at: now.toISOString(),
      link_token_hash: token ? hashLinkToken(token) : null,
      link_expires_at: linkExpiresAt?.toISOString() ?? null,
      link_revoked_at: null,
      version: order.version + 1,
      updated_by: userId,
      updated_at: now.toISOString(),
    });
  if (updated === 0) throw new ConflictError(`Someone changed "${order.title}" meanwhile. Reload it and send again.`);
  await recordAudit(
    {
      propertyId: order.propertyId, userId, action: 'work_order.send', entityType: 'work_order', entityId: order.id,
      detail: { to: order.contractorEmail ?? order.assigneeUserId, resent: order.sentAt !== null, linkExpiresAt: linkExpiresAt?.toISOString() ?? null },
    },
    trx,
  );
  return { token, linkExpiresAt };
}

export type LinkLookup = { state: 'valid' | 'expired' | 'revoked'; order: WorkOrder; propertyName: string };

/** The order a contractor's link opens, or undefined for a token that matches nothing. */
export async function findWorkOrderByToken(token: string, now = new Date(), trx: Knex = db()): Promise<LinkLookup | undefined> {
  const row = await trx('work_orders as o').join('properties as p', 'p.id', 'o.property_id').where('o.link_token_hash', hashLinkToken(token)).first('o.id', 'o.property_id', 'p.name');
  if (!row) return undefined;
  const order = await getWorkOrder(row.property_id, row.id, trx, now);
  const state = order.link?.revoked || order.status === 'cancelled' ? 'revoked' : order.link?.expired ? 'expired' : 'valid';
  return { state, order, propertyName: row.name };
}

/**
 * Sets one item's state with a note, as the person on the ground saw it; then the order's status
 * and the status of the fence line the item is on follow (progress.ts), all in one transaction.
 * @throws NotFoundError for another order's item, ConflictError when the order is not out for work
 */
export async function setItemState(
  propertyId: number,
  orderId: number,
  itemId: number,
  input: SetItemStateInput,
  userId: number,
): Promise<{ order: WorkOrder; fenceStatus: { fenceLineId: number; from: FenceStatus; to: FenceStatus } | null }> {
  return db().transaction(async (trx) => {
    const order = await getWorkOrder(propertyId, orderId, trx);
    const item = order.items.find((candidate) => candidate.id === itemId);
    if (!item) throw new NotFoundError('item on this work order');
    if (order.status === 'draft') throw new ConflictError('This work order has not been sent yet, so no work can be marked on it.');
    if (order.status === 'cancelled') throw new ConflictError('This work order was cancelled, so no work can be marked on it.');
    const now = new Date().toISOString();
    await trx('work_order_items').where({ id: itemId }).update({ state: input.state, note: input.note, state_by: userId, state_at: now });
    const states = order.items.map((candidate) => (candidate.id === itemId ? input.state : candidate.state));
    const status = orderStatusAfter(order.status, states);
    await trx('work_orders').where({ id: orderId }).update({ status, version: order.version + 1, updated_by: userId, updated_at: now });
    await recordAudit(
      {
        propertyId, userId, action: 'work_order.item_state', entityType: 'work_order_item', entityId: itemId,
        detail: { workOrderId: orderId, label: item.label, from: item.state, to: input.state, note: input.note, ...(status !== order.status ? { orderStatus: status } : {}) },
      },
      trx,
    );
    const [moved] = await moveFenceStatuses(propertyId, [item.fenceLineId], orderId, userId, trx);
    return { order: await getWorkOrder(propertyId, orderId, trx), fenceStatus: moved ?? null };
  });
}

/**
 * Brings the status of fence lines in line with the work on them across the property's live
 * (sent or done) orders, bumping each changed line's version so an editor holding the old one
 * reloads, and auditing each move.
 */
async function moveFenceStatuses(propertyId: number, fenceLineIds: number[], orderId: number, userId: number, trx: Knex) {
  const moved: { fenceLineId: number; from: FenceStatus; to: FenceStatus }[] = [];
  for (const fenceLineId of fenceLineIds) {
    const fence = await trx('fence_lines').where({ id: fenceLineId, property_id: propertyId }).first('status', 'version', 'name');
    if (!fence) continue;
    const live: { fence_line_id: number | null; state: ItemState }[] = await trx('work_order_items as i')
      .join('work_orders as o', 'o.id', 'i.work_order_id')
      .leftJoin('crossings as c', 'c.id', 'i.crossing_id')
      .where('o.property_id', propertyId)
      .whereIn('o.status', ['sent', 'done'])
      .where((where) => where.where('i.fence_line_id', fenceLineId).orWhere('c.fence_line_id', fenceLineId))
      .select('i.fence_line_id', 'i.state');
    const to = fenceStatusFromWork(fence.status, { wholeFenceOrdered: live.some((row) => row.fence_line_id === fenceLineId), states: live.map((row) => row.state) });
    if (to === fence.status) continue;
    await trx('fence_lines').where({ id: fenceLineId }).update({ status: to, version: fence.version + 1, updated_at: new Date().toISOString() });
    await recordAudit(
      { propertyId, userId, action: 'fence_line.status', entityType: 'fence_line', entityId: fenceLineId, detail: { name: fence.name, from: fence.status, to, workOrderId: orderId } },
      trx,
    );
    moved.push({ fenceLineId, from: fence.status, to });
  }
  return moved;
}

/** Progress of every order of a property, and of all its live orders together. */
export async function propertyProgress(propertyId: number, trx: Knex = db()) {
  const orders = await listWorkOrders(propertyId, trx);
  const live = orders.filter((order) => order.status === 'sent' || order.status === 'done');
  return {
    orders: orders.map((order) => ({ id: order.id, title: order.title, status: order.status, targetDate: order.targetDate, progress: order.progress })),
    live: summariseProgress(live.flatMap((order) => order.items.map((item) => item.state))),
    byStatus: Object.fromEntries((['draft', 'sent', 'done', 'cancelled'] as const).map((status) => [status, orders.filter((order) => order.status === status).length])),
  };
}

/** What the create form offers: the property's fence lines (not retired) and crossings, numbered as the exports number them. */
export async function orderChoices(propertyId: number, trx: Knex = db()) {
  const index = await planIndex(propertyId, trx);
  const fences = [...index.fences.values()].filter((fence) => fence.status !== 'retired');
  return {
    fenceLines: fences.map((fence) => ({ id: fence.id, label: `F${fence.no} ${fence.name}`, status: fence.status, lengthM: fence.lengthM })),
    crossings: [...index.crossings.values()]
      .filter((crossing) => index.fences.get(crossing.fenceLineId)?.status !== 'retired')
      .map((crossing) => ({ id: crossing.id, label: `${crossing.tag} on ${index.fences.get(crossing.fenceLineId)!.name}`, style: crossing.style })),
  };
}
