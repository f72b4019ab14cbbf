import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { HydraulicsInputError, rationalPeakDischarge } from '../../../../src/lib/crossings/hydraulics/index';
import { frozen } from './helpers';

describe('rationalPeakDischarge', () => {
  it('45.48 mm/h effective intensity over 80 ha with C = 1 → 10.11 m³/s (published)', () => {
    // V. M. Ponce, San Diego State University, CIVE 445 midterm 2, problem 1: Qp = 45.48 mm/h ×
    // 80 ha → 10.11 m³/s (losses already removed, so C = 1). ±1 in the last digit (source rounds).
    expect(
      Math.abs(rationalPeakDischarge({ runoffCoefficient: 1, intensityMmH: 45.48, areaHa: 80 }) - 10.11),
    ).toBeLessThanOrEqual(0.01);
    expect(
      Math.abs(rationalPeakDischarge({ runoffCoefficient: 1, intensityMmH: 45.48, areaKm2: 0.8 }) - 10.11),
    ).toBeLessThanOrEqual(0.01);
  });

  it('1 mm/h on 1 km² is 1000 m³ an hour, 0.2778 m³/s (derived from the units: the 1/3.6 of the SI convention)', () => {
    expect(rationalPeakDischarge({ runoffCoefficient: 1, intensityMmH: 1, areaKm2: 1 })).toBeCloseTo(1000 / 3600, 12);
  });

  it('C = 0.35, I = 60 mm/h, A = 2.5 km² (250 ha) → 14.583 m³/s (derived: Q = C·I·A/3.6, or ÷ 360 with hectares)', () => {
    // Derived check, not a published example: the SI convention of Gullyline's references.md.
    expect(rationalPeakDischarge({ runoffCoefficient: 0.35, intensityMmH: 60, areaKm2: 2.5 })).toBeCloseTo(14.5833, 4);
    expect(rationalPeakDischarge({ runoffCoefficient: 0.35, intensityMmH: 60, areaHa: 250 })).toBeCloseTo(
      (0.35 * 60 * 250) / 360,
      12,
    );
  });

  it('is proportional to each input (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.01, max: 0.5, noNaN: true }),
        fc.double({ min: 1, max: 300, noNaN: true }),
        fc.double({ min: 0.01, max: 500, noNaN: true }),
        (c, i, a) => {
          const q = rationalPeakDischarge({ runoffCoefficient: c, intensityMmH: i, areaKm2: a });
          expect(rationalPeakDischarge({ runoffCoefficient: 2 * c, intensityMmH: i, areaKm2: a })).toBeCloseTo(2 * q, 9);
          expect(rationalPeakDischarge({ runoffCoefficient: c, intensityMmH: i, areaHa: 100 * a })).toBeCloseTo(q, 9);
        },
      ),
      { numRuns: 50 },
    );
  });

  it('does not change its input', () => {
    const inputs = frozen({ runoffCoefficient: 0.4, intensityMmH: 50, areaKm2: 3 });
    expect(() => rationalPeakDischarge(inputs)).not.toThrow();
  });

  it('refuses C above 1 or at most 0, and intensity or area not above 0, in words a person can act on', () => {
    expect(() => rationalPeakDischarge({ runoffCoefficient: 1.2, intensityMmH: 50, areaKm2: 1 })).toThrow(
      /A runoff coefficient above 1 \(1\.2\) means more water runs off than falls; use 0–1/,
    );
    expect(() => rationalPeakDischarge({ runoffCoefficient: 0, intensityMmH: 50, areaKm2: 1 })).toThrow(/no water runs off/);
    expect(() => rationalPeakDischarge({ runoffCoefficient: 0.5, intensityMmH: -3, areaKm2: 1 })).toThrow(
      /intensity must be a number of mm\/h above 0/,
    );
    expect(() => rationalPeakDischarge({ runoffCoefficient: 0.5, intensityMmH: 30, areaHa: 0 })).toThrow(
      /area must be a number above 0 \(hectares\)/,
    );
    const both = { runoffCoefficient: 0.5, intensityMmH: 30, areaKm2: 1, areaHa: 100 } as unknown as Parameters<
      typeof rationalPeakDischarge
    >[0];
    expect(() => rationalPeakDischarge(both)).toThrow(/Give the catchment area once/);
    expect(() => rationalPeakDischarge({ runoffCoefficient: 1.2, intensityMmH: 50, areaKm2: 1 })).toThrow(HydraulicsInputError);
  });
});
