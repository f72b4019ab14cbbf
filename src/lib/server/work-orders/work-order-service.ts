import { FENCING_CAUTIONS } from '../../crossings/design/cautions';
import type { MaterialsList } from '../../crossings/materials/material-item';
import { priceMaterials, type PricedMaterials } from '../../crossings/materials/price-materials';
import type { PlanScope } from '../../geo/plan-data';
import { planToGeoJson } from '../../geo/plan-geojson';
import { planToGpx } from '../../geo/plan-gpx';
import { DEFAULT_DESIGN_SETTINGS } from '../../schemas/crossing';
import type { Role } from '../../schemas/roles';
import type { WorkOrder, WorkOrderMaterials, WorkOrderSheet } from '../../schemas/work-order';
import { getConfig } from '../config';
import { propertyCosts } from '../crossings/costs';
import { db } from '../db';
import { ConflictError, GoneError, NotFoundError, ValidationError } from '../http';
import { enqueueMail } from '../mail/outbox';
import { absoluteUrl } from '../mail/templates';
import { workOrderMail } from '../mail/work-order-mail';
import { exportFileName, gatherPlan } from '../plan-export';
import { getProperty } from '../repos/properties';
import { getPropertySettings } from '../repos/property-settings';
import { findWorkOrderByToken, getWorkOrder, lockForChange, markSent } from '../repos/work-orders';

/** The fence lines and crossings an order's files and map hold: its own, and the fence lines its crossings stand on. */
export function scopeOf(order: WorkOrder): PlanScope {
  return {
    fenceLineIds: new Set(order.items.map((item) => item.fenceLineId)),
    crossingIds: new Set(order.items.flatMap((item) => (item.crossingId === null ? [] : [item.crossingId]))),
  };
}

/**
 * The materials of an order, priced from the property's price list: each whole fence line as the
 * Costs page prices it (its ordinary fence and its designed crossings), and each crossing whose
 * fence line is not in the order on its own (its floodgate footprint), so nothing is counted twice.
 */
export async function orderMaterials(propertyId: number, order: WorkOrder): Promise<WorkOrderMaterials> {
  const wholeFences = new Set(order.items.filter((item) => item.kind === 'fence-line').map((item) => item.fenceLineId));
  const ownCrossings = order.items.filter((item) => item.kind === 'crossing' && !wholeFences.has(item.fenceLineId)).map((item) => item.crossingId!);
  const priced: PricedMaterials[] = [];
  if (wholeFences.size) {
    const costs = await propertyCosts(propertyId);
    priced.push(...costs.fenceLines.filter((fence) => wholeFences.has(fence.fenceLineId)).map((fence) => fence.priced));
  }
  if (ownCrossings.length) {
    const settings = await getPropertySettings(propertyId);
    const design = { ...DEFAULT_DESIGN_SETTINGS, ...settings.designSettings };
    const labour = { ratePerDayCents: design.labourRatePerDayCents, metresPerDay: design.metresPerDay };
    const rows = await db()('crossings').where({ property_id: propertyId, design_status: 'designed' }).whereIn('id', ownCrossings).select('design');
    for (const row of rows) {
      const materials = (JSON.parse(row.design) as { materials?: MaterialsList }).materials;
      if (materials) priced.push(priceMaterials(materials, settings.priceList, labour));
    }
  }
  return mergePriced(priced);
}

function mergePriced(priced: PricedMaterials[]): WorkOrderMaterials {
  const lines = new Map<string, WorkOrderMaterials['lines'][number]>();
  const unpriced = new Map<string, WorkOrderMaterials['unpriced'][number]>();
  for (const list of priced) {
    for (const line of list.lines) {
      const key = `${line.code}\u0000${line.unit}\u0000${line.unitPriceCents}`;
      const seen = lines.get(key);
      if (seen) {
        seen.quantity += line.quantity;
        seen.totalCents += line.totalCents;
      } else lines.set(key, { code: line.code, description: line.description, unit: line.unit, quantity: line.quantity, unitPriceCents: line.unitPriceCents, totalCents: line.totalCents });
    }
    for (const { item } of list.unpriced) {
      const key = `${item.code}\u0000${item.unit}`;
      const seen = unpriced.get(key);
      if (seen) seen.quantity += item.quantity;
      else unpriced.set(key, { code: item.code, description: item.description, unit: item.unit, quantity: item.quantity });
    }
  }
  const materialsCents = priced.reduce((sum, p) => sum + p.materialsCents, 0);
  const labourCents = priced.reduce((sum, p) => sum + p.labour.costCents, 0);
  return {
    lines: [...lines.values()].map((line) => ({ ...line, quantity: Math.round(line.quantity * 100) / 100 })),
    unpriced: [...unpriced.values()],
    materialsCents,
    labourCents,
    labourDays: priced.reduce((sum, p) => sum + p.labour.days, 0),
    totalCents: materialsCents + labourCents,
    complete: priced.every((p) => p.complete),
  };
}

/** The usual cautions, then any a crossing design of the order adds, each once. */
async function orderCautions(propertyId: number, order: WorkOrder): Promise<string[]> {
  const ids = [...scopeOf(order).crossingIds];
  const rows = ids.length ? await db()('crossings').where({ property_id: propertyId }).whereIn('id', ids).whereNotNull('design').select(db().raw("json_extract(design, '$.cautions') as cautions")) : [];
  const all = [...FENCING_CAUTIONS, ...rows.flatMap((row: { cautions: string | null }) => (row.cautions ? (JSON.parse(row.cautions) as string[]) : []))];
  return [...new Set(all)];
}

/** What the crew view, the print page and the contractor's link show: the order, its materials, cautions and map. */
export async function workOrderSheet(propertyId: number, order: WorkOrder, role: Role): Promise<WorkOrderSheet> {
  const [plan, property, materials, cautions] = await Promise.all([
    gatherPlan(propertyId, role),
    getProperty(propertyId, role),
    orderMaterials(propertyId, order),
    orderCautions(propertyId, order),
  ]);
  const scope = scopeOf(order);
  const map = planToGeoJson(plan, scope);
  const layoutPointCount = map.features.filter((feature) => feature.properties?.featureType === 'layout-point').length;
  return { propertyName: plan.propertyName, propertyExtentWgs84: property.extentWgs84, order, materials, cautions, map, layoutPointCount };
}

/** The two files sent with an order: the GPX waypoints and the GeoJSON of its crossings' layout points, named after the property and the order. */
export async function orderFiles(propertyId: number, order: WorkOrder, role: Role, now = new Date()) {
  const plan = await gatherPlan(propertyId, role, now);
  const scope = scopeOf(order);
  const base = exportFileName(plan.propertyName, propertyId, 'gpx').replace(/-waypoints\.gpx$/, `-work-order-${order.id}`);
  return {
    propertyName: plan.propertyName,
    gpx: { filename: `${base}-waypoints.gpx`, contentType: 'application/gpx+xml', body: planToGpx(plan, scope) },
    // RFC 7946 §12 registers application/geo+json.
    geojson: { filename: `${base}.geojson`, contentType: 'application/geo+json', body: JSON.stringify(planToGeoJson(plan, scope)) },
  };
}

/**
 * Sends an order to whoever does the work: queues the e-mail (summary, materials with costs,
 * cautions, the link to the crew view, the GPX and GeoJSON files) and marks the order sent with a
 * fresh contractor link when a contractor does it, all in one transaction; sending again replaces
 * the old link.
 * @throws ConflictError on a stale version or a done or cancelled order, ValidationError when nobody is assigned
 */
export async function sendWorkOrder(input: { propertyId: number; orderId: number; version: number; user: { id: number; name: string }; role: Role; origin: string }): Promise<WorkOrder> {
  const { propertyId, orderId, user } = input;
  const read = await getWorkOrder(propertyId, orderId);
  if (read.version !== input.version) throw new ConflictError(`Someone changed "${read.title}" since you opened it (now version ${read.version}). Reload it, check it, then send.`);
  if (read.status === 'done' || read.status === 'cancelled') throw new ConflictError(`"${read.title}" is ${read.status}; only a draft or sent order can be sent.`);
  const to = read.contractorEmail ?? (read.assigneeUserId ? ((await db()('users').where({ id: read.assigneeUserId }).first('email'))?.email as string | undefined) : undefined);
  if (!to) throw new ValidationError({ assigneeUserId: 'Choose a crew member or a contractor to send the order to.' }, 'Nobody is assigned to this work order yet.');
  const now = new Date();
  // Files, prices and cautions are read before the transaction: SQLite holds one writer at a time.
  const [files, sheet] = await Promise.all([orderFiles(propertyId, read, input.role, now), workOrderSheet(propertyId, read, input.role)]);
  return db().transaction(async (trx) => {
    const order = await lockForChange(propertyId, orderId, input.version, trx);
    const { token, linkExpiresAt } = await markSent(order, user.id, getConfig().workOrderLinkExpiryMs, trx, now);
    const link = token
      ? absoluteUrl(`/work-orders/${encodeURIComponent(token)}`, input.origin)
      : absoluteUrl(`/app/properties/${propertyId}/work-orders/${orderId}`, input.origin);
    await enqueueMail(
      workOrderMail({
        to, senderName: user.name, sheet: { ...sheet, order }, link, linkExpiresAt, contractor: token !== null,
        attachments: [files.gpx, files.geojson].map((file) => ({ filename: file.filename, contentType: file.contentType, contentBase64: Buffer.from(file.body, 'utf8').toString('base64') })),
      }),
      trx,
    );
    return getWorkOrder(propertyId, orderId, trx);
  });
}

/**
 * What a contractor's link shows: the order's sheet, read-only. A link that matches nothing or
 * was withdrawn (or its order cancelled) answers as unknown (404); an expired one as gone (410).
 * @throws NotFoundError, GoneError
 */
export async function workOrderByLink(token: string | undefined, now = new Date()): Promise<WorkOrderSheet> {
  const unknown = new NotFoundError('work order', 'This work order link is not valid, or it was withdrawn. Ask whoever sent it for a new one.');
  if (!token || !/^[\w-]{20,100}$/.test(token)) throw unknown;
  const found = await findWorkOrderByToken(token, now);
  if (!found || found.state === 'revoked') throw unknown;
  if (found.state === 'expired') throw new GoneError('This work order link has expired. Ask whoever sent it to send the order again.');
  const { link: _link, ...order } = found.order;
  return workOrderSheet(order.propertyId, { ...order, link: null }, 'viewer');
}
