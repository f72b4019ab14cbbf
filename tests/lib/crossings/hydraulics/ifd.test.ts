import { describe, expect, it } from 'vitest';
import { rainfallIntensity, validateIfdTable, type IfdTable } from '../../../../src/lib/crossings/hydraulics/index';
import { frozen, INVENTED_IFD } from './helpers';

describe('rainfallIntensity', () => {
  it('returns tabulated values at tabulated durations', () => {
    expect(rainfallIntensity(INVENTED_IFD, 60, 1)).toBe(52);
    expect(rainfallIntensity(INVENTED_IFD, 5, 63.2)).toBe(72);
    expect(rainfallIntensity(INVENTED_IFD, 1440, 20)).toBe(2.5);
  });

  it('interpolates log(intensity) linearly in log(duration): 20 min between 150 and 80 mm/h → 100.9 mm/h (by hand)', () => {
    const f = Math.log(2) / Math.log(3);
    expect(rainfallIntensity(INVENTED_IFD, 20, 1)).toBeCloseTo(Math.exp(Math.log(150) + f * Math.log(80 / 150)), 12);
    expect(rainfallIntensity(INVENTED_IFD, 20, 1)).toBeCloseTo(100.89, 2);
  });

  it('reproduces a power-law IFD curve I = 1000 t^-0.7 exactly between its points (analytic)', () => {
    const durationsMin = [5, 15, 45, 120, 600];
    const table: IfdTable = { aepPercent: [1], durationsMin, intensitiesMmH: [durationsMin.map((t) => 1000 * t ** -0.7)] };
    for (const t of [6, 13.3, 44, 100, 599]) expect(rainfallIntensity(table, t, 1)).toBeCloseTo(1000 * t ** -0.7, 9);
  });

  it('refuses an AEP not in the table, listing the AEPs it has', () => {
    expect(() => rainfallIntensity(INVENTED_IFD, 60, 0.5)).toThrow(
      "AEP 0.5 % is not in the property's IFD table (it has 63.2, 50, 20, 10, 5, 2, 1 %)",
    );
  });

  it('refuses durations outside the table rather than extrapolating', () => {
    expect(() => rainfallIntensity(INVENTED_IFD, 2, 1)).toThrow(/2 min is outside the property's IFD table \(5–1440 min\)/);
    expect(() => rainfallIntensity(INVENTED_IFD, 4320, 1)).toThrow(/outside/);
  });

  it('does not change the table', () => {
    const table = frozen(structuredClone(INVENTED_IFD));
    expect(() => rainfallIntensity(table, 25, 2)).not.toThrow();
    expect(table).toEqual(INVENTED_IFD);
  });
});

describe('validateIfdTable', () => {
  it('finds nothing wrong with a sound table', () => {
    expect(validateIfdTable(INVENTED_IFD)).toEqual([]);
  });

  it('names each problem in words', () => {
    const bad: IfdTable = {
      aepPercent: [10, 10, 120],
      durationsMin: [30, 10],
      intensitiesMmH: [[50, 60], [40], [1, 2]],
    };
    const problems = validateIfdTable(bad);
    expect(problems).toContain('AEP 10 % appears more than once.');
    expect(problems).toContain('AEP 3 (120) must be a per cent above 0 and below 100.');
    expect(problems).toContain('Durations must increase: 10 min comes after 30 min.');
    expect(problems.some((p) => p.includes('must hold 2 intensities'))).toBe(true);
    expect(validateIfdTable({ aepPercent: [1], durationsMin: [10, 60], intensitiesMmH: [] })).toContain(
      'There are 1 AEPs but 0 rows of intensities; give one row per AEP.',
    );
  });

  it('flags intensities that rise with duration or fall as the AEP gets rarer (typing slips)', () => {
    const slips: IfdTable = {
      aepPercent: [10, 1],
      durationsMin: [10, 60],
      intensitiesMmH: [
        [90, 30],
        [80, 40],
      ],
    };
    expect(validateIfdTable(slips)).toEqual(['At 10 min the 1 % AEP intensity should exceed the 10 % AEP intensity.']);
    const rising: IfdTable = { aepPercent: [1], durationsMin: [10, 60], intensitiesMmH: [[30, 90]] };
    expect(validateIfdTable(rising)[0]).toMatch(/should fall as the duration grows/);
    expect(() => rainfallIntensity(rising, 20, 1)).toThrow(/The IFD table cannot be used/);
  });
});
