/**
 * Drag force F = ½ ρ C_d A V².
 *
 * Outside references used here:
 * - FEMA P-55 *Coastal Construction Manual* (4th ed., 2011), Eq. 8.8: F = ½ ρ C_d A V²;
 *   C_d = 2.0 for square or rectangular piles (flat-faced), 1.2 for round.
 * - shared/references.md, derived: flat plate C_d = 2.0, A = 1 m², V = 2 m/s → 4.0 kN; debris mat
 *   10 m × 0.6 m, C_d = 2.0, V = 1.5 m/s → 13.5 kN.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { dragForceN } from '../../../../src/lib/crossings/loads/index';

describe('dragForceN', () => {
  it('flat plate, C_d 2.0, 1 m², 2 m/s → 4.0 kN (references.md, derived from FEMA P-55 Eq. 8.8)', () => {
    // ½ × 1000 × 2.0 × 1 × 2² = 4000 N.
    expect(dragForceN({ dragCoefficient: 2.0, areaM2: 1, velocityMs: 2 })).toBeCloseTo(4000, 9);
  });

  it('debris mat 10 m × 0.6 m, C_d 2.0, 1.5 m/s → 13.5 kN (references.md, derived from FEMA P-55 Eq. 8.8)', () => {
    // ½ × 1000 × 2.0 × 6 × 1.5² = 13 500 N.
    expect(dragForceN({ dragCoefficient: 2.0, areaM2: 10 * 0.6, velocityMs: 1.5 })).toBeCloseTo(13500, 9);
  });

  it('uses the density given (sea water 1025 kg/m³, by hand)', () => {
    expect(dragForceN({ dragCoefficient: 1.2, areaM2: 2, velocityMs: 1, densityKgM3: 1025 })).toBeCloseTo(1230, 9);
  });

  it('scales with the area and C_d and with the square of the speed (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.1, max: 3, noNaN: true }),
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 10, noNaN: true }),
        (cd, area, v) => {
          const f = dragForceN({ dragCoefficient: cd, areaM2: area, velocityMs: v });
          expect(f).toBeGreaterThanOrEqual(0);
          expect(dragForceN({ dragCoefficient: cd, areaM2: 2 * area, velocityMs: v })).toBeCloseTo(2 * f, 6);
          expect(dragForceN({ dragCoefficient: cd, areaM2: area, velocityMs: 2 * v })).toBeCloseTo(4 * f, 6);
        },
      ),
    );
  });

  it('does not mutate its input', () => {
    const input = Object.freeze({ dragCoefficient: 2, areaM2: 1, velocityMs: 2 });
    dragForceN(input);
    expect(input).toEqual({ dragCoefficient: 2, areaM2: 1, velocityMs: 2 });
  });

  it('rejects bad input with the input named', () => {
    expect(() => dragForceN({ dragCoefficient: 0, areaM2: 1, velocityMs: 2 })).toThrow(/dragCoefficient: .* more than 0, got 0/);
    expect(() => dragForceN({ dragCoefficient: 2, areaM2: -1, velocityMs: 2 })).toThrow(/areaM2: the projected area must be .* at least 0 m²/);
    expect(() => dragForceN({ dragCoefficient: 2, areaM2: 1, velocityMs: -2 })).toThrow(/velocityMs: .*Give the speed, without a sign/);
    expect(() => dragForceN({ dragCoefficient: 2, areaM2: 1, velocityMs: 2, densityKgM3: 0 })).toThrow(/densityKgM3/);
    expect(() => dragForceN({ dragCoefficient: 2, areaM2: 1, velocityMs: Number.POSITIVE_INFINITY })).toThrow(RangeError);
  });
});
