import { priceMaterials } from '../../crossings/materials/price-materials';
import type { MaterialItem } from '../../crossings/materials/material-item';
import { suggestRealignment } from '../../crossings/geometry/suggest-realignment';
import { crossingInputsSchema, DEFAULT_DESIGN_SETTINGS, type CrossingInputs } from '../../schemas/crossing';
import { db } from '../db';
import { ConflictError, parseWith } from '../http';
import { recordAudit } from '../repos/audit-log';
import { getCrossing, setCrossingInputs } from '../repos/crossings';
import { getFenceLine, updateFenceLine } from '../repos/fence-lines';
import { getPropertySettings } from '../repos/property-settings';
import { analyseCrossings } from './analyse-crossings';

/**
 * Sets what a person knows about a crossing (flood mark, roughness, AEP, freeboard, style …) and
 * designs it again at once. A field sent as null goes back to the property's setting.
 */
export async function changeCrossingInputs(propertyId: number, crossingId: number, changes: Record<string, unknown>, userId: number) {
  const current = await getCrossing(propertyId, crossingId);
  const merged: Record<string, unknown> = { ...current.inputs, ...changes };
  for (const [key, value] of Object.entries(changes)) if (value === null && key !== 'floodMarkM') delete merged[key];
  const inputs: CrossingInputs = parseWith(crossingInputsSchema, merged);
  const { fenceLineId } = await db().transaction(async (trx) => {
    const result = await setCrossingInputs(propertyId, crossingId, inputs, trx);
    await recordAudit({ propertyId, userId, action: 'crossing.inputs', entityType: 'crossing', entityId: crossingId, detail: { ...changes } }, trx);
    return result;
  });
  await analyseCrossings(propertyId, [fenceLineId]);
  return crossingDetail(propertyId, crossingId);
}

type StoredSide = { materials: MaterialItem[]; cost?: unknown };

/**
 * One crossing with its full design; the two styles of its comparison are priced from the
 * property's price list and labour rates as they are now (prices change without a new design).
 */
export async function crossingDetail(propertyId: number, crossingId: number) {
  const crossing = await getCrossing(propertyId, crossingId);
  const comparison = (crossing.design as { comparison?: { stretchM: number; sides: StoredSide[] } } | null)?.comparison;
  if (!comparison?.sides) return crossing;
  const settings = await getPropertySettings(propertyId);
  const design = { ...DEFAULT_DESIGN_SETTINGS, ...settings.designSettings };
  const labour = { ratePerDayCents: design.labourRatePerDayCents, metresPerDay: design.metresPerDay };
  for (const side of comparison.sides) {
    const priced = priceMaterials({ items: side.materials, fenceLengthM: comparison.stretchM, crossingCount: 1 }, settings.priceList, labour);
    side.cost = {
      materialsCents: priced.materialsCents,
      labourCents: priced.labour.costCents,
      labourDays: priced.labour.days,
      totalCents: priced.totalCents,
      complete: priced.complete,
      unpriced: priced.unpriced.map(({ item, why }) => `${item.description}: ${why}`),
    };
  }
  return crossing;
}

/** The dog-leg that would make a fair or poor crossing square to the flow, for a person to preview. */
export async function realignmentFor(propertyId: number, crossingId: number) {
  const crossing = await getCrossing(propertyId, crossingId);
  if (crossing.kind === 'runs-along' || crossing.kind === 'touch') throw new ConflictError('Only a crossing can be realigned.');
  const fence = await getFenceLine(propertyId, crossing.fenceLineId);
  const design = crossing.design as { flowBearingDeg?: number; fenceSegmentIndex?: number; layout?: { wetZone?: { lengthM: number } } } | null;
  const wetHalfWidthM = Math.max(20, (design?.layout?.wetZone?.lengthM ?? 30) / 2 + 15);
  const suggestion = suggestRealignment(
    fence.coordinates,
    { position: crossing.position, fenceSegmentIndex: design?.fenceSegmentIndex ?? 0, flowBearingDeg: design?.flowBearingDeg ?? 0 },
    { wetZoneHalfWidthM: wetHalfWidthM },
  );
  return { crossing: { id: crossing.id, angleDeg: crossing.angleDeg, angleClass: crossing.angleClass }, fenceLine: { id: fence.id, version: fence.version }, suggestion };
}

/** Accepts the suggested realignment: the fence line takes the new shape (if unchanged since the preview). */
export async function acceptRealignment(propertyId: number, crossingId: number, fenceVersion: number, userId: number) {
  const { suggestion, fenceLine } = await realignmentFor(propertyId, crossingId);
  if (!suggestion.ok) throw new ConflictError(suggestion.reason);
  if (fenceLine.version !== fenceVersion) throw new ConflictError('The fence line changed since the preview. Look at the new preview before accepting.');
  const updated = await updateFenceLine(propertyId, fenceLine.id, { coordinates: suggestion.coordinates, version: fenceVersion }, userId);
  await analyseCrossings(propertyId, [fenceLine.id]);
  return updated;
}
