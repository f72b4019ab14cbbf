/**
 * Prices a materials list and its labour.
 */
import { checkNumber } from '../design/ground-profile';
import type { MaterialItem, MaterialUnit } from './material-item';

/** One entry of a price list: a code, the unit it is sold in, and the price per unit in cents. */
export interface PriceEntry {
  readonly code: string;
  readonly unit: MaterialUnit;
  readonly unitPriceCents: number;
}

/** Labour rates. */
export interface LabourRates {
  /** Cost of a crew day, cents. */
  readonly ratePerDayCents: number;
  /** Metres of fence a crew builds in a day. */
  readonly metresPerDay: number;
  /** Extra crew days for each crossing (floodgates take longer than plain fence); default 0. */
  readonly daysPerCrossing?: number;
}

/** A priced line. */
export interface PricedLine {
  readonly code: string;
  readonly description: string;
  readonly unit: MaterialUnit;
  readonly quantity: number;
  readonly unitPriceCents: number;
  readonly totalCents: number;
  readonly reason: string;
}

/** A priced materials list. All money in whole cents. */
export interface PricedMaterials {
  readonly lines: PricedLine[];
  /** Items the price list has no price for (in any of their units), each with why. */
  readonly unpriced: { item: MaterialItem; why: string }[];
  readonly materialsCents: number;
  readonly labour: { readonly days: number; readonly ratePerDayCents: number; readonly costCents: number; readonly reason: string };
  readonly totalCents: number;
  /** Every item was priced: the total is the whole cost, not a part of it. */
  readonly complete: boolean;
}

/**
 * Prices a materials list. Each item is priced by code in its own unit, or else in one of its
 * other units (wire by the roll or by the metre); a line total is quantity × unit price rounded
 * to the cent. Items without a price are listed in `unpriced`, never counted as zero in silence,
 * and `complete` is false. Labour: days = fence length / metres per day + days per crossing,
 * cost = days × day rate rounded to the cent.
 *
 * @param materials - a materials list (its items, fence length and crossing count); not modified
 * @param priceList - prices by code and unit; not modified
 * @param labour - crew day rate and daily progress
 * @throws RangeError on a negative or non-finite price, a price list with the same code and unit
 *   twice, or labour rates that make no sense
 */
export function priceMaterials(
  materials: { readonly items: readonly MaterialItem[]; readonly fenceLengthM: number; readonly crossingCount?: number },
  priceList: readonly PriceEntry[],
  labour: LabourRates,
): PricedMaterials {
  if (typeof materials !== 'object' || materials === null || !Array.isArray(materials.items)) throw new RangeError('materials must be a materials list { items, fenceLengthM }');
  checkNumber(materials.fenceLengthM, 'materials.fenceLengthM', 0, 1e7, 'm');
  if (!Array.isArray(priceList)) throw new RangeError('priceList must be an array of { code, unit, unitPriceCents }');
  const prices = new Map<string, number>();
  priceList.forEach((p, i) => {
    checkNumber(p?.unitPriceCents, `priceList[${i}].unitPriceCents (${p?.code})`, 0, 1e12, 'cents');
    const key = `${p.code}\u0000${p.unit}`;
    if (prices.has(key)) throw new RangeError(`priceList has ${p.code} per ${p.unit} twice: keep one price`);
    prices.set(key, p.unitPriceCents);
  });
  if (typeof labour !== 'object' || labour === null) throw new RangeError('labour must be { ratePerDayCents, metresPerDay }');
  checkNumber(labour.ratePerDayCents, 'labour.ratePerDayCents', 0, 1e10, 'cents');
  checkNumber(labour.metresPerDay, 'labour.metresPerDay', 1, 1e5, 'm');
  const daysPerCrossing = checkNumber(labour.daysPerCrossing ?? 0, 'labour.daysPerCrossing', 0, 100, 'days');

  const lines: PricedLine[] = [];
  const unpriced: { item: MaterialItem; why: string }[] = [];
  for (const it of materials.items) {
    const options = [{ unit: it.unit, quantity: it.quantity }, ...(it.alsoAs ?? [])];
    const match = options.find((o) => prices.has(`${it.code}\u0000${o.unit}`));
    if (!match) {
      const known = priceList.filter((p) => p.code === it.code).map((p) => p.unit);
      const why = known.length > 0 ? `priced per ${known.join(', ')} but listed per ${options.map((o) => o.unit).join(', ')}` : `no price for ${it.code}`;
      unpriced.push({ item: it, why });
      continue;
    }
    const unitPriceCents = prices.get(`${it.code}\u0000${match.unit}`)!;
    lines.push({ code: it.code, description: it.description, unit: match.unit, quantity: match.quantity, unitPriceCents, totalCents: Math.round(match.quantity * unitPriceCents), reason: it.reason });
  }
  const materialsCents = lines.reduce((s, l) => s + l.totalCents, 0);
  const crossings = materials.crossingCount ?? 0;
  const days = materials.fenceLengthM / labour.metresPerDay + daysPerCrossing * crossings;
  const costCents = Math.round(days * labour.ratePerDayCents);
  const reason = `${Number(materials.fenceLengthM.toFixed(1))} m at ${labour.metresPerDay} m a day${crossings > 0 && daysPerCrossing > 0 ? ` plus ${daysPerCrossing} days for each of ${crossings} crossings` : ''}.`;
  return {
    lines,
    unpriced,
    materialsCents,
    labour: { days, ratePerDayCents: labour.ratePerDayCents, costCents, reason },
    totalCents: materialsCents + costCents,
    complete: unpriced.length === 0,
  };
}
