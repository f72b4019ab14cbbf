// Work orders through the API of the built server: making, sending (the e-mail with its GPX and
// GeoJSON files, opened and read), marking work, roles, stale edits, bad input and the
// contractor's read-only link.
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { DOMParser } from '@xmldom/xmldom';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { listCaughtMail } from '../../src/lib/server/mail/caught-mail';
import { readEmlAttachments } from '../../src/lib/server/mail/read-eml';
import { TestClient, closeServerDb, rowCounts, serverDb, signedInClient } from '../helpers/api-client';
import { loadDemoPlan } from '../helpers/demo-plan';

type Item = { id: number; kind: string; fenceLineId: number; crossingId: number | null; state: string; fenceStatus: string };
type Order = { id: number; status: string; version: number; items: Item[]; progress: { done: number; total: number; percentDone: number }; link: { revoked: boolean } | null };
type LayoutPoint = { kind: string; position: [number, number] };

const GPX_NS = 'http://www.topografix.com/GPX/1/1';

let owner: TestClient;
let crew: { client: TestClient; userId: number; email: string };
let viewer: TestClient;
let propertyId = 0;
let otherPropertyId = 0;
let fenceIds: Map<string, number>;
/** The designed crossings of the first demo fence, and one on another fence for a crossing-only item. */
let crossingsOnFence: number[] = [];
let crossingElsewhere = 0;
let fenceId = 0;
/** The order the first test sends: still open on the same fence line when the second test runs. */
let firstOrderId = 0;

async function mailTo(to: string) {
  const folder = path.join(inject('dataDir'), 'mail');
  for (let i = 0; i < 300; i++) {
    const found = (await listCaughtMail(folder, 500)).find((mail) => mail.to === to);
    if (found) return { ...found, raw: await readFile(path.join(folder, found.file), 'utf8') };
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error(`no e-mail to ${to} arrived`);
}

const orders = (id = propertyId) => `/api/properties/${id}/work-orders`;
const create = (body: Record<string, unknown>, client = owner) => client.json<{ workOrder: Order; error?: string; fields?: Record<string, string> }>('POST', orders(), { title: 'North creek fence', ...body });
const send = (order: Order) => owner.json<{ workOrder: Order; error?: string }>('POST', `${orders()}/${order.id}/send`, { version: order.version });
const mark = (client: TestClient, order: Order, item: Item, state: string, note = '') =>
  client.json<{ workOrder: Order; fenceStatus: { to: string } | null; error?: string }>('PATCH', `${orders()}/${order.id}/items/${item.id}`, { state, note });
const designOf = async (crossingId: number) => JSON.parse((await serverDb()('crossings').where({ id: crossingId }).first('design')).design) as { positions: LayoutPoint[]; layout: { style: string } };

beforeAll(async () => {
  owner = (await signedInClient('wo-owner')).client;
  ({ propertyId, fenceIds } = await loadDemoPlan(owner, 'Saltbush Rise (work orders)'));
  crew = await signedInClient('wo-crew');
  const viewerAccount = await signedInClient('wo-viewer');
  viewer = viewerAccount.client;
  const now = new Date().toISOString();
  await serverDb()('memberships').insert([
    { property_id: propertyId, user_id: crew.userId, role: 'crew', created_at: now },
    { property_id: propertyId, user_id: viewerAccount.userId, role: 'viewer', created_at: now },
  ]);
  otherPropertyId = (await owner.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Other Downs', crs: 'EPSG:7854' })).body.property.id;

  const designed: { id: number; fence_line_id: number }[] = await serverDb()('crossings').where({ property_id: propertyId, design_status: 'designed' }).orderBy('id').select('id', 'fence_line_id');
  const byFence = [...fenceIds.values()].map((id) => ({ id, crossings: designed.filter((c) => c.fence_line_id === id).map((c) => c.id) })).sort((a, b) => b.crossings.length - a.crossings.length);
  fenceId = byFence[0]!.id;
  crossingsOnFence = byFence[0]!.crossings;
  crossingElsewhere = byFence.find((f) => f.id !== fenceId && f.crossings.length > 0)!.crossings[0]!;
  expect(crossingsOnFence.length).toBeGreaterThan(0);
  // One crossing built as a separate drop-down section: the e-mail must say so.
  const patched = await owner.json('PATCH', `/api/properties/${propertyId}/crossings/${crossingElsewhere}`, { style: 'drop-down-section' });
  expect(patched.status).toBe(200);
}, 240_000);
afterAll(closeServerDb);

describe('work orders', () => {
  it('a manager makes an order and sends it: the crew member gets the e-mail with the link, the cautions and both files, whose points are the designs\' positions', async () => {
    const made = await create({ assigneeUserId: crew.userId, fenceLineIds: [fenceId], crossingIds: [...crossingsOnFence, crossingElsewhere], targetDate: '2027-02-15', notes: 'Gate at the north end stays shut.' });
    expect(made.status).toBe(201);
    expect(made.body.workOrder).toMatchObject({ status: 'draft', version: 1 });
    expect(made.body.workOrder.items).toHaveLength(2 + crossingsOnFence.length);

    const sent = await send(made.body.workOrder);
    expect(sent.status).toBe(200);
    firstOrderId = made.body.workOrder.id;
    expect(sent.body.workOrder).toMatchObject({ status: 'sent', version: 2, link: null });

    const mail = await mailTo(crew.email);
    const link = `${inject('baseUrl')}/app/properties/${propertyId}/work-orders/${made.body.workOrder.id}`;
    expect(mail.subject).toBe('Work order: North creek fence (Saltbush Rise (work orders))');
    expect(mail.text).toContain(link);
    expect(mail.html).toContain(`href="${link}"`);
    expect(mail.text).toContain('Never enter floodwater');
    expect(mail.text).toContain('Locate buried services');
    expect(mail.text).toMatch(/Separate drop-down section\. Not a continuous floodgate/);
    expect(mail.text).toMatch(/Continuous swinging floodgate/);
    expect(mail.text).toMatch(/total \$[\d,]+\.\d\d/);
    expect(mail.attachments).toHaveLength(2);

    const files = readEmlAttachments(mail.raw);
    const gpxFile = files.find((f) => f.filename.endsWith('.gpx'))!;
    const geojsonFile = files.find((f) => f.filename.endsWith('.geojson'))!;
    expect(gpxFile.contentType).toBe('application/gpx+xml');
    expect(geojsonFile.contentType).toBe('application/geo+json');

    // The design's layout points of the order's crossings, in order, and none of any other crossing.
    const ordered = [...crossingsOnFence, crossingElsewhere];
    const expected = (await Promise.all(ordered.map(designOf))).flatMap((design, i) => design.positions.map((p) => ({ ...p, crossingId: ordered[i]! })));
    expect(expected.filter((p) => p.kind === 'end-strainer').length).toBeGreaterThanOrEqual(2 * ordered.length - 1);

    // GPX 1.1 (TopoGrafix, namespace http://www.topografix.com/GPX/1/1), read with @xmldom/xmldom.
    const doc = new DOMParser().parseFromString(gpxFile.content.toString('utf8'), 'text/xml');
    expect(doc.documentElement!.namespaceURI).toBe(GPX_NS);
    const waypoints = Array.from(doc.getElementsByTagNameNS(GPX_NS, 'wpt')).map((w) => ({
      lon: Number(w.getAttribute('lon')),
      lat: Number(w.getAttribute('lat')),
      type: w.getElementsByTagNameNS(GPX_NS, 'type')[0]!.textContent,
    }));
    expect(waypoints).toHaveLength(expected.length);
    waypoints.forEach((w, i) => {
      expect(w.type).toBe(expected[i]!.kind);
      // Written to 8 decimals: half a unit in the last place.
      expect(Math.abs(w.lon - expected[i]!.position[0])).toBeLessThanOrEqual(5e-9);
      expect(Math.abs(w.lat - expected[i]!.position[1])).toBeLessThanOrEqual(5e-9);
    });

    const collection = JSON.parse(geojsonFile.content.toString('utf8')) as { type: string; features: { geometry: { coordinates: number[] }; properties: Record<string, unknown> }[] };
    expect(collection.type).toBe('FeatureCollection');
    const points = collection.features.filter((f) => f.properties.featureType === 'layout-point');
    expect(points.map((f) => [f.properties.crossingId, f.properties.kind, f.geometry.coordinates])).toEqual(expected.map((p) => [p.crossingId, p.kind, p.position]));
    const strainers = points.filter((f) => f.properties.kind === 'end-strainer').map((f) => f.geometry.coordinates);
    expect(strainers).toEqual(expected.filter((p) => p.kind === 'end-strainer').map((p) => p.position));
    expect(collection.features.filter((f) => f.properties.featureType === 'crossing').map((f) => f.properties.id)).toEqual(ordered);
    expect(collection.features.some((f) => f.properties.featureType === 'paddock')).toBe(false);

    const audit = await serverDb()('audit_log').where({ property_id: propertyId, entity_type: 'work_order', entity_id: String(made.body.workOrder.id) }).pluck('action');
    expect(audit).toEqual(['work_order.create', 'work_order.send']);

    // The printable sheet: a sketch drawn from the geometry (the order's fence line and the one its
    // other crossing stands on), each crossing's style, the cautions.
    const print = await crew.client.request('GET', `/app/properties/${propertyId}/work-orders/${made.body.workOrder.id}/print`);
    expect(print.status).toBe(200);
    const html = await print.text();
    expect(html).toContain('data-testid="order-sketch"');
    expect(html.match(/<polyline /g)).toHaveLength(2);
    expect(html.match(/data-testid="print-item"/g)).toHaveLength(2 + crossingsOnFence.length);
    expect(html).toContain('Separate drop-down section');
    expect(html).toContain('Never enter floodwater');
    expect((await crew.client.request('GET', `/app/properties/${propertyId}/work-orders/${made.body.workOrder.id}`)).status).toBe(200);
  });

  it('marking items moves the fence line: started makes it building, all of its work on live orders done makes it built; progress follows', async () => {
    const made = (await create({ assigneeUserId: crew.userId, fenceLineIds: [fenceId], crossingIds: crossingsOnFence })).body.workOrder;
    const out = (await send(made)).body.workOrder;
    await serverDb()('fence_lines').where({ id: fenceId }).update({ status: 'approved' });
    const [fenceItem, ...crossingItems] = out.items;

    const started = await mark(crew.client, out, crossingItems[0]!, 'started', 'Strainer holes dug');
    expect(started.status).toBe(200);
    expect(started.body.fenceStatus?.to).toBe('building');
    expect((await serverDb()('fence_lines').where({ id: fenceId }).first('status')).status).toBe('building');

    let last = started.body;
    for (const item of [fenceItem!, ...crossingItems]) last = (await mark(crew.client, out, item, 'done')).body;
    expect(last.workOrder).toMatchObject({ status: 'done', progress: { done: out.items.length, total: out.items.length, percentDone: 100 } });
    // The first order still holds open work on this fence line, so it is not built yet …
    expect(last.fenceStatus).toBeNull();
    expect((await serverDb()('fence_lines').where({ id: fenceId }).first('status')).status).toBe('building');
    // … until that order is cancelled: then all its live work is done.
    const first = (await owner.json<{ workOrder: { order: Order } }>('GET', `${orders()}/${firstOrderId}`)).body.workOrder.order;
    expect((await owner.json('PATCH', `${orders()}/${firstOrderId}`, { version: first.version, status: 'cancelled' })).status).toBe(200);
    expect((await serverDb()('fence_lines').where({ id: fenceId }).first('status')).status).toBe('built');

    const progress = await viewer.json<{ progress: { percentDone: number } }>('GET', `${orders()}/${out.id}/progress`);
    expect(progress).toMatchObject({ status: 200, body: { progress: { percentDone: 100 } } });
    const summary = await viewer.json<{ orders: { id: number; status: string }[] }>('GET', `${orders()}/progress`);
    expect(summary.body.orders.find((o) => o.id === out.id)?.status).toBe('done');
    const moved = await serverDb()('audit_log').where({ property_id: propertyId, action: 'fence_line.status', entity_id: String(fenceId) }).pluck('detail');
    expect(moved.map((d: string) => JSON.parse(d).to)).toEqual(expect.arrayContaining(['building', 'built']));
  });

  it('refuses what a role may not do: crew cannot make an order, a viewer cannot mark work, and nothing changes', async () => {
    const before = await rowCounts('work_orders', 'work_order_items', 'audit_log');
    const refused = await create({ fenceLineIds: [fenceId] }, crew.client);
    expect(refused.status).toBe(403);
    const out = (await send((await create({ assigneeUserId: crew.userId, crossingIds: [crossingElsewhere] })).body.workOrder)).body.workOrder;
    const afterSend = await rowCounts('work_orders', 'work_order_items');
    expect(afterSend.work_orders).toBe(before.work_orders! + 1);
    const viewerMark = await mark(viewer, out, out.items[0]!, 'done');
    expect(viewerMark.status).toBe(403);
    expect(viewerMark.body.error).toMatch(/crew role or higher/);
    expect((await serverDb()('work_order_items').where({ id: out.items[0]!.id }).first('state')).state).toBe('not-started');
    expect((await crew.client.json('GET', `${orders()}/${out.id}`)).status).toBe(200);
  });

  it("another property's order answers 404, and a stale edit 409 with nothing changed", async () => {
    const now = new Date().toISOString();
    const [foreign] = await serverDb()('work_orders')
      .insert({ property_id: otherPropertyId, title: 'Elsewhere', status: 'draft', version: 1, created_at: now, updated_at: now })
      .returning('id');
    for (const route of [`${orders()}/${foreign.id}`, `${orders()}/${foreign.id}/progress`, `/app/properties/${propertyId}/work-orders/${foreign.id}`]) {
      expect((await owner.request('GET', route)).status, route).toBe(404);
    }
    expect((await owner.request('PATCH', `${orders()}/${foreign.id}`, { version: 1, title: 'Taken' })).status).toBe(404);

    const made = (await create({ fenceLineIds: [fenceId] })).body.workOrder;
    expect((await owner.json('PATCH', `${orders()}/${made.id}`, { version: 1, title: 'First change' })).status).toBe(200);
    const stale = await owner.json<{ error: string }>('PATCH', `${orders()}/${made.id}`, { version: 1, title: 'Lost change' });
    expect(stale.status).toBe(409);
    expect(stale.body.error).toMatch(/since you opened it/);
    const staleSend = await owner.json('POST', `${orders()}/${made.id}/send`, { version: 1 });
    expect(staleSend.status).toBe(409);
    expect(await serverDb()('work_orders').where({ id: made.id }).first('title', 'status')).toEqual({ title: 'First change', status: 'draft' });
  });

  it('bad input gets 422 naming each field, and stores nothing', async () => {
    const before = await rowCounts('work_orders', 'work_order_items', 'audit_log', 'outbox');
    const bad = await create({ title: ' ', targetDate: '2027-02-30', contractorEmail: 'not-an-address', crossingIds: [] });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.fields!).sort()).toEqual(['contractorEmail', 'fenceLineIds', 'targetDate', 'title']);
    const foreignFence = await create({ fenceLineIds: [999_999] });
    expect(foreignFence.status).toBe(422);
    expect(foreignFence.body.fields?.fenceLineIds).toMatch(/No fence line 999999 on this property/);
    const badState = await owner.json<{ fields: Record<string, string> }>('PATCH', `${orders()}/1/items/1`, { state: 'finished' });
    expect(badState.status).toBe(422);
    expect(await rowCounts('work_orders', 'work_order_items', 'audit_log', 'outbox')).toEqual(before);
  });

  it("a contractor's link opens the order read-only without signing in; an expired one is gone (410), a withdrawn or wrong one unknown (404)", async () => {
    const contractor = `fencer-${Date.now()}@contract.example`;
    const out = (await send((await create({ contractorEmail: contractor, crossingIds: [crossingElsewhere] })).body.workOrder)).body.workOrder;
    const mail = await mailTo(contractor);
    const token = /\/work-orders\/([\w-]{43})/.exec(mail.text)?.[1];
    expect(token, mail.text).toBeDefined();
    expect(mail.text).toContain(`${inject('baseUrl')}/work-orders/${token}`);

    const anonymous = new TestClient();
    const read = await anonymous.json<{ workOrder: { order: Order; propertyName: string; cautions: string[] } }>('GET', `/api/work-order-links/${token}`);
    expect(read.status).toBe(200);
    expect(read.body.workOrder.order.id).toBe(out.id);
    expect(read.body.workOrder.order.link).toBeNull();
    expect(read.body.workOrder.cautions.length).toBeGreaterThan(0);
    const page = await anonymous.request('GET', `/work-orders/${token}`);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain('North creek fence');
    // Read-only: the link writes nothing, and the signed-in routes stay closed to it.
    expect((await anonymous.request('PATCH', `/api/work-order-links/${token}`, { state: 'done' })).status).toBe(401);
    expect((await anonymous.request('PATCH', `${orders()}/${out.id}/items/${out.items[0]!.id}`, { state: 'done' })).status).toBe(401);

    await serverDb()('work_orders').where({ id: out.id }).update({ link_expires_at: new Date(Date.now() - 1000).toISOString() });
    const expired = await anonymous.json<{ error: string }>('GET', `/api/work-order-links/${token}`);
    expect(expired.status).toBe(410);
    expect(expired.body.error).toMatch(/expired/);
    expect((await anonymous.request('GET', `/work-orders/${token}`)).status).toBe(410);

    await serverDb()('work_orders').where({ id: out.id }).update({ link_expires_at: new Date(Date.now() + 86_400_000).toISOString() });
    const current = (await owner.json<{ workOrder: { order: Order } }>('GET', `${orders()}/${out.id}`)).body.workOrder.order;
    const withdrawn = await owner.json<{ workOrder: Order }>('PATCH', `${orders()}/${out.id}`, { version: current.version, revokeLink: true });
    expect(withdrawn.body.workOrder.link?.revoked).toBe(true);
    expect((await anonymous.request('GET', `/api/work-order-links/${token}`)).status).toBe(404);
    expect((await anonymous.request('GET', `/api/work-order-links/${'x'.repeat(43)}`)).status).toBe(404);
    expect((await anonymous.request('GET', '/api/work-order-links/short')).status).toBe(404);
  });
});
