/**
 * Counting helpers shared by the materials lists: posts and droppers along a run, wire by kind,
 * tie wire, and merging lines.
 */
import type { WireKind } from '../design/wire-kinds';
import type { ResolvedFenceSpec } from './fence-spec';
import type { MaterialItem } from './material-item';

/** Steel density, kg/m³ (the usual value; references.md: coil masses agree with it). */
const STEEL_KG_M3 = 7850;

/** Ordinary droppers in one panel between two posts `panelM` apart. */
export function droppersInPanel(panelM: number, spec: ResolvedFenceSpec): number {
  if (spec.dropperSpacingM === null || !(panelM > 0)) return 0;
  // A tolerance so that a panel of exactly n spacings gets n − 1 droppers despite rounding.
  return Math.max(0, Math.ceil(panelM / spec.dropperSpacingM - 1e-9) - 1);
}

/** Posts and droppers of a plain run of fence `lengthM` long between two strainers. */
export function countRun(lengthM: number, spec: ResolvedFenceSpec): { posts: number; droppers: number } {
  if (!(lengthM > 0)) return { posts: 0, droppers: 0 };
  const panels = Math.max(1, Math.ceil(lengthM / spec.postSpacingM - 1e-9));
  return { posts: panels - 1, droppers: panels * droppersInPanel(lengthM / panels, spec) };
}

/** Wire lines, one per kind: rolls (rounded up) and metres, with the allowance added. */
export function wireItems(metresByKind: Readonly<Record<WireKind, number>>, spec: ResolvedFenceSpec, reason: string): MaterialItem[] {
  const items: MaterialItem[] = [];
  for (const kind of ['plain', 'barbed'] as const) {
    const runM = metresByKind[kind];
    if (!(runM > 0)) continue;
    const metres = Math.ceil(runM * (1 + spec.wireAllowanceFraction));
    const roll = spec.rollLengthM[kind];
    items.push({
      code: kind === 'plain' ? 'WIRE_PLAIN' : 'WIRE_BARBED',
      description: `${kind === 'plain' ? 'Plain' : 'Barbed'} wire in ${roll} m rolls`,
      unit: 'roll',
      quantity: Math.ceil(metres / roll),
      alsoAs: [{ unit: 'm', quantity: metres }],
      reason: `${reason} ${Math.round(runM)} m of ${kind} wire plus ${Math.round(spec.wireAllowanceFraction * 100)} % for tie-offs, joins and waste = ${metres} m, in whole rolls.`,
    });
  }
  return items;
}

/** Tie wire for `ties` ties, in kg (rounded up to 0.1 kg) and metres. */
export function tieWireItem(ties: number, spec: ResolvedFenceSpec, reason: string): MaterialItem | null {
  if (!(ties > 0)) return null;
  const metres = Math.ceil(ties * spec.tieLengthM);
  const kgPerM = STEEL_KG_M3 * Math.PI * ((spec.tieWireDiameterMm / 1000) ** 2 / 4);
  return {
    code: 'TIE_WIRE',
    description: `Tie wire, ${spec.tieWireDiameterMm} mm galvanised`,
    unit: 'kg',
    quantity: Math.ceil(metres * kgPerM * 10 - 1e-9) / 10,
    alsoAs: [{ unit: 'm', quantity: metres }],
    reason: `${reason} ${ties} ties × ${spec.tieLengthM} m = ${metres} m; ${(kgPerM * 1000).toFixed(1)} g/m from steel at ${STEEL_KG_M3} kg/m³.`,
  };
}

/** An item, or nothing when the count is zero. */
export function item(code: MaterialItem['code'], description: string, quantity: number, reason: string): MaterialItem[] {
  return quantity > 0 ? [{ code, description, unit: 'each', quantity, reason }] : [];
}

/**
 * Merges lines with the same code, unit and description, summing quantities (and their other
 * units) and keeping each distinct reason once. Wire and tie wire are not merged here: they are
 * recounted from metres so rolls are not rounded up twice.
 */
export function mergeItems(items: readonly MaterialItem[]): MaterialItem[] {
  const merged = new Map<string, { item: MaterialItem; reasons: string[] }>();
  for (const it of items) {
    const key = `${it.code}\u0000${it.unit}\u0000${it.description}`;
    const prev = merged.get(key);
    if (!prev) {
      merged.set(key, { item: it, reasons: [it.reason] });
      continue;
    }
    const alsoAs = prev.item.alsoAs?.map((a) => ({ unit: a.unit, quantity: a.quantity + (it.alsoAs?.find((b) => b.unit === a.unit)?.quantity ?? 0) }));
    prev.item = { ...prev.item, quantity: prev.item.quantity + it.quantity, ...(alsoAs ? { alsoAs } : {}) };
    if (!prev.reasons.includes(it.reason)) prev.reasons.push(it.reason);
  }
  return [...merged.values()].map(({ item: it, reasons }) => ({ ...it, reason: reasons.join(' ') }));
}
