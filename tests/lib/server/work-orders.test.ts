import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db, ensureMigrated } from '../../../src/lib/server/db';
import { ConflictError, NotFoundError, ValidationError } from '../../../src/lib/server/http';
import { createFenceLine } from '../../../src/lib/server/repos/fence-lines';
import { addMember } from '../../../src/lib/server/repos/memberships';
import { createProperty } from '../../../src/lib/server/repos/properties';
import { createUser } from '../../../src/lib/server/repos/users';
import {
  createWorkOrder,
  deleteWorkOrder,
  findWorkOrderByToken,
  getWorkOrder,
  listWorkOrders,
  markSent,
  propertyProgress,
  setItemState,
  updateWorkOrder,
} from '../../../src/lib/server/repos/work-orders';
import { fenceLineInputSchema } from '../../../src/lib/schemas/plan';
import { createWorkOrderSchema } from '../../../src/lib/schemas/work-order';

let ownerId = 0;
let crewId = 0;
let viewerId = 0;
let propertyId = 0;
let otherPropertyId = 0;

/** A fence line of the property, and a crossing row on it (as the analysis stores one). */
async function fenceWithCrossing(name: string, status: 'planned' | 'approved' = 'approved', onProperty = propertyId) {
  const fence = await createFenceLine(onProperty, fenceLineInputSchema.parse({ name, status, coordinates: [[141.64, -31.44], [141.65, -31.44]] }), ownerId);
  const [crossing] = await db()('crossings')
    .insert({ property_id: onProperty, fence_line_id: fence.id, kind: 'crossing', lon: 141.645, lat: -31.44, chainage_m: 475, design_status: 'pending' })
    .returning('id');
  return { fenceId: fence.id, crossingId: (crossing as { id: number }).id };
}

const input = (fields: Record<string, unknown>) => createWorkOrderSchema.parse({ title: 'Creek paddock fence', ...fields });

async function sent(orderId: number, contractor = false) {
  const order = await getWorkOrder(propertyId, orderId);
  if (contractor) await updateWorkOrder(propertyId, orderId, { version: order.version, contractorEmail: 'fencer@contract.example' }, ownerId);
  const current = await getWorkOrder(propertyId, orderId);
  return db().transaction((trx) => markSent(current, ownerId, 86_400_000, trx));
}

beforeAll(async () => {
  await ensureMigrated();
  ownerId = (await createUser({ email: 'wo-owner@test.example', name: 'Owner', passwordHash: 'h' })).id;
  crewId = (await createUser({ email: 'wo-crew@test.example', name: 'Crew', passwordHash: 'h' })).id;
  viewerId = (await createUser({ email: 'wo-viewer@test.example', name: 'Viewer', passwordHash: 'h' })).id;
  propertyId = (await createProperty({ name: 'Orders Downs', region: '', crs: 'EPSG:7854' }, ownerId)).id;
  otherPropertyId = (await createProperty({ name: 'Elsewhere', region: '', crs: 'EPSG:7854' }, ownerId)).id;
  await addMember(propertyId, crewId, 'crew', ownerId);
  await addMember(propertyId, viewerId, 'viewer', ownerId);
});
afterAll(closeDb);

describe('work orders repository', () => {
  it('creates a draft with its items in order, labelled as the exports number them, and audits it', async () => {
    const a = await fenceWithCrossing('North boundary');
    const order = await createWorkOrder(propertyId, input({ assigneeUserId: crewId, fenceLineIds: [a.fenceId], crossingIds: [a.crossingId], targetDate: '2027-03-01' }), ownerId);
    expect(order).toMatchObject({ status: 'draft', version: 1, assigneeName: 'Crew', targetDate: '2027-03-01', link: null });
    expect(order.items.map((item) => [item.kind, item.state])).toEqual([['fence-line', 'not-started'], ['crossing', 'not-started']]);
    expect(order.items[1]!.label).toMatch(/^Crossing F\d+ X1 on North boundary$/);
    expect(order.progress).toMatchObject({ total: 2, done: 0, percentDone: 0 });
    const audit = await db()('audit_log').where({ property_id: propertyId, entity_type: 'work_order', entity_id: String(order.id) }).pluck('action');
    expect(audit).toEqual(['work_order.create']);
  });

  it("refuses another property's fence line or crossing, a viewer as assignee, and stores nothing", async () => {
    const elsewhere = await fenceWithCrossing('Elsewhere fence', 'approved', otherPropertyId);
    const before = await db()('work_orders').count<{ n: number }[]>({ n: '*' });
    const refused = createWorkOrder(propertyId, input({ assigneeUserId: viewerId, fenceLineIds: [elsewhere.fenceId], crossingIds: [elsewhere.crossingId] }), ownerId);
    await expect(refused).rejects.toBeInstanceOf(ValidationError);
    const error = (await refused.catch((e: unknown) => e)) as ValidationError;
    expect(Object.keys(error.fields!).sort()).toEqual(['assigneeUserId', 'crossingIds', 'fenceLineIds']);
    expect(await db()('work_orders').count<{ n: number }[]>({ n: '*' })).toEqual(before);
  });

  it('holds one assignee: naming a member clears the contractor and the other way round, and either can be cleared', async () => {
    const a = await fenceWithCrossing('Assignee fence');
    const order = await createWorkOrder(propertyId, input({ contractorEmail: 'fencer@contract.example', fenceLineIds: [a.fenceId] }), ownerId);
    const member = await updateWorkOrder(propertyId, order.id, { version: 1, assigneeUserId: crewId }, ownerId);
    expect([member.assigneeUserId, member.contractorEmail]).toEqual([crewId, null]);
    const contractor = await updateWorkOrder(propertyId, order.id, { version: 2, contractorEmail: 'other@contract.example' }, ownerId);
    expect([contractor.assigneeUserId, contractor.contractorEmail]).toEqual([null, 'other@contract.example']);
    const nobody = await updateWorkOrder(propertyId, order.id, { version: 3, contractorEmail: null }, ownerId);
    expect([nobody.assigneeUserId, nobody.contractorEmail]).toEqual([null, null]);
  });

  it('refuses a stale edit and leaves the order as it was', async () => {
    const a = await fenceWithCrossing('Stale fence');
    const order = await createWorkOrder(propertyId, input({ fenceLineIds: [a.fenceId] }), ownerId);
    await updateWorkOrder(propertyId, order.id, { version: 1, title: 'First edit' }, ownerId);
    await expect(updateWorkOrder(propertyId, order.id, { version: 1, title: 'Lost edit' }, crewId)).rejects.toBeInstanceOf(ConflictError);
    expect((await getWorkOrder(propertyId, order.id)).title).toBe('First edit');
    await expect(getWorkOrder(otherPropertyId, order.id)).rejects.toBeInstanceOf(NotFoundError);
  });

  it('no work is marked on a draft; once sent, a started item makes the fence building, and all done makes it built and the order done', async () => {
    const a = await fenceWithCrossing('Creek crossing fence', 'approved');
    const order = await createWorkOrder(propertyId, input({ assigneeUserId: crewId, fenceLineIds: [a.fenceId], crossingIds: [a.crossingId] }), ownerId);
    const [fenceItem, crossingItem] = order.items;
    await expect(setItemState(propertyId, order.id, fenceItem!.id, { state: 'started', note: '' }, crewId)).rejects.toBeInstanceOf(ConflictError);
    await sent(order.id);

    const started = await setItemState(propertyId, order.id, crossingItem!.id, { state: 'started', note: 'Holes dug' }, crewId);
    expect(started.fenceStatus).toEqual({ fenceLineId: a.fenceId, from: 'approved', to: 'building' });
    expect(started.order.items[1]).toMatchObject({ state: 'started', note: 'Holes dug', stateByName: 'Crew' });

    const one = await setItemState(propertyId, order.id, crossingItem!.id, { state: 'done', note: '' }, crewId);
    expect(one.fenceStatus).toBeNull();
    expect(one.order.status).toBe('sent');
    const all = await setItemState(propertyId, order.id, fenceItem!.id, { state: 'done', note: '' }, crewId);
    expect(all.fenceStatus).toEqual({ fenceLineId: a.fenceId, from: 'building', to: 'built' });
    expect(all.order).toMatchObject({ status: 'done', progress: { done: 2, percentDone: 100 } });
    const fence = await db()('fence_lines').where({ id: a.fenceId }).first('status', 'version');
    expect(fence).toEqual({ status: 'built', version: 3 });

    const reopened = await setItemState(propertyId, order.id, fenceItem!.id, { state: 'blocked', note: 'Wire snapped' }, crewId);
    expect(reopened.order.status).toBe('sent');
    expect(reopened.fenceStatus?.to).toBe('building');

    const actions = await db()('audit_log').where({ property_id: propertyId }).whereIn('action', ['work_order.item_state', 'fence_line.status', 'work_order.send']).pluck('action');
    expect(actions.filter((a) => a === 'work_order.item_state')).toHaveLength(4);
    expect(actions.filter((a) => a === 'fence_line.status')).toHaveLength(3);
    expect(actions).toContain('work_order.send');
  });

  it('an item of another order answers not found', async () => {
    const a = await fenceWithCrossing('Two orders fence');
    const first = await createWorkOrder(propertyId, input({ fenceLineIds: [a.fenceId] }), ownerId);
    const second = await createWorkOrder(propertyId, input({ crossingIds: [a.crossingId] }), ownerId);
    await sent(second.id);
    await expect(setItemState(propertyId, second.id, first.items[0]!.id, { state: 'done', note: '' }, crewId)).rejects.toBeInstanceOf(NotFoundError);
  });

  it("a contractor's link opens the order until it expires, and not after it is withdrawn or the order cancelled", async () => {
    const a = await fenceWithCrossing('Contract fence');
    const order = await createWorkOrder(propertyId, input({ fenceLineIds: [a.fenceId] }), ownerId);
    const { token, linkExpiresAt } = await sent(order.id, true);
    expect(token).toMatch(/^[\w-]{43}$/);
    expect((await db()('work_orders').where({ id: order.id }).first('link_token_hash')).link_token_hash).not.toContain(token!);
    expect((await findWorkOrderByToken(token!))?.state).toBe('valid');
    expect((await findWorkOrderByToken(token!, new Date(linkExpiresAt!.getTime() + 1)))?.state).toBe('expired');
    expect(await findWorkOrderByToken('x'.repeat(43))).toBeUndefined();
    const current = await getWorkOrder(propertyId, order.id);
    await updateWorkOrder(propertyId, order.id, { version: current.version, revokeLink: true }, ownerId);
    expect((await findWorkOrderByToken(token!))?.state).toBe('revoked');

    // Sending again makes a new link; cancelling ends it.
    const again = await db().transaction(async (trx) => markSent(await getWorkOrder(propertyId, order.id, trx), ownerId, 86_400_000, trx));
    expect((await findWorkOrderByToken(token!))).toBeUndefined();
    expect((await findWorkOrderByToken(again.token!))?.state).toBe('valid');
    const latest = await getWorkOrder(propertyId, order.id);
    await updateWorkOrder(propertyId, order.id, { version: latest.version, status: 'cancelled' }, ownerId);
    expect((await findWorkOrderByToken(again.token!))?.state).toBe('revoked');
  });

  it('keeps a sent order as a record (no delete), deletes a draft, and sums progress per property', async () => {
    const a = await fenceWithCrossing('Record fence');
    const draft = await createWorkOrder(propertyId, input({ fenceLineIds: [a.fenceId] }), ownerId);
    const out = await createWorkOrder(propertyId, input({ crossingIds: [a.crossingId] }), ownerId);
    await sent(out.id);
    await expect(deleteWorkOrder(propertyId, out.id, ownerId)).rejects.toBeInstanceOf(ConflictError);
    await deleteWorkOrder(propertyId, draft.id, ownerId);
    expect((await listWorkOrders(propertyId)).map((o) => o.id)).not.toContain(draft.id);
    expect(await db()('work_order_items').where({ work_order_id: draft.id }).count<{ n: number }[]>({ n: '*' })).toEqual([{ n: 0 }]);
    const summary = await propertyProgress(propertyId);
    expect(summary.orders.find((o) => o.id === out.id)?.status).toBe('sent');
    expect(summary.live.total).toBeGreaterThanOrEqual(1);
  });

  it('the database refuses an item that is both a fence line and a crossing, or neither', async () => {
    const a = await fenceWithCrossing('Check fence');
    const order = await createWorkOrder(propertyId, input({ fenceLineIds: [a.fenceId] }), ownerId);
    await expect(db()('work_order_items').insert({ work_order_id: order.id, position: 5, fence_line_id: a.fenceId, crossing_id: a.crossingId })).rejects.toThrow(/CHECK/);
    await expect(db()('work_order_items').insert({ work_order_id: order.id, position: 6 })).rejects.toThrow(/CHECK/);
  });
});
