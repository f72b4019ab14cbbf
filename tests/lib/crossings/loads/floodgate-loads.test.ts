/**
 * Flood loads on a floodgate's wires and debris mat.
 *
 * Outside references used here:
 * - FEMA P-55 *Coastal Construction Manual* (4th ed., 2011), Eq. 8.8: F = ½ ρ C_d A V²; C_d 2.0
 *   flat-faced, 1.2 round (a bare wire as a round cylinder: from memory).
 * - shared/references.md, derived: debris mat 10 m × 0.6 m, C_d 2.0, 1.5 m/s → 13.5 kN; a bare
 *   wire carries only a few newtons per metre and the debris mat dominates.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { floodgateLoads, type FloodgateLoadsInput } from '../../../../src/lib/crossings/loads/index';

const base: FloodgateLoadsInput = {
  wettedWidthM: 10,
  meanDepthM: 0.6,
  velocityMs: 1.5,
  blockageFraction: 1,
  wireCount: 4,
  wireDiameterM: 0.0025,
};

describe('floodgateLoads', () => {
  it('debris mat 10 m × 0.6 m fully blocked, C_d 2.0, 1.5 m/s → 13.5 kN (references.md, derived from FEMA P-55 Eq. 8.8)', () => {
    const loads = floodgateLoads(base);
    expect(loads.debrisMatAreaM2).toBeCloseTo(6, 12);
    expect(loads.debrisMatKn).toBeCloseTo(13.5, 9);
  });

  it('bare 2.5 mm wire, C_d 1.2, 1.5 m/s: 3.375 N/m, 4 wires over 10 m = 0.135 kN (by hand, FEMA P-55 Eq. 8.8)', () => {
    // ½ × 1000 × 1.2 × 0.0025 × 1.5² = 3.375 N/m; × 4 wires × 10 m = 135 N.
    const loads = floodgateLoads(base);
    expect(loads.bareWireDragNPerM).toBeCloseTo(3.375, 9);
    expect(loads.bareWiresKn).toBeCloseTo(0.135, 9);
    expect(loads.totalKn).toBeCloseTo(13.635, 9);
    expect(loads.eachEndStrainerKn).toBeCloseTo(13.635 / 2, 9);
    expect(loads.debrisMatKn).toBeGreaterThan(50 * loads.bareWiresKn);
  });

  it('fills in the defaults: blockage 0.5, debris C_d 2.0, wire C_d 1.2, fresh water', () => {
    const { blockageFraction: _omit, ...rest } = base;
    const loads = floodgateLoads(rest);
    expect(loads.inputs).toEqual({
      ...rest, blockageFraction: 0.5, debrisDragCoefficient: 2.0, wireDragCoefficient: 1.2, densityKgM3: 1000,
    });
    expect(loads.debrisMatKn).toBeCloseTo(6.75, 9);
  });

  it('explains itself and says it is not a structural certificate', () => {
    const loads = floodgateLoads(base);
    expect(loads.reasons).toHaveLength(3);
    expect(loads.reasons.join(' ')).toMatch(/each end strainer — a simplification/);
    expect(loads.caution).toMatch(/not a structural certificate/);
    expect(loads.method).toMatch(/FEMA P-55 .*Eq\. 8\.8/);
  });

  it('splits the total evenly between the end strainers and never falls with more blockage or speed (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 100, noNaN: true }),
        fc.double({ min: 0.05, max: 5, noNaN: true }),
        fc.double({ min: 0, max: 5, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.integer({ min: 0, max: 10 }),
        (width, depth, v, blockage, wires) => {
          const input = { wettedWidthM: width, meanDepthM: depth, velocityMs: v, blockageFraction: blockage, wireCount: wires, wireDiameterM: 0.0025 };
          const loads = floodgateLoads(input);
          expect(loads.totalKn).toBeCloseTo(loads.bareWiresKn + loads.debrisMatKn, 9);
          expect(2 * loads.eachEndStrainerKn).toBeCloseTo(loads.totalKn, 9);
          expect(floodgateLoads({ ...input, blockageFraction: Math.min(1, blockage + 0.1) }).totalKn).toBeGreaterThanOrEqual(loads.totalKn);
          expect(floodgateLoads({ ...input, velocityMs: v * 1.1 }).totalKn).toBeGreaterThanOrEqual(loads.totalKn);
        },
      ),
    );
  });

  it('does not mutate its input', () => {
    const input = Object.freeze({ ...base });
    const before = JSON.stringify(input);
    floodgateLoads(input);
    expect(JSON.stringify(input)).toBe(before);
  });

  it('rejects bad input with a message a person can act on', () => {
    expect(() => floodgateLoads({ ...base, wettedWidthM: -3 })).toThrow(/wettedWidthM: the wetted width must be a number more than 0 m, got -3/);
    expect(() => floodgateLoads({ ...base, meanDepthM: 0 })).toThrow(/meanDepthM/);
    expect(() => floodgateLoads({ ...base, blockageFraction: 50 })).toThrow(/blockageFraction: .*not a percentage/);
    expect(() => floodgateLoads({ ...base, wireCount: 2.5 })).toThrow(/wireCount: the number of wires in the water must be a whole number at least 0/);
    expect(() => floodgateLoads({ ...base, wireDiameterM: 2.5 })).toThrow(/wireDiameterM: .*at most 0.02 m, got 2.5\. Give metres: a 2.5 mm wire is 0.0025/);
    expect(() => floodgateLoads({ ...base, debrisDragCoefficient: -2 })).toThrow(/debrisDragCoefficient/);
    expect(() => floodgateLoads({ ...base, velocityMs: Number.NaN })).toThrow(/velocityMs: .* got NaN/);
  });
});
