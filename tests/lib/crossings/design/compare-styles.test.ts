/**
 * Both ways to build a crossing, side by side.
 *
 * Outside references used here (shared/references.md):
 * - Rules of thumb (DESIGN.md): end strainers on dry ground 15–20 m beyond the wet zone, long
 *   flex runs for a continuous floodgate — common practice, no published source.
 * - NSW DPI Primefact 681 "Building a floodgate" (2009) and WA Water Note WN19 (2000): a separate
 *   drop-down section on its own end assemblies, so the fence ends on both banks.
 * - Drag F = ½ ρ C_d A V², FEMA P-55 Coastal Construction Manual (4th ed.) Eq. 8.8; derived checks
 *   from references.md: flat plate C_d 2.0, 1 m², 2 m/s → 4.0 kN; debris mat 10 m × 0.6 m,
 *   C_d 2.0, 1.5 m/s → 13.5 kN.
 * - 2.50 mm high-tensile plain wire breaks at 6650 N, double-loop knot keeps 44 % (The Press,
 *   Christchurch, 18 April 1980); usual strain about 1.1 kN (UF IFAS Extension circular 851).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compareStyles, type CompareStylesInput } from '../../../../src/lib/crossings/compare-styles';
import { designCrossing, type CrossingDesign, type CrossingDesignInput } from '../../../../src/lib/crossings/design-crossing';
import { floodgateLoads } from '../../../../src/lib/crossings/loads/floodgate-loads';
import { checkSectionRelease } from '../../../../src/lib/crossings/loads/section-release';
import { findWireType } from '../../../../src/lib/crossings/wire/wire-types';
import type { DesignSettings } from '../../../../src/lib/schemas/crossing';
import { deepFreeze } from './fixtures';

// A trapezoidal channel: bed 4 m wide at 100 m, 1 : 2 banks 1.5 m high, then a plain falling
// 0.002 m/m away on both sides; 1 m samples along a square crossing at chainage 200 m.
function trapezoidProfile() {
  const profile = [];
  for (let chainageM = 0; chainageM <= 400; chainageM += 1) {
    const offset = Math.abs(chainageM - 200);
    profile.push({ chainageM, elevationM: offset <= 2 ? 100 : offset <= 5 ? 100 + (offset - 2) / 2 : 101.5 + (offset - 5) * 0.002 });
  }
  return profile;
}
const FENCE = { wireHeightsM: [0.2, 0.4, 0.6, 0.8, 1.05], wireKinds: ['plain', 'plain', 'plain', 'barbed', 'barbed'] as ('plain' | 'barbed')[], plainWireTypeId: 'ht-2.50-plain', barbedWireTypeId: 'lt-12.5ga-barbed-2strand', postSpacingM: 10, dropperSpacingM: 2.5 };
const input = (inputs: CrossingDesignInput['inputs'] = {}, settings: DesignSettings = {}): CrossingDesignInput => ({
  profile: trapezoidProfile(),
  crossingChainageM: 200,
  crossingAngleDeg: 90,
  channelSlope: 0.002,
  catchment: null,
  ifd: null,
  fence: { ...FENCE, wireKinds: [...FENCE.wireKinds] },
  inputs: { floodMarkM: 1.2, ...inputs },
  settings,
});
type Designed = Extract<CrossingDesign, { status: 'designed' }>;
const designed = (i: CrossingDesignInput): Designed => {
  const d = designCrossing(i);
  if (d.status !== 'designed') throw new Error(`expected a design, got ${d.status}`);
  return d;
};
const qty = (d: { materials: { items: { code: string; quantity: number }[] } }, code: string) => d.materials.items.filter((it) => it.code === code).reduce((s, it) => s + it.quantity, 0);
const wireMetres = (items: readonly { code: string; alsoAs?: readonly { unit: string; quantity: number }[] }[]) =>
  items.filter((it) => it.code.startsWith('WIRE_')).reduce((s, it) => s + (it.alsoAs?.find((a) => a.unit === 'm')?.quantity ?? 0), 0);

const cont = designed(input({ style: 'continuous-floodgate' }));
const drop = designed(input({ style: 'drop-down-section' }));

describe('both styles on the trapezoid (flood mark 1.2 m, freeboard 0.3 m: wet zone 10 m)', () => {
  it('puts every end assembly on dry ground, at least the 15 m set-back outside the wet zone (common practice, no published source)', () => {
    for (const d of [cont, drop]) {
      const { wetZone, endStrainers } = d.layout;
      expect(wetZone.lengthM).toBeCloseTo(10, 1);
      expect(endStrainers.every((s) => s.onDryGround)).toBe(true);
      expect(endStrainers[0].chainageM).toBeLessThanOrEqual(wetZone.startChainageM - 15 + 1e-9);
      expect(endStrainers[1].chainageM).toBeGreaterThanOrEqual(wetZone.endChainageM + 15 - 1e-9);
    }
  });

  it('runs the continuous floodgate\'s wires through, with flex runs of at least 50 m each side (common practice)', () => {
    const detail = cont.layout.styleDetail;
    expect(detail.wiresRunThrough).toBe(true);
    expect(detail.flexRunEachSideM).toBeGreaterThanOrEqual(50);
    expect(detail.flexRunStrainers).toHaveLength(2);
    expect(detail.wireRunM).toBeCloseTo(cont.layout.span.lengthM + 2 * detail.flexRunEachSideM, 9);
    expect(cont.wireCheck).not.toBeNull();
  });

  it('terminates the fence on both banks for the drop-down section, with no flex run (NSW DPI Primefact 681, 2009)', () => {
    const detail = drop.layout.styleDetail;
    expect(detail.wiresRunThrough).toBe(false);
    expect(detail.flexRunEachSideM).toBe(0);
    expect(detail.flexRunStrainers).toEqual([]);
    expect(drop.wireCheck).toBeNull();
    expect(detail.sacrificialSection?.lengthM).toBeCloseTo(drop.layout.span.lengthM, 9);
    const ends = drop.layout.breakawayTies.filter((t) => t.at === 'end-assembly').map((t) => t.chainageM);
    expect(ends).toEqual(drop.layout.endStrainers.map((s) => s.chainageM));
  });

  it('counts materials as the layouts say: two more strainers and stays for the continuous flex runs, two more ties for the section', () => {
    expect(qty(cont, 'STRAINER_ASSEMBLY')).toBe(4);
    expect(qty(drop, 'STRAINER_ASSEMBLY')).toBe(2);
    expect(qty(cont, 'STAY') - qty(drop, 'STAY')).toBe(2 * 2 + 2 * (2 - 1));
    expect(qty(drop, 'BREAKAWAY_TIE') - qty(cont, 'BREAKAWAY_TIE')).toBe(2);
    expect(qty(cont, 'HEAVY_POST')).toBe(qty(drop, 'HEAVY_POST'));
  });

  it('compares both over the same length of fence: the same metres of wire either way', () => {
    const [c, d] = cont.comparison.sides;
    expect(cont.comparison.stretchM).toBeCloseTo(cont.layout.styleDetail.wireRunM, 6);
    // Each list rounds its metres up per wire kind: within 2 m.
    expect(Math.abs(wireMetres(c.materials) - wireMetres(d.materials))).toBeLessThanOrEqual(2);
    expect(c.counts.flexRunStrainers).toBe(2);
    expect(d.counts.flexRunStrainers).toBe(0);
    expect(d.counts.breakawayTies).toBe(c.counts.breakawayTies + 2);
  });

  it('keeps the selected style as the design, records the planner, and compares the same two either way', () => {
    expect(cont.layout.style).toBe('continuous-floodgate');
    expect(drop.layout.style).toBe('drop-down-section');
    expect(cont.styleChoice.chosenBy).toBe('planner');
    expect(cont.comparison.sides.map((s) => s.inPlan)).toEqual([true, false]);
    expect(drop.comparison.sides.map((s) => s.inPlan)).toEqual([false, true]);
    expect(drop.comparison.sides[0].materials).toEqual(cont.comparison.sides[0].materials);
  });

  it('limits the drop-down end-assembly load to the release load and gives after-flood hours from the settings', () => {
    const settings = { sectionReleaseKn: 0.05, resetTieHours: 0.75, rehangSectionHours: 5 };
    const d = designed(input({}, settings));
    const [c, s] = d.comparison.sides;
    expect(s.endAssemblyLoadKn).toBeCloseTo(Math.min(0.05, c.endAssemblyLoadKn!), 9);
    expect(c.afterFlood.hours).toBeCloseTo(0.75 * c.counts.breakawayTies, 9);
    expect(s.afterFlood.hours).toBe(5);
  });
});

describe('the default and the recommendation', () => {
  it('chooses continuous for this calm crossing, and drop-down once heavy debris is expected', () => {
    const calm = designed(input({}, { debris: 'light' }));
    expect(calm.styleChoice).toMatchObject({ chosenBy: 'rule', style: 'continuous-floodgate' });
    expect(calm.layout.style).toBe('continuous-floodgate');
    const heavy = designed(input({ debris: 'heavy' }, { debris: 'light' }));
    expect(heavy.layout.style).toBe('drop-down-section');
    expect(heavy.comparison.recommendation.style).toBe('drop-down-section');
    expect(heavy.comparison.recommendation.reasons.join(' ')).toMatch(/heavy debris/);
  });

  it('switches with the flood depth: a mark above the depth threshold makes it drop-down', () => {
    expect(designed(input({ floodMarkM: 1.0 }, { debris: 'light', dropDownDepthM: 1.1 })).layout.style).toBe('continuous-floodgate');
    expect(designed(input({ floodMarkM: 1.2 }, { debris: 'light', dropDownDepthM: 1.1 })).layout.style).toBe('drop-down-section');
  });

  it('property: tightening any threshold never moves a design from drop-down back to continuous', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.3, max: 1.45, noNaN: true }),
        fc.record({ dropDownWidthM: fc.double({ min: 1, max: 80, noNaN: true }), dropDownDepthM: fc.double({ min: 0.1, max: 2, noNaN: true }), dropDownVelocityMs: fc.double({ min: 0.1, max: 3, noNaN: true }) }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (markM, thresholds, shrink) => {
          const loose = designed(input({ floodMarkM: markM }, { debris: 'light', ...thresholds }));
          const tight = designed(input({ floodMarkM: markM }, { debris: 'light', dropDownWidthM: thresholds.dropDownWidthM * shrink + 0.5, dropDownDepthM: thresholds.dropDownDepthM * shrink + 0.05, dropDownVelocityMs: thresholds.dropDownVelocityMs * shrink + 0.05 }));
          return loose.layout.style === 'continuous-floodgate' || tight.layout.style === 'drop-down-section';
        },
      ),
      { seed: 8, numRuns: 40 },
    );
  });

  it('refuses an unknown style from a caller that skipped the schema', () => {
    expect(() => designCrossing(input({ style: 'zigzag' as 'continuous-floodgate' }))).toThrow(/plannerStyle must be/);
  });
});

describe('the drop-down section\'s release against the drag formula and wire data', () => {
  const wire = findWireType('ht-2.50-plain');
  const mat = floodgateLoads({ wettedWidthM: 10, meanDepthM: 0.6, velocityMs: 1.5, blockageFraction: 1, wireCount: 0, wireDiameterM: 0.0025 });
  const base = { loads: mat, wire, wireCount: 5, pretensionN: 1100, safeFractionOfBreaking: 0.5 };

  it('debris mat 10 m × 0.6 m at 1.5 m/s drags 13.5 kN (FEMA P-55 Eq. 8.8, derived check in references.md)', () => {
    expect(mat.totalKn).toBeCloseTo(13.5, 9);
    expect(wire.breakingLoadN).toBe(6650); // The Press, Christchurch, 18 April 1980
  });

  it('releases at the design speed when the ties total the drag, and at 1.5/√2 m/s when they total half of it (F ∝ V²)', () => {
    const equal = checkSectionRelease({ ...base, releaseEachEndKn: 6.75 });
    expect(equal.releaseVelocityMs).toBeCloseTo(1.5, 9);
    expect(equal.releasesInDesignFlood).toBe(true);
    const half = checkSectionRelease({ ...base, releaseEachEndKn: 3.375 });
    expect(half.releaseVelocityMs).toBeCloseTo(1.5 / Math.SQRT2, 9);
    const strong = checkSectionRelease({ ...base, releaseEachEndKn: 7 });
    expect(strong.releasesInDesignFlood).toBe(false);
  });

  it('flat plate 1 m² at 2 m/s is 4.0 kN (references.md, derived): ties of 0.5 kN each let go at 1 m/s', () => {
    const plate = floodgateLoads({ wettedWidthM: 1, meanDepthM: 1, velocityMs: 2, blockageFraction: 1, wireCount: 0, wireDiameterM: 0.0025 });
    expect(plate.totalKn).toBeCloseTo(4.0, 9);
    expect(checkSectionRelease({ ...base, loads: plate, releaseEachEndKn: 0.5 }).releaseVelocityMs).toBeCloseTo(1.0, 9);
  });

  it('checks the end assembly: 5 wires × 1.1 kN strain plus the release within 5 × 50 % × 6650 N = 16.6 kN', () => {
    const light = checkSectionRelease({ ...base, releaseEachEndKn: 1.5 });
    expect(light.fenceStrainKn).toBeCloseTo(5.5, 9);
    expect(light.endAssemblyCapacityKn).toBeCloseTo(16.625, 9);
    expect(light.endAssemblyHolds).toBe(true);
    expect(light.tieGoesFirst).toBe(true);
    const heavy = checkSectionRelease({ ...base, releaseEachEndKn: 12 });
    expect(heavy.endAssemblyHolds).toBe(false);
    // 5 × 44 % × 6650 N = 14.63 kN: a 15 kN tie outlasts the knotted wire (double loop, The Press 1980).
    expect(checkSectionRelease({ ...base, releaseEachEndKn: 15 }).tieGoesFirst).toBe(false);
    expect(heavy.reasons.join(' ')).toMatch(/lighten the ties/);
  });

  it('refuses a release load of 0 with a message naming it', () => {
    expect(() => checkSectionRelease({ ...base, releaseEachEndKn: 0 })).toThrow(/releaseEachEndKn/);
  });
});

describe('compareStyles input', () => {
  const parts = (d: Designed) => ({ layout: d.layout, loads: d.loads, materials: d.materials });
  const args = (): CompareStylesInput => ({
    continuous: parts(cont),
    dropDown: parts(drop),
    choice: cont.styleChoice,
    fence: { wireHeightsM: FENCE.wireHeightsM, wireKinds: FENCE.wireKinds, rollLengthM: { plain: 648, barbed: 402 }, postSpacingM: 10, dropperSpacingM: 2.5 },
    plainWire: findWireType('ht-2.50-plain'),
    pretensionN: 1100,
    safeFractionOfBreaking: 0.5,
    sectionReleaseKn: 1.5,
    resetTieHours: 0.5,
    rehangSectionHours: 3,
  });

  it('does not modify its input', () => {
    const frozen = deepFreeze(structuredClone(args()));
    expect(compareStyles(frozen).sides).toHaveLength(2);
  });

  it('refuses two designs of the same style, and negative hours', () => {
    expect(() => compareStyles({ ...args(), dropDown: parts(cont) })).toThrow(/drop-down section design/);
    expect(() => compareStyles({ ...args(), rehangSectionHours: -1 })).toThrow(/rehangSectionHours/);
  });
});
