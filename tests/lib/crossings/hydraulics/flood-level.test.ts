import { describe, expect, it } from 'vitest';
import { floodLevelForDischarge, floodLevelFromMark, manningDischarge } from '../../../../src/lib/crossings/hydraulics/index';
import { COMPOUND, frozen, trapezoid } from './helpers';

const oneElement = { slope: 0.002, roughness: { channelN: 0.035 } };

describe('floodLevelForDischarge', () => {
  it('the rivr trapezoid (published normal depth 3.2864 m): level, width, velocity, wet stretch', () => {
    // rivr normal_depth() example (Koohafkan & Younis 2015, The R Journal 7(2)); ±1 mm.
    const options = { slope: 0.0008, roughness: { channelN: 0.013 } };
    const level = floodLevelForDischarge(trapezoid(6.1, 1.5, 10), 126, options);
    if (level.overtopped) throw new Error('expected a level');
    expect(Math.abs(level.stageM - 3.2864)).toBeLessThanOrEqual(0.001);
    expect(level.maxDepthM).toBeCloseTo(level.stageM, 12);
    expect(level.wettedWidthM).toBeCloseTo(6.1 + 2 * 1.5 * level.stageM, 9);
    const area = (6.1 + 1.5 * level.stageM) * level.stageM;
    expect(level.meanVelocityMs).toBeCloseTo(level.dischargeM3s / area, 9);
    expect(level.wetStretches).toHaveLength(1);
    expect(level.warnings).toEqual([]);
    expect(level.inputs.dischargeM3s).toBe(126);
    expect(level.method).toMatch(/highest stage/);
  });

  it('warns when lower levels also carry the discharge (one element, flooding overbank) and takes the highest', () => {
    const target = 0.8 * manningDischarge(COMPOUND, 2, oneElement).dischargeM3s;
    const level = floodLevelForDischarge(COMPOUND, target, oneElement);
    expect(level.overtopped).toBe(false);
    expect(level.stageM).toBeGreaterThan(2);
    expect(level.warnings[0]).toMatch(/the highest was taken/);
  });

  it('overtopped: no level, the capacity, and a warning to extend the profile', () => {
    const level = floodLevelForDischarge(COMPOUND, 1e5, oneElement);
    expect(level).toMatchObject({ overtopped: true, stageM: null, maxDepthM: null, wettedWidthM: null });
    if (!level.overtopped) throw new Error('expected overtopped');
    expect(level.capacityM3s).toBeCloseTo(manningDischarge(COMPOUND, 4, oneElement).dischargeM3s, 9);
    expect(level.warnings[0]).toMatch(/spills past it. Extend the profile/);
  });

  it('a flat profile with no channel: no level is reported, overtopped with capacity 0 and a warning (decision)', () => {
    const level = floodLevelForDischarge({ stationsM: [0, 50, 100], elevationsM: [3, 3, 3] }, 2, oneElement);
    expect(level).toMatchObject({ overtopped: true, stageM: null, capacityM3s: 0 });
    expect(level.warnings[0]).toMatch(/holds no water/);
  });

  it('does not change its inputs, and copies them into the result', () => {
    const section = frozen(structuredClone(COMPOUND));
    const options = frozen(structuredClone(oneElement));
    const level = floodLevelForDischarge(section, 20, options);
    expect(level.inputs.section).toEqual(COMPOUND);
    expect(level.inputs.section.stationsM).not.toBe(section.stationsM);
  });
});

describe('floodLevelFromMark', () => {
  it('stage = bed + mark height; with slope and n, the discharge at that level for information', () => {
    const level = floodLevelFromMark(COMPOUND, 1.5, oneElement);
    expect(level.stageM).toBe(1.5);
    expect(level.maxDepthM).toBe(1.5);
    expect(level.overtopped).toBe(false);
    expect(level.wettedWidthM).toBeCloseTo(4 + 2 * 1.5, 9);
    expect(level.dischargeM3s).toBeCloseTo(manningDischarge(COMPOUND, 1.5, oneElement).dischargeM3s, 12);
    expect(level.warnings).toEqual([]);
    expect(floodLevelFromMark(COMPOUND, 1.5).dischargeM3s).toBeNull();
  });

  it('a mark above the lower end: overtopped with a warning, no discharge', () => {
    const section = { stationsM: [0, 2, 4, 10], elevationsM: [1, 0, 0, 3] };
    const level = floodLevelFromMark(section, 2, oneElement);
    expect(level).toMatchObject({ stageM: 2, overtopped: true, aboveWholeProfile: false, dischargeM3s: null });
    expect(level.warnings[0]).toMatch(/1.00 m above the lower end of the profile/);
  });

  it('a mark higher than the whole profile: the level stands (an observation), flagged with a clear warning (decision)', () => {
    const level = floodLevelFromMark(COMPOUND, 5, oneElement);
    expect(level).toMatchObject({ stageM: 5, overtopped: true, aboveWholeProfile: true, dischargeM3s: null });
    expect(level.warnings[0]).toMatch(/1.00 m above the highest point of the profile: the whole profile was under water/);
    expect(level.wettedWidthM).toBeCloseTo(218, 9);
  });

  it('refuses a mark of 0 or below, and does not change its inputs', () => {
    expect(() => floodLevelFromMark(COMPOUND, 0)).toThrow(/flood mark height must be a number of metres above the channel bed/);
    expect(() => floodLevelFromMark(COMPOUND, -1)).toThrow(/above 0/);
    const section = frozen(structuredClone(COMPOUND));
    expect(() => floodLevelFromMark(section, 1, frozen(structuredClone(oneElement)))).not.toThrow();
  });
});
