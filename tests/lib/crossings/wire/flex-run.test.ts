/**
 * The flex run a floodgate needs, and the wire tension check for a given flex run.
 *
 * Outside references used here:
 * - Beer & Johnston, *Vector Mechanics for Engineers: Statics*, cables: exact parabola length.
 * - Hooke's law ΔL = T L / (E A), E = 200 GPa (from memory); shared/references.md, derived:
 *   2.5 mm wire A = 4.909 mm², EA = 981.7 kN, 1 kN stretches 100 m by 0.102 m.
 * - The Press (Christchurch), 18 April 1980: 2.5 mm H.T. breaks at 6650 N.
 * - Rule of thumb (common practice, no published source; DESIGN.md): a ~20 m floodgate wants at
 *   least ~50 m of flex run each side, longer floodgates proportionally more.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  findWireType,
  parabolaArcLengthM,
  requiredFlexRun,
  sagForExtraLength,
  wireTensionAfterDeflection,
  type FlexRunInput,
} from '../../../../src/lib/crossings/wire/index';

const HT = 'ht-2.50-plain';
const EA_HT_N = 200e9 * (Math.PI / 4) * 2.5e-3 ** 2; // 981 747.7 N

/** A 20 m floodgate of 2.5 mm H.T. strained to 1325 N, allowed half its 6650 N breaking load. */
const base: FlexRunInput = {
  floodgateSpanM: 20,
  deflectionM: 2,
  wire: HT,
  pretensionN: 1325,
  safeFractionOfBreaking: 0.5,
};

function deepFreeze<T extends object>(value: T): T {
  for (const v of Object.values(value)) if (typeof v === 'object' && v !== null) deepFreeze(v);
  return Object.freeze(value);
}

describe('requiredFlexRun', () => {
  it('20 m floodgate pushed 2 m: wire stretch asks for 117.9 m each side (by hand)', () => {
    // s = 4f/l = 0.4; L = (l²/8f)(s√(1+s²) + asinh s) = 25 × (0.4 × 1.077033 + 0.390035) = 20.52121 m
    // → Δ = 0.52121 m. Allowed 0.5 × 6650 = 3325 N; margin over the 1325 N pretension = 2000 N.
    // flex = (EA Δ / 2000 − 20) / 2 = (981 747.7 × 0.52121 / 2000 − 20) / 2 = 117.92 m > 50 m.
    const r = requiredFlexRun(base);
    expect(r.extraLengthM).toBeCloseTo(0.52121, 5);
    expect(r.allowedTensionN).toBe(3325);
    expect(r.flexRunEachSideM).toBeCloseTo(117.92, 2);
    expect(r.wireStretchFlexRunM).toBeCloseTo(117.92, 2);
    expect(r.governedBy).toBe('wire stretch');
    expect(r.ruleOfThumbMinimumM).toBe(50);
    expect(r.tensionIncreaseN).toBeCloseTo(2000, 6);
    expect(r.totalTensionN).toBeCloseTo(3325, 6);
    expect(r.inputs).toEqual({
      floodgateSpanM: 20, deflectionM: 2, wireId: HT, pretensionN: 1325, safeFractionOfBreaking: 0.5, ruleOfThumbMinimumM: 50,
    });
    expect(r.reasons.join(' ')).toMatch(/Wire stretch governs: build 117\.9 m of flex run each side/);
    expect(r.method).toMatch(/Beer & Johnston/);
  });

  it('a shallow push is governed by the rule of thumb: 50 m for a 20 m floodgate, 2.5 × span for longer (common practice)', () => {
    // f = 0.5 m: Δ ≈ 8 × 0.25 / 60 = 0.0333 m; EA Δ / 2000 = 16.4 m < 20 m span → no stretch run needed.
    const shallow = requiredFlexRun({ ...base, deflectionM: 0.5 });
    expect(shallow.wireStretchFlexRunM).toBe(0);
    expect(shallow.flexRunEachSideM).toBe(50);
    expect(shallow.governedBy).toBe('rule of thumb');
    expect(shallow.reasons.join(' ')).toMatch(/common practice, no published source/);
    const longer = requiredFlexRun({ ...base, floodgateSpanM: 40, deflectionM: 0.5 });
    expect(longer.ruleOfThumbMinimumM).toBe(100);
    expect(longer.flexRunEachSideM).toBe(100);
    const custom = requiredFlexRun({ ...base, deflectionM: 0.5, ruleOfThumbMinimumM: 30 });
    expect(custom.flexRunEachSideM).toBe(30);
    expect(custom.inputs.ruleOfThumbMinimumM).toBe(30);
  });

  it('never needs a shorter flex run for a deeper deflection (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 5, max: 200, noNaN: true }),
        fc.double({ min: 0, max: 0.3, noNaN: true }),
        fc.double({ min: 0, max: 0.3, noNaN: true }),
        fc.constantFrom(...['ht-2.50-plain', 'ms-4.00-plain', 'lt-12.5ga-barbed-2strand']),
        (l, r1, r2, wire) => {
          const [lo, hi] = r1 <= r2 ? [r1, r2] : [r2, r1];
          const input = { floodgateSpanM: l, wire, pretensionN: 1000, safeFractionOfBreaking: 0.6 };
          const shallow = requiredFlexRun({ ...input, deflectionM: lo * l });
          const deep = requiredFlexRun({ ...input, deflectionM: hi * l });
          expect(deep.flexRunEachSideM).toBeGreaterThanOrEqual(shallow.flexRunEachSideM * (1 - 1e-12));
        },
      ),
    );
  });

  it('never needs a shorter flex run for a longer span pushed by the same share of its span (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 5, max: 200, noNaN: true }),
        fc.double({ min: 5, max: 200, noNaN: true }),
        fc.double({ min: 0, max: 0.3, noNaN: true }),
        (l1, l2, ratio) => {
          const [short, long] = l1 <= l2 ? [l1, l2] : [l2, l1];
          const input = { wire: HT, pretensionN: 1100, safeFractionOfBreaking: 0.5 };
          const a = requiredFlexRun({ ...input, floodgateSpanM: short, deflectionM: ratio * short });
          const b = requiredFlexRun({ ...input, floodgateSpanM: long, deflectionM: ratio * long });
          expect(b.flexRunEachSideM).toBeGreaterThanOrEqual(a.flexRunEachSideM * (1 - 1e-12));
        },
      ),
    );
  });

  it('at the same absolute deflection a longer span needs less stretch run (Δ ≈ 8f²/3l falls as l grows)', () => {
    // Why the span property above holds the deflection-to-span ratio fixed, not the deflection.
    const a = requiredFlexRun({ ...base, floodgateSpanM: 20, deflectionM: 2 });
    const b = requiredFlexRun({ ...base, floodgateSpanM: 30, deflectionM: 2 });
    expect(b.extraLengthM).toBeLessThan(a.extraLengthM);
    expect(b.wireStretchFlexRunM).toBeLessThan(a.wireStretchFlexRunM);
    expect(b.flexRunEachSideM).toBeGreaterThanOrEqual(b.ruleOfThumbMinimumM);
  });

  it('is never below the rule-of-thumb minimum, and keeps the wire within its allowed tension (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 300, noNaN: true }),
        fc.double({ min: 0, max: 0.99, noNaN: true }),
        fc.double({ min: 0, max: 0.95, noNaN: true }),
        fc.double({ min: 0.05, max: 1, noNaN: true }),
        fc.option(fc.double({ min: 0, max: 500, noNaN: true }), { nil: undefined }),
        fc.constantFrom(...['ht-2.50-plain', 'ms-4.00-plain', 'mt-3.15-plain', 'ht-2.50-barbed-2strand']),
        (l, r, pretensionShare, fraction, minimum, wireId) => {
          const wire = findWireType(wireId);
          const allowed = fraction * wire.breakingLoadN;
          const input: FlexRunInput = {
            floodgateSpanM: l,
            deflectionM: r * l,
            wire: wireId,
            pretensionN: pretensionShare * allowed,
            safeFractionOfBreaking: fraction,
            ...(minimum === undefined ? {} : { ruleOfThumbMinimumM: minimum }),
          };
          const result = requiredFlexRun(input);
          const ruleMin = minimum ?? Math.max(50, 2.5 * l);
          expect(result.ruleOfThumbMinimumM).toBe(ruleMin);
          expect(result.flexRunEachSideM).toBeGreaterThanOrEqual(ruleMin);
          expect(result.totalTensionN).toBeLessThanOrEqual(result.allowedTensionN * (1 + 1e-9));
          const check = wireTensionAfterDeflection({ ...input, flexRunEachSideM: result.flexRunEachSideM });
          expect(check.totalTensionN).toBeCloseTo(result.totalTensionN, 6);
          expect(check.totalTensionN).toBeLessThanOrEqual(allowed * (1 + 1e-9));
        },
      ),
    );
  });

  it('does not mutate its input', () => {
    const wireObject = findWireType(HT);
    const input = deepFreeze({ ...base, wire: wireObject, ruleOfThumbMinimumM: 60 });
    const before = JSON.stringify(input);
    requiredFlexRun(input);
    expect(JSON.stringify(input)).toBe(before);
  });

  it('rejects bad input with a message a person can act on', () => {
    expect(() => requiredFlexRun({ ...base, floodgateSpanM: -20 })).toThrow(
      /floodgateSpanM: the floodgate span .* must be a number more than 0 m, got -20/,
    );
    expect(() => requiredFlexRun({ ...base, deflectionM: 20 })).toThrow(
      /deflectionM: the mid-span deflection must be a number at least 0 m and less than 20 m, got 20\..*check the units/,
    );
    expect(() => requiredFlexRun({ ...base, deflectionM: 25 })).toThrow(RangeError);
    expect(() => requiredFlexRun({ ...base, deflectionM: -1 })).toThrow(/deflectionM/);
    expect(() => requiredFlexRun({ ...base, wire: 'ht-2.5mm' })).toThrow(/unknown wire type "ht-2\.5mm"; choose one of: ht-2\.50-plain/);
    for (const bad of [0, -0.1, 1.2, 50, Number.NaN]) {
      expect(() => requiredFlexRun({ ...base, safeFractionOfBreaking: bad })).toThrow(
        /safeFractionOfBreaking: .* must be a number more than 0 and at most 1, got .*not a percentage/,
      );
    }
    expect(requiredFlexRun({ ...base, safeFractionOfBreaking: 1 }).allowedTensionN).toBe(6650);
    expect(() => requiredFlexRun({ ...base, pretensionN: -5 })).toThrow(/pretensionN: .* at least 0 N, got -5/);
    expect(() => requiredFlexRun({ ...base, ruleOfThumbMinimumM: -1 })).toThrow(/ruleOfThumbMinimumM/);
  });

  it('refuses a pretension already at or above the allowed tension, and says what to change', () => {
    expect(() => requiredFlexRun({ ...base, pretensionN: 3325 })).toThrow(
      /already at or above the 3\.33 kN allowed .*no flex run is long enough\. Strain the wire less/,
    );
    expect(() => requiredFlexRun({ ...base, pretensionN: 4000 })).toThrow(RangeError);
  });
});

describe('wireTensionAfterDeflection', () => {
  it('1 kN stretches 100 m of 2.5 mm wire by 0.102 m (references.md, derived from ΔL = T L / (E A))', () => {
    // Push a 20 m span until it needs 0.10186 m more wire; with 40 m of flex run each side the
    // 100 m of strained wire supplies it by stretching, which takes 1 kN.
    const extra = (1000 * 100) / EA_HT_N;
    expect(extra).toBeCloseTo(0.102, 3);
    const { sagM } = sagForExtraLength(20, extra);
    const check = wireTensionAfterDeflection({
      floodgateSpanM: 20, deflectionM: sagM, wire: HT, pretensionN: 1100, safeFractionOfBreaking: 0.5, flexRunEachSideM: 40,
    });
    expect(check.strainedLengthM).toBe(100);
    expect(check.axialStiffnessN / 1000).toBeCloseTo(981.7, 1);
    expect(check.tensionIncreaseN).toBeCloseTo(1000, 4);
    expect(check.totalTensionN).toBeCloseTo(2100, 4);
    expect(check.withinAllowed).toBe(true);
  });

  it('flags a flex run too short, and says so in plain words (by hand)', () => {
    // Same floodgate as the hand case above with 50 m each side: ΔT = 981 747.7 × 0.52121 / 120 = 4264 N.
    const check = wireTensionAfterDeflection({ ...base, flexRunEachSideM: 50 });
    expect(check.tensionIncreaseN).toBeCloseTo(4264.2, 1);
    expect(check.totalTensionN).toBeCloseTo(5589.2, 1);
    expect(check.fractionOfBreaking).toBeCloseTo(5589.2 / 6650, 4);
    expect(check.withinAllowed).toBe(false);
    expect(check.reasons.join(' ')).toMatch(/more than the 3\.33 kN allowed .*lengthen the flex runs/);
  });

  it('falls as the flex run grows (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 500, noNaN: true }), fc.double({ min: 0, max: 500, noNaN: true }), (a, b) => {
        const [short, long] = a <= b ? [a, b] : [b, a];
        const t1 = wireTensionAfterDeflection({ ...base, flexRunEachSideM: short }).totalTensionN;
        const t2 = wireTensionAfterDeflection({ ...base, flexRunEachSideM: long }).totalTensionN;
        expect(t2).toBeLessThanOrEqual(t1);
      }),
    );
  });

  it('does not mutate its input, and rejects a negative flex run', () => {
    const input = deepFreeze({ ...base, flexRunEachSideM: 80 });
    const before = JSON.stringify(input);
    wireTensionAfterDeflection(input);
    expect(JSON.stringify(input)).toBe(before);
    expect(() => wireTensionAfterDeflection({ ...base, flexRunEachSideM: -1 })).toThrow(/flexRunEachSideM: .* at least 0 m, got -1/);
  });

  it('uses the exact parabola for the extra length', () => {
    const check = wireTensionAfterDeflection({ ...base, deflectionM: 3, flexRunEachSideM: 100 });
    expect(check.extraLengthM).toBeCloseTo(parabolaArcLengthM(20, 3) - 20, 12);
  });
});
