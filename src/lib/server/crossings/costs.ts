import { materialsForFenceLine } from '../../crossings/materials/materials-list';
import { priceMaterials, type PricedMaterials } from '../../crossings/materials/price-materials';
import type { MaterialsList } from '../../crossings/materials/material-item';
import type { FloodgateLayout } from '../../crossings/design/floodgate-layout';
import { findWireType } from '../../crossings/wire/wire-types';
import { fenceVertices } from '../../geo/fence-vertices';
import { DEFAULT_DESIGN_SETTINGS } from '../../schemas/crossing';
import { db } from '../db';
import { listFenceLines } from '../repos/fence-lines';
import { getPropertySettings } from '../repos/property-settings';

/** What one designed crossing costs on its own (its floodgate footprint), for the chosen style. */
export type CrossingCost = {
  crossingId: number;
  fenceLineId: number;
  fenceName: string;
  chainageM: number;
  style: string | null;
  materialsCents: number;
  labourCents: number;
  totalCents: number;
  complete: boolean;
};

export type FenceLineCost = { fenceLineId: number; name: string; status: string; lengthM: number; crossings: number; materials: MaterialsList; priced: PricedMaterials };

/**
 * Materials and cost of each fence line of a property (ordinary fence plus its designed
 * crossings), priced from the property's price list, and the property's totals. Each designed
 * crossing is also priced on its own (its footprint's materials and labour), which is part of,
 * not added to, its fence line's cost.
 */
export async function propertyCosts(propertyId: number) {
  const settings = await getPropertySettings(propertyId);
  const design = { ...DEFAULT_DESIGN_SETTINGS, ...settings.designSettings };
  const labour = { ratePerDayCents: design.labourRatePerDayCents, metresPerDay: design.metresPerDay };
  const rows = await db()('crossings').where({ property_id: propertyId, design_status: 'designed' }).select('id', 'fence_line_id', 'chainage_m', 'design');
  const fences: FenceLineCost[] = [];
  const crossings: CrossingCost[] = [];
  for (const fence of await listFenceLines(propertyId)) {
    if (fence.status === 'retired') continue;
    const layouts = rows.filter((row) => row.fence_line_id === fence.id).map((row) => (JSON.parse(row.design) as { layout: FloodgateLayout }).layout);
    const spec = fence.wireSpec;
    const materials = materialsForFenceLine({
      lengthM: fence.lengthM,
      vertices: fenceVertices(fence.coordinates),
      crossings: layouts,
      fence: {
        wireHeightsM: spec.wireHeightsM,
        wireKinds: spec.wireKinds,
        rollLengthM: { plain: findWireType(spec.plainWireTypeId).rollLengthM, barbed: findWireType(spec.barbedWireTypeId).rollLengthM },
        postSpacingM: spec.postSpacingM,
        dropperSpacingM: spec.dropperSpacingM,
      },
    });
    const priced = priceMaterials({ items: materials.items, fenceLengthM: fence.lengthM, crossingCount: layouts.length }, settings.priceList, labour);
    for (const row of rows.filter((r) => r.fence_line_id === fence.id)) {
      const design = JSON.parse(row.design) as { materials?: MaterialsList; layout?: FloodgateLayout };
      if (!design.materials) continue;
      const own = priceMaterials(design.materials, settings.priceList, labour);
      crossings.push({
        crossingId: row.id, fenceLineId: fence.id, fenceName: fence.name, chainageM: row.chainage_m, style: design.layout?.style ?? null,
        materialsCents: own.materialsCents, labourCents: own.labour.costCents, totalCents: own.totalCents, complete: own.complete,
      });
    }
    fences.push({ fenceLineId: fence.id, name: fence.name, status: fence.status, lengthM: fence.lengthM, crossings: layouts.length, materials, priced });
  }
  const totals = {
    lengthM: fences.reduce((sum, f) => sum + f.lengthM, 0),
    materialsCents: fences.reduce((sum, f) => sum + f.priced.materialsCents, 0),
    labourCents: fences.reduce((sum, f) => sum + f.priced.labour.costCents, 0),
    labourDays: fences.reduce((sum, f) => sum + f.priced.labour.days, 0),
    totalCents: fences.reduce((sum, f) => sum + f.priced.totalCents, 0),
    complete: fences.every((f) => f.priced.complete),
  };
  return { fenceLines: fences, crossings, totals, priceListItems: settings.priceList.length };
}

/** The materials of every fence line as CSV (one row per item), for a spreadsheet or a supplier. */
export function materialsCsv(costs: Awaited<ReturnType<typeof propertyCosts>>): string {
  const quote = (value: string) => (/[",\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value);
  const lines = ['fence_line,code,description,unit,quantity,unit_price,total'];
  for (const fence of costs.fenceLines) {
    for (const line of fence.priced.lines) {
      lines.push([fence.name, line.code, line.description, line.unit, String(line.quantity), (line.unitPriceCents / 100).toFixed(2), (line.totalCents / 100).toFixed(2)].map(quote).join(','));
    }
    for (const { item, why } of fence.priced.unpriced) {
      lines.push([fence.name, item.code, `${item.description} (not priced: ${why})`, item.unit, String(item.quantity), '', ''].map(quote).join(','));
    }
    lines.push([fence.name, 'LABOUR', fence.priced.labour.reason, 'day', fence.priced.labour.days.toFixed(2), (fence.priced.labour.ratePerDayCents / 100).toFixed(2), (fence.priced.labour.costCents / 100).toFixed(2)].map(quote).join(','));
  }
  return `${lines.join('\n')}\n`;
}
