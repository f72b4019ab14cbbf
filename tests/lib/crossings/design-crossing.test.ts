import { describe, expect, it } from 'vitest';
import { designCrossing, type CrossingDesignInput } from '../../../src/lib/crossings/design-crossing';
import { channelCrossSection } from '../../../src/lib/crossings/design/cross-section';

// A trapezoidal channel across the fence: bed 4 m wide at 100 m, 1 : 2 banks 1.5 m high, then a
// plain falling gently away on both sides; 1 m samples along a square crossing at chainage 200 m.
function trapezoidProfile(crossingAtM = 200) {
  const profile = [];
  for (let chainageM = 0; chainageM <= 400; chainageM += 1) {
    const offset = Math.abs(chainageM - crossingAtM);
    const elevationM = offset <= 2 ? 100 : offset <= 5 ? 100 + (offset - 2) / 2 : 101.5 + (offset - 5) * 0.002;
    profile.push({ chainageM, elevationM });
  }
  return profile;
}

const FENCE = { wireHeightsM: [0.2, 0.4, 0.6, 0.8, 1.05], wireKinds: ['plain', 'plain', 'plain', 'barbed', 'barbed'] as const, plainWireTypeId: 'ht-2.50-plain', barbedWireTypeId: 'lt-12.5ga-barbed-2strand', postSpacingM: 10, dropperSpacingM: 2.5 };
const IFD = { aepPercent: [5, 1], durationsMin: [10, 60, 360], intensitiesMmH: [[100, 40, 12], [140, 56, 17]] };

const base = (overrides: Partial<CrossingDesignInput> = {}): CrossingDesignInput => ({
  profile: trapezoidProfile(),
  crossingChainageM: 200,
  crossingAngleDeg: 90,
  channelSlope: 0.002,
  catchment: { areaKm2: 2, mainStreamLengthKm: 2, equalAreaSlopeMPerKm: 2 },
  ifd: IFD,
  fence: { ...FENCE, wireKinds: [...FENCE.wireKinds] },
  inputs: {},
  settings: {},
  ...overrides,
});

describe('channelCrossSection', () => {
  it('bank-at-break-of-slope-on-a-rising-plain: the bank is the top of the side slope, not out on the plain', () => {
    // Found when a gently rising plain put the banks 60 m out, making Manning's Q fall as the
    // water rose over the "channel"; with the banks at the slope's top the split section is steady.
    const section = channelCrossSection(trapezoidProfile(), 200, 90, { halfWidthM: 150 });
    expect(section.bankStationsM).toEqual([-5, 5]);
  });
});

describe('designCrossing', () => {
  it('designs from rainfall when there is no flood mark, keeping the strainers out of the wet zone (common practice)', () => {
    const design = designCrossing(base());
    expect(design.status).toBe('designed');
    if (design.status !== 'designed') return;
    expect(design.floods.chosen).toBe('rainfall');
    const { wetZone, endStrainers } = design.layout;
    expect(endStrainers[0].chainageM).toBeLessThanOrEqual(wetZone.startChainageM - 15 + 1e-9);
    expect(endStrainers[1].chainageM).toBeGreaterThanOrEqual(wetZone.endChainageM + 15 - 1e-9);
    expect(endStrainers.every((strainer) => strainer.onDryGround)).toBe(true);
    expect(design.wireCheck?.flexRunEachSideM).toBeGreaterThanOrEqual(50);
    expect(design.materials.items.length).toBeGreaterThan(5);
    expect(design.cautions.join(' ')).toMatch(/Never enter floodwater/i);
  });

  it('uses an observed flood mark over the rainfall estimate, and keeps both', () => {
    const design = designCrossing(base({ inputs: { floodMarkM: 1.2 } }));
    if (design.status !== 'designed') throw new Error(design.status);
    expect(design.floods.chosen).toBe('mark');
    expect(design.floods.levelM).toBeCloseTo(101.2, 9);
    expect(design.floods.fromRainfall).not.toBeNull();
    // Wet zone: ground below 101.2 + 0.3 freeboard: the bank at 100 + (offset − 2)/2 = 101.5 → offset 5 m each side.
    expect(design.layout.wetZone.lengthM).toBeCloseTo(10, 1);
  });

  it('centres the layout on the channel bed when the drainage line meets the fence a few metres off it', () => {
    const design = designCrossing(base({ crossingChainageM: 203.5, inputs: { floodMarkM: 1 } }));
    if (design.status !== 'designed') throw new Error(design.status);
    expect(design.layout.crossingChainageM).toBeGreaterThanOrEqual(198);
    expect(design.layout.crossingChainageM).toBeLessThanOrEqual(202);
  });

  it('asks for a flood mark or an IFD table when it has neither', () => {
    const design = designCrossing(base({ ifd: null }));
    expect(design.status).toBe('needs-input');
    if (design.status === 'needs-input') expect(design.problem).toMatch(/Enter a flood mark.*IFD/);
  });

  it('says there is no channel where the fence runs down a plain slope', () => {
    const slope = Array.from({ length: 401 }, (_, chainageM) => ({ chainageM, elevationM: 120 - chainageM * 0.01 }));
    const design = designCrossing(base({ profile: slope }));
    expect(design.status).toBe('no-channel');
  });

  it('designs the other style on request: the drop-down section needs no flex run', () => {
    const design = designCrossing(base({ inputs: { style: 'drop-down-section', floodMarkM: 1 } }));
    if (design.status !== 'designed') throw new Error(design.status);
    expect(design.wireCheck).toBeNull();
    expect(design.layout.styleDetail.flexRunEachSideM).toBe(0);
    expect(design.layout.styleDetail.wiresRunThrough).toBe(false);
  });
});
