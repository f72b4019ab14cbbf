/**
 * Cable lengths (exact parabola, series, catenary) and the sag for a given extra length.
 *
 * Outside references used here:
 * - Beer & Johnston, *Vector Mechanics for Engineers: Statics*, cables: parabolic cable length
 *   L = l [1 + (8/3)(f/l)² − (32/5)(f/l)⁴ + …]; the problem of a cable of length l + Δ over a span
 *   l = 100 ft with Δ = 4 ft sagging about √(3 l Δ / 8) = 12.25 ft.
 * - shared/references.md, derived check (from the formulas above and the catenary): l = 100 m,
 *   f = 5 m → exact parabola 100.66272 m, two-term series 100.66667 m, catenary 100.66358 m.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { cableLength, parabolaArcLengthM, parabolaExtraLengthM, sagForExtraLength } from '../../../../src/lib/crossings/wire/index';

const relErr = (actual: number, expected: number): number => Math.abs(actual - expected) / Math.abs(expected);

describe('cableLength', () => {
  it('l = 100 m, f = 5 m: parabola 100.66272, two-term 100.66667, catenary 100.66358 m (references.md, derived; Beer & Johnston)', () => {
    const c = cableLength(100, 5);
    expect(c.parabolaM).toBeCloseTo(100.66272, 5);
    expect(c.seriesTwoTermM).toBeCloseTo(100.66667, 5);
    expect(c.catenaryM).toBeCloseTo(100.66358, 5);
    // Three terms: 100 × (1 + 0.0066667 − 0.0004) = 100.66267, closer to the exact parabola than two.
    expect(c.seriesThreeTermM).toBeCloseTo(100.66267, 5);
    expect(Math.abs(c.seriesThreeTermM - c.parabolaM)).toBeLessThan(Math.abs(c.seriesTwoTermM - c.parabolaM));
  });

  it('is the span when there is no sag (by hand)', () => {
    expect(cableLength(37, 0)).toEqual({
      spanM: 37, sagM: 0, parabolaM: 37, seriesTwoTermM: 37, seriesThreeTermM: 37, catenaryM: 37,
    });
  });

  it('lies between the chords (2√(l²/4 + f²)) and the chords plus a little, and grows with the sag (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 500, noNaN: true }), fc.double({ min: 0.001, max: 0.24, noNaN: true }), (l, r) => {
        const f = r * l;
        const c = cableLength(l, f);
        const chords = 2 * Math.hypot(l / 2, f);
        expect(c.parabolaM).toBeGreaterThanOrEqual(chords * (1 - 1e-12));
        expect(c.catenaryM).toBeGreaterThanOrEqual(chords * (1 - 1e-12));
        expect(parabolaArcLengthM(l, f * 1.01)).toBeGreaterThan(c.parabolaM);
        // Shallow sags: the series agrees with the exact parabola to the order of the first dropped term.
        expect(relErr(c.seriesThreeTermM, c.parabolaM)).toBeLessThan(40 * r ** 6 + 1e-12);
      }),
    );
  });

  it('rejects a negative span or sag with the input named', () => {
    expect(() => cableLength(-10, 1)).toThrow(/spanM: the span must be a number more than 0 m, got -10/);
    expect(() => cableLength(10, -1)).toThrow(/sagM: the sag must be a number at least 0 m, got -1/);
    expect(() => cableLength(Number.NaN, 1)).toThrow(RangeError);
  });
});

describe('parabolaExtraLengthM', () => {
  it('is the exact parabola length less the span: 0.66272 m for l = 100 m, f = 5 m (references.md, derived)', () => {
    expect(parabolaExtraLengthM(100, 5)).toBeCloseTo(0.66272, 5);
    expect(parabolaExtraLengthM(100, 5)).toBeCloseTo(parabolaArcLengthM(100, 5) - 100, 12);
  });

  it('follows 8f²/3l for small sags, stays positive and grows with the sag (property; Beer & Johnston series)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.1, max: 1000, noNaN: true }), fc.double({ min: 1e-12, max: 1e-3, noNaN: true }), (l, r) => {
        const f = r * l;
        const extra = parabolaExtraLengthM(l, f);
        const firstTerm = (8 * f * f) / (3 * l);
        expect(extra).toBeGreaterThan(0);
        expect(relErr(extra, firstTerm)).toBeLessThan(3 * r * r + 1e-12);
        expect(parabolaExtraLengthM(l, f * 1.5)).toBeGreaterThan(extra);
      }),
    );
  });

  it('is 0 without sag, also for a sag too small to register', () => {
    expect(parabolaExtraLengthM(20, 0)).toBe(0);
    expect(parabolaExtraLengthM(300, Number.MIN_VALUE)).toBe(0);
  });
});

describe('sagForExtraLength', () => {
  it('l = 100 ft, Δ = 4 ft: about √(3 l Δ / 8) = 12.25 ft (Beer & Johnston, cables)', () => {
    const s = sagForExtraLength(100, 4);
    expect(s.smallSagApproximationM).toBeCloseTo(12.247, 3);
    // The exact parabola needs a little more sag (the series' next term is negative): 12.46 ft.
    expect(s.sagM).toBeGreaterThan(s.smallSagApproximationM);
    expect(relErr(s.sagM, 12.25)).toBeLessThan(0.02);
    expect(parabolaArcLengthM(100, s.sagM)).toBeCloseTo(104, 9);
  });

  it('inverts the exact parabola length (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 500, noNaN: true }), fc.double({ min: 0, max: 0.9, noNaN: true }), (l, r) => {
        const f = r * l;
        const delta = parabolaExtraLengthM(l, f);
        const s = sagForExtraLength(l, delta);
        expect(Math.abs(s.sagM - f)).toBeLessThan(1e-6 * l);
      }),
    );
  });

  it('gives no sag for no extra length', () => {
    expect(sagForExtraLength(20, 0).sagM).toBe(0);
  });

  it('rejects a negative extra length', () => {
    expect(() => sagForExtraLength(20, -0.1)).toThrow(/extraLengthM: the extra length of wire must be a number at least 0 m/);
  });
});
