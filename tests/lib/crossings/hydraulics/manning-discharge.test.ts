import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { HydraulicsInputError, manningDischarge, wettedGeometry } from '../../../../src/lib/crossings/hydraulics/index';
import { COMPOUND, frozen, trapezoid } from './helpers';

const within = (actual: number, expected: number, relative: number): void => {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(relative * Math.abs(expected));
};

describe('manningDischarge', () => {
  it('rectangular channel b = 6 m, y = 1.6 m, n = 0.015, S = 0.0025 → Q = 32.91 m³/s (published)', () => {
    // V. M. Ponce, San Diego State University, CIVE 530 midterm 1, problem 4 (2008): A = 9.6 m²,
    // P = 9.2 m, V = 3.428 m/s, Q = 32.91 m³/s; the source rounds R to 1.043, exact Q ≈ 32.92.
    // Tolerance ±0.5 % (closed form).
    const flow = manningDischarge(trapezoid(6, 0, 3), 1.6, { slope: 0.0025, roughness: { channelN: 0.015 } });
    expect(flow.areaM2).toBeCloseTo(9.6, 6);
    expect(flow.wettedPerimeterM).toBeCloseTo(9.2, 6);
    within(flow.meanVelocityMs, 3.428, 0.005);
    within(flow.dischargeM3s, 32.91, 0.005);
    expect(flow.dischargeM3s).toBeCloseTo(32.921, 3); // exact arithmetic of the same inputs (derived)
    expect(flow.parts).toHaveLength(1);
    expect(flow.maxDepthM).toBeCloseTo(1.6, 12);
  });

  it('a triangle by hand: 1:1 V, depth 1 m, n = 0.03, S = 0.001 → Q = (1/n) A R^(2/3) S^(1/2) (derived)', () => {
    const section = { stationsM: [0, 2, 4], elevationsM: [2, 0, 2] };
    const r = 1 / (2 * Math.SQRT2);
    const expected = (1 / 0.03) * 1 * r ** (2 / 3) * Math.sqrt(0.001);
    expect(manningDischarge(section, 1, { slope: 0.001, roughness: { channelN: 0.03 } }).dischargeM3s).toBeCloseTo(expected, 12);
  });

  it('a dry section carries nothing', () => {
    const flow = manningDischarge(trapezoid(2, 1, 1), -0.5, { slope: 0.01, roughness: { channelN: 0.03 } });
    expect(flow.dischargeM3s).toBe(0);
    expect(flow.meanVelocityMs).toBe(0);
    expect(flow.maxDepthM).toBe(0);
  });

  it('splits at the bank stations into three parts, each with its own n, and sums conveyance', () => {
    const options = {
      slope: 0.002,
      roughness: { channelN: 0.035, leftOverbankN: 0.05, rightOverbankN: 0.1, leftBankStationM: 105, rightBankStationM: 113 },
    };
    const flow = manningDischarge(COMPOUND, 2.5, options);
    expect(flow.parts.map((part) => part.part)).toEqual(['left overbank', 'main channel', 'right overbank']);
    const [left, channel, right] = flow.parts;
    // Main channel by hand: trapezoid 4 m bed, 1:1 banks to 2 m, 0.5 m over the banks between the dividers.
    const channelArea = ((4 + 8) / 2) * 2 + 8 * 0.5;
    expect(channel!.areaM2).toBeCloseTo(channelArea, 9);
    expect(channel!.wettedPerimeterM).toBeCloseTo(4 + 2 * 2 * Math.SQRT2, 9); // dividers are not perimeter
    const k = (n: number, a: number, p: number): number => (a * (a / p) ** (2 / 3)) / n;
    expect(channel!.conveyanceM3s).toBeCloseTo(k(0.035, channelArea, 4 + 4 * Math.SQRT2), 9);
    const leftGeometry = wettedGeometry(COMPOUND, 2.5, 0, 105);
    expect(left!.conveyanceM3s).toBeCloseTo(k(0.05, leftGeometry.areaM2, leftGeometry.wettedPerimeterM), 9);
    expect(right!.manningN).toBe(0.1);
    expect(right!.dischargeM3s).toBeLessThan(left!.dischargeM3s); // same geometry, rougher
    expect(flow.dischargeM3s).toBeCloseTo(
      (left!.conveyanceM3s + channel!.conveyanceM3s + right!.conveyanceM3s) * Math.sqrt(0.002),
      9,
    );
    expect(flow.method).toMatch(/HEC-RAS/);
  });

  it('an overbank that starts flooding: one element drops Q, the subdivided section keeps rising and its rate of rise jumps', () => {
    // Invented compound creek (helpers.COMPOUND): banks at 2 m, 100 m flat floodplains either side.
    const oneElement = { slope: 0.002, roughness: { channelN: 0.035 } };
    const split = {
      slope: 0.002,
      roughness: { channelN: 0.035, leftOverbankN: 0.05, rightOverbankN: 0.05, leftBankStationM: 105, rightBankStationM: 113 },
    };
    const q = (stageM: number, options: typeof oneElement): number => manningDischarge(COMPOUND, stageM, options).dischargeM3s;
    // One element: the floodplain adds ~200 m of wetted perimeter and almost no area: R collapses.
    expect(q(2.05, oneElement)).toBeLessThan(0.5 * q(2, oneElement));
    // Subdivided: continuous at bank-full, monotone, and rising far faster once the floodplain flows.
    expect(q(2, split)).toBeCloseTo(q(2, oneElement), 9);
    let previous = 0;
    for (let stageM = 0.05; stageM <= 4; stageM += 0.05) {
      const flow = q(stageM, split);
      expect(flow).toBeGreaterThan(previous);
      previous = flow;
    }
    const below = (q(2, split) - q(1.8, split)) / 0.2;
    const above = (q(2.2, split) - q(2, split)) / 0.2;
    expect(above).toBeGreaterThan(2 * below);
  });

  it('Q increases with stage in a single-element V or trapezoid (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 2000 }).map((cm) => cm / 100), // bed width, m (0: a V)
        fc.double({ min: 0.2, max: 5, noNaN: true }),
        fc.double({ min: 0.01, max: 0.99, noNaN: true }),
        fc.double({ min: 0.001, max: 0.2, noNaN: true }),
        (bottomM, side, f, dh) => {
          const section = trapezoid(bottomM, side, 5);
          const options = { slope: 0.003, roughness: { channelN: 0.04 } };
          const low = f * 4.5;
          expect(manningDischarge(section, low + dh, options).dischargeM3s).toBeGreaterThan(
            manningDischarge(section, low, options).dischargeM3s,
          );
        },
      ),
      { numRuns: 100 },
    );
  });

  it('does not change its inputs', () => {
    const section = frozen({ stationsM: [...COMPOUND.stationsM], elevationsM: [...COMPOUND.elevationsM] });
    const options = frozen({ slope: 0.002, roughness: { channelN: 0.035, leftOverbankN: 0.05, leftBankStationM: 105 } });
    expect(() => manningDischarge(section, 2.5, options)).not.toThrow();
    expect(section.elevationsM).toEqual(COMPOUND.elevationsM);
  });

  it('refuses n = 0, a slope of 0 or below, slope in per cent, and misplaced banks', () => {
    const section = trapezoid(2, 1, 2);
    const call = (slope: number, roughness: Parameters<typeof manningDischarge>[2]['roughness']) => () =>
      manningDischarge(section, 1, { slope, roughness });
    expect(call(0.01, { channelN: 0 })).toThrow(/Manning's n must be a number above 0/);
    expect(call(0.01, { channelN: 0.03, leftOverbankN: -1, leftBankStationM: 1 })).toThrow(HydraulicsInputError);
    expect(call(-0.001, { channelN: 0.03 })).toThrow(/negative slope would run uphill/);
    expect(call(0, { channelN: 0.03 })).toThrow(/slope of 0 carries no flow/);
    expect(call(2, { channelN: 0.03 })).toThrow(/not in per cent/);
    expect(call(0.01, { channelN: 0.03, leftBankStationM: 99 })).toThrow(/must lie on the profile/);
    expect(call(0.01, { channelN: 0.03, leftBankStationM: 4, rightBankStationM: 2 })).toThrow(/must come before/);
    expect(call(0.01, { channelN: 0.03, rightOverbankN: 0.05 })).toThrow(/needs the station of the right bank/);
    try {
      call(0.01, { channelN: 0 })();
    } catch (error) {
      expect((error as HydraulicsInputError).field).toBe('roughness.channelN');
    }
  });
});
