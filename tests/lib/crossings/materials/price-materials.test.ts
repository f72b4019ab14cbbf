/**
 * Pricing a materials list: line totals, labour, unpriced items listed, never silently zero.
 * All arithmetic by hand; prices invented.
 */
import { describe, expect, it } from 'vitest';
import { priceMaterials, type MaterialItem, type PriceEntry } from '../../../../src/lib/crossings/materials/index';
import { deepFreeze } from '../design/fixtures';

const ITEMS: MaterialItem[] = [
  { code: 'LINE_POST', description: 'Line post', unit: 'each', quantity: 10, reason: 'r' },
  { code: 'WIRE_PLAIN', description: 'Plain wire', unit: 'roll', quantity: 2, alsoAs: [{ unit: 'm', quantity: 731 }], reason: 'r' },
  { code: 'TIE_WIRE', description: 'Tie wire', unit: 'kg', quantity: 0.3, alsoAs: [{ unit: 'm', quantity: 18 }], reason: 'r' },
  { code: 'BREAKAWAY_TIE', description: 'Breakaway tie', unit: 'each', quantity: 1, reason: 'r' },
];
const MATERIALS = { items: ITEMS, fenceLengthM: 1000, crossingCount: 1 };
const PRICES: PriceEntry[] = [
  { code: 'LINE_POST', unit: 'each', unitPriceCents: 1250 },
  { code: 'WIRE_PLAIN', unit: 'm', unitPriceCents: 33 },
  { code: 'TIE_WIRE', unit: 'kg', unitPriceCents: 999 },
];

describe('priceMaterials', () => {
  it('prices lines, in another unit where the price list sells that way, and labour (by hand)', () => {
    const p = priceMaterials(MATERIALS, PRICES, { ratePerDayCents: 80_000, metresPerDay: 200 });
    expect(p.lines.map((l) => [l.code, l.unit, l.quantity, l.totalCents])).toEqual([
      ['LINE_POST', 'each', 10, 12_500],
      ['WIRE_PLAIN', 'm', 731, 24_123],
      ['TIE_WIRE', 'kg', 0.3, 300], // 0.3 × 999 = 299.7 → 300 cents
    ]);
    expect(p.materialsCents).toBe(12_500 + 24_123 + 300);
    // 1000 m at 200 m a day = 5 days × $800.
    expect(p.labour).toMatchObject({ days: 5, costCents: 400_000 });
    expect(p.totalCents).toBe(36_923 + 400_000);
  });

  it('lists unpriced items rather than counting them as zero', () => {
    const p = priceMaterials(MATERIALS, PRICES, { ratePerDayCents: 80_000, metresPerDay: 200 });
    expect(p.complete).toBe(false);
    expect(p.unpriced).toEqual([{ item: ITEMS[3], why: 'no price for BREAKAWAY_TIE' }]);
    const wrongUnit = priceMaterials(MATERIALS, [...PRICES, { code: 'BREAKAWAY_TIE', unit: 'kg', unitPriceCents: 5 }], { ratePerDayCents: 0, metresPerDay: 200 });
    expect(wrongUnit.unpriced[0]!.why).toMatch(/priced per kg but listed per each/);
    const all = priceMaterials(MATERIALS, [...PRICES, { code: 'BREAKAWAY_TIE', unit: 'each', unitPriceCents: 150 }], { ratePerDayCents: 0, metresPerDay: 200 });
    expect(all.complete).toBe(true);
    expect(all.totalCents).toBe(36_923 + 150);
  });

  it('adds days per crossing when given', () => {
    const p = priceMaterials(MATERIALS, PRICES, { ratePerDayCents: 80_000, metresPerDay: 200, daysPerCrossing: 1.5 });
    expect(p.labour.days).toBe(6.5);
    expect(p.labour.costCents).toBe(520_000);
  });

  it('rejects negative prices, duplicate entries and absurd labour', () => {
    expect(() => priceMaterials(MATERIALS, [{ code: 'LINE_POST', unit: 'each', unitPriceCents: -1 }], { ratePerDayCents: 1, metresPerDay: 200 })).toThrow(/unitPriceCents/);
    expect(() => priceMaterials(MATERIALS, [PRICES[0]!, PRICES[0]!], { ratePerDayCents: 1, metresPerDay: 200 })).toThrow(/twice/);
    expect(() => priceMaterials(MATERIALS, PRICES, { ratePerDayCents: 1, metresPerDay: 0 })).toThrow(/metresPerDay/);
    expect(() => priceMaterials(MATERIALS, PRICES, { ratePerDayCents: -5, metresPerDay: 100 })).toThrow(/ratePerDayCents/);
  });

  it('does not mutate its input', () => {
    const materials = deepFreeze(structuredClone(MATERIALS));
    const prices = deepFreeze(structuredClone(PRICES));
    expect(priceMaterials(materials, prices, deepFreeze({ ratePerDayCents: 80_000, metresPerDay: 200 }))).toEqual(
      priceMaterials(MATERIALS, PRICES, { ratePerDayCents: 80_000, metresPerDay: 200 }),
    );
  });
});
