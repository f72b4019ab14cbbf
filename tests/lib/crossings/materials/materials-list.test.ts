/**
 * Materials lists for a crossing and a whole fence line, counted by hand.
 *
 * Outside references used here:
 * - Coil lengths: 2.50 mm high-tensile plain, 25 kg coil = 648 m (NZ Agricultural Engineering
 *   Institute test reported in The Press, Christchurch, 18 April 1980); two-strand barbed,
 *   402 m roll (British Columbia Ministry of Agriculture factsheet 307.100-1, 2015).
 * - Steel density 7850 kg/m³ for the mass of tie wire (the usual value; from memory).
 * - Rules of thumb (common practice, no published source): strainer assemblies on long straights
 *   (default 400 m), corners, hung droppers tied firmly to every wire; each check says so.
 * - The V layout of ../design/fixtures.ts: wet zone 88–112 m, end strainers at 73 and 127 m,
 *   flex runs of 60 m to 13 and 187 m.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { layoutFloodgate } from '../../../../src/lib/crossings/design/index';
import {
  materialsForCrossing,
  materialsForFenceLine,
  type MaterialItem,
  type MaterialsFenceSpec,
} from '../../../../src/lib/crossings/materials/index';
import { materialsForCrossing as fromListModule } from '../../../../src/lib/crossings/materials/materials-list';
import { deepFreeze, FENCE_WIRES, V_INPUT } from '../design/fixtures';

const FENCE: MaterialsFenceSpec = {
  wireHeightsM: [...FENCE_WIRES.wireHeightsM],
  wireKinds: [...FENCE_WIRES.wireKinds],
  rollLengthM: { plain: 648, barbed: 402 },
  postSpacingM: 4,
  dropperSpacingM: 2,
};
const CONTINUOUS = layoutFloodgate(V_INPUT);
const DROP_DOWN = layoutFloodgate({ ...V_INPUT, style: 'drop-down-section' });

/** Total quantity of a code over all its lines. */
const total = (items: readonly MaterialItem[], code: MaterialItem['code']) => items.filter((i) => i.code === code).reduce((s, i) => s + i.quantity, 0);
const metres = (items: readonly MaterialItem[], code: MaterialItem['code']) => items.find((i) => i.code === code)?.alsoAs?.find((a) => a.unit === 'm')?.quantity;

describe('materialsForCrossing', () => {
  it('counts a continuous floodgate by hand', () => {
    const m = materialsForCrossing(CONTINUOUS, FENCE);
    // 2 floodgate end strainers + 2 flex-run strainers (common practice, no published source).
    expect(total(m.items, 'STRAINER_ASSEMBLY')).toBe(4);
    // End strainers 2 × 2 (wires pass through), flex-run strainers 2 × 2, braced posts at 96, 100, 104 m.
    expect(total(m.items, 'STAY')).toBe(11);
    expect(total(m.items, 'HEAVY_POST')).toBe(7);
    // Set-back: 3 posts each side; flex runs: 60 m / 4 m = 15 panels, 14 posts each side.
    expect(total(m.items, 'LINE_POST')).toBe(6 + 28);
    expect(total(m.items, 'HUNG_DROPPER')).toBe(7);
    expect(total(m.items, 'LINK_OPEN')).toBe(1);
    expect(total(m.items, 'LINK_CLOSED')).toBe(6);
    // Span: 14 panels of 3.75 m or 4 m, one 2 m dropper in each; flex runs: 15 panels each side.
    expect(total(m.items, 'DROPPER')).toBe(14 + 30);
    expect(total(m.items, 'CLIP')).toBe(5 * 34);
    expect(total(m.items, 'BREAKAWAY_TIE')).toBe(1);
    // Wire run 54 + 2 × 60 = 174 m per wire; 4 plain wires: 696 m × 1.05 = 730.8 → 731 m → 2 rolls of 648 m.
    expect(metres(m.items, 'WIRE_PLAIN')).toBe(731);
    expect(total(m.items, 'WIRE_PLAIN')).toBe(2);
    // 1 barbed: 174 × 1.05 = 182.7 → 183 m → 1 roll of 402 m.
    expect(metres(m.items, 'WIRE_BARBED')).toBe(183);
    expect(total(m.items, 'WIRE_BARBED')).toBe(1);
    // Tie wire: 7 hung droppers × 5 wires × 0.5 m = 17.5 → 18 m; 1.6 mm at 7850 kg/m³ = 15.78 g/m → 0.284 → 0.3 kg.
    expect(metres(m.items, 'TIE_WIRE')).toBe(18);
    expect(total(m.items, 'TIE_WIRE')).toBe(0.3);
    expect(m.fenceLengthM).toBeCloseTo(174, 9);
    expect(m.crossingCount).toBe(1);
    expect(m.cautions.join(' ')).toMatch(/buried services/);
  });

  it('counts a drop-down section: no flex-run strainers, one stay per end assembly, three breakaway ties', () => {
    const m = materialsForCrossing(DROP_DOWN, FENCE);
    expect(total(m.items, 'STRAINER_ASSEMBLY')).toBe(2);
    expect(total(m.items, 'STAY')).toBe(2 + 3);
    expect(total(m.items, 'LINE_POST')).toBe(6);
    expect(total(m.items, 'DROPPER')).toBe(14);
    expect(total(m.items, 'BREAKAWAY_TIE')).toBe(3);
    // 54 m per wire: plain 4 × 54 × 1.05 = 226.8 → 227 m; barbed 56.7 → 57 m.
    expect(metres(m.items, 'WIRE_PLAIN')).toBe(227);
    expect(metres(m.items, 'WIRE_BARBED')).toBe(57);
    expect(m.fenceLengthM).toBeCloseTo(54, 9);
  });

  it('gives every item a reason, and is re-exported from materials-list', () => {
    const m = materialsForCrossing(CONTINUOUS, FENCE);
    expect(m.items.every((i) => i.reason.length > 10 && i.quantity > 0)).toBe(true);
    expect(fromListModule).toBe(materialsForCrossing);
  });

  it('rejects a fence whose wires differ from the layout, and bad specs', () => {
    expect(() => materialsForCrossing(CONTINUOUS, { ...FENCE, wireHeightsM: [0.2, 0.5, 0.8, 1.1, 1.5] })).toThrow(/lay the floodgate out again/);
    expect(() => materialsForCrossing(CONTINUOUS, { ...FENCE, postSpacingM: 0 })).toThrow(/postSpacingM/);
    expect(() => materialsForCrossing(CONTINUOUS, { ...FENCE, rollLengthM: { plain: 648, barbed: -1 } })).toThrow(/rollLengthM.barbed/);
    expect(() => materialsForCrossing(CONTINUOUS, { ...FENCE, wireAllowanceFraction: -0.1 })).toThrow(/wireAllowanceFraction/);
  });

  it('does not mutate its input', () => {
    const layout = deepFreeze(structuredClone(CONTINUOUS));
    const fence = deepFreeze(structuredClone(FENCE));
    expect(materialsForCrossing(layout, fence)).toEqual(materialsForCrossing(CONTINUOUS, FENCE));
  });
});

describe('materialsForFenceLine', () => {
  const line = { lengthM: 1000, vertices: [{ chainageM: 300, deflectionDeg: 5 }, { chainageM: 600, deflectionDeg: -30 }], crossings: [CONTINUOUS], fence: FENCE };

  it('counts a 1000 m line with a corner and a continuous crossing by hand', () => {
    const m = materialsForFenceLine(line);
    // Ordinary fence: 0–13, 187–600 and 600–1000 m (826 m); the 5° vertex is no corner (threshold 10°).
    // Strainers: 2 ends + 1 corner + 1 intermediate (413 m > 400 m; common practice) + 4 of the crossing.
    expect(total(m.items, 'STRAINER_ASSEMBLY')).toBe(8);
    // Stays: ends 1 each, corner 2, intermediate 2, crossing 11.
    expect(total(m.items, 'STAY')).toBe(2 + 2 + 2 + 11);
    // Posts: 13 m → 4 panels, 3 posts; 413 m → 2 × 206.5 m → 2 × 51; 400 m → 99; crossing 34.
    expect(total(m.items, 'LINE_POST')).toBe(3 + 102 + 99 + 34);
    // Droppers: 4 + 2 × 52 + 100 panels with one each, crossing 44.
    expect(total(m.items, 'DROPPER')).toBe(4 + 104 + 100 + 44);
    expect(total(m.items, 'CLIP')).toBe(5 * 204 + 170);
    // Plain: 826 + 4 × 174 = 1522 m × 1.05 = 1598.1 → 1599 m → 3 rolls; barbed: 4 × 826 + 174 = 3478 × 1.05 → 3652 m → 10 rolls.
    expect(metres(m.items, 'WIRE_PLAIN')).toBe(1599);
    expect(total(m.items, 'WIRE_PLAIN')).toBe(3);
    expect(metres(m.items, 'WIRE_BARBED')).toBe(3652);
    expect(total(m.items, 'WIRE_BARBED')).toBe(10);
    expect(total(m.items, 'HEAVY_POST')).toBe(7);
    expect(total(m.items, 'BREAKAWAY_TIE')).toBe(1);
    expect(m.fenceLengthM).toBe(1000);
    expect(m.crossingCount).toBe(1);
    expect(m.warnings).toEqual([]);
    // Merged: one line per code and description.
    const keys = m.items.map((i) => `${i.code}|${i.description}`);
    expect(new Set(keys).size).toBe(keys.length);
  });

  it('counts a plain line with no crossings: ends, intermediates every 400 m at most (common practice, no published source)', () => {
    const m = materialsForFenceLine({ lengthM: 1000, vertices: [], crossings: [], fence: { ...FENCE, dropperSpacingM: null } });
    // 1000 m → 3 runs of 333.3 m: 2 intermediates; 84 panels of 3.97 m → 83 posts each.
    expect(total(m.items, 'STRAINER_ASSEMBLY')).toBe(4);
    expect(total(m.items, 'LINE_POST')).toBe(3 * 83);
    expect(total(m.items, 'DROPPER')).toBe(0);
    expect(m.items.some((i) => i.code === 'TIE_WIRE' || i.code === 'HUNG_DROPPER')).toBe(false);
  });

  it('warns about a corner inside a crossing and crossings past the line end', () => {
    const m = materialsForFenceLine({ ...line, lengthM: 150, vertices: [{ chainageM: 100, deflectionDeg: 45 }] });
    expect(m.warnings.some((w) => /corner at 100 m lies within the crossing/.test(w))).toBe(true);
    expect(m.warnings.some((w) => /past the end/.test(w))).toBe(true);
  });

  it('warns about overlapping crossings', () => {
    const other = layoutFloodgate({ ...V_INPUT, profile: V_INPUT.profile.map((p) => ({ ...p, chainageM: p.chainageM + 100 })), crossingChainageM: 200 });
    const m = materialsForFenceLine({ ...line, crossings: [CONTINUOUS, other] });
    expect(m.warnings.some((w) => /overlap/.test(w))).toBe(true);
  });

  it('puts no straight run longer than the strainer interval (property, common practice)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 5000, noNaN: true }), fc.double({ min: 50, max: 1000, noNaN: true }), (lengthM, strainerIntervalM) => {
        const m = materialsForFenceLine({ lengthM, vertices: [], crossings: [], fence: { ...FENCE, strainerIntervalM } });
        const strainers = total(m.items, 'STRAINER_ASSEMBLY');
        expect(lengthM / (strainers - 1)).toBeLessThanOrEqual(strainerIntervalM + 1e-6);
        expect(strainers).toBe(1 + Math.max(1, Math.ceil(lengthM / strainerIntervalM - 1e-9)));
      }),
    );
  });

  it('rejects bad input with clear messages', () => {
    expect(() => materialsForFenceLine({ ...line, lengthM: 0 })).toThrow(/lengthM/);
    expect(() => materialsForFenceLine({ ...line, vertices: [{ chainageM: 2000, deflectionDeg: 10 }] })).toThrow(/vertices\[0\].chainageM/);
    expect(() => materialsForFenceLine({ ...line, fence: { ...FENCE, strainerIntervalM: 0 } })).toThrow(/strainerIntervalM/);
    expect(() => materialsForFenceLine({ ...line, fence: { ...FENCE, dropperSpacingM: -1 } })).toThrow(/dropperSpacingM/);
  });

  it('does not mutate its input', () => {
    const frozen = deepFreeze(structuredClone(line));
    expect(materialsForFenceLine(frozen)).toEqual(materialsForFenceLine(line));
  });
});
