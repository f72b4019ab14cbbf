import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { HydraulicsInputError, wettedGeometry, type CrossSection } from '../../../../src/lib/crossings/hydraulics/index';
import { frozen, trapezoid } from './helpers';

describe('wettedGeometry', () => {
  it('a rectangular channel 6 m wide with 1.6 m of water: A = 9.6 m², P = 9.2 m, T = 6 m (by hand)', () => {
    const g = wettedGeometry(trapezoid(6, 0, 3), 1.6);
    expect(g.areaM2).toBeCloseTo(9.6, 7);
    expect(g.wettedPerimeterM).toBeCloseTo(9.2, 7);
    expect(g.topWidthM).toBeCloseTo(6, 7);
    expect(g.maxDepthM).toBeCloseTo(1.6, 12);
    expect(g.wetStretches).toHaveLength(1);
    expect(g.leftEndWet).toBe(false);
  });

  it('a V with 1:1 sides and 1 m of water: A = 1 m², P = 2√2 m, T = 2 m (by hand, partly wetted segments)', () => {
    const v: CrossSection = { stationsM: [0, 3, 6], elevationsM: [3, 0, 3] };
    const g = wettedGeometry(v, 1);
    expect(g.areaM2).toBeCloseTo(1, 12);
    expect(g.wettedPerimeterM).toBeCloseTo(2 * Math.SQRT2, 12);
    expect(g.topWidthM).toBeCloseTo(2, 12);
    expect(g.wetStretches[0]!.fromStationM).toBeCloseTo(2, 12);
    expect(g.wetStretches[0]!.toStationM).toBeCloseTo(4, 12);
  });

  it('sums two separate pools and lists them; ground at the water level is dry', () => {
    // Two V pools 1 m deep with a ridge at 1.5 m between them; water at 1 m.
    const section: CrossSection = { stationsM: [0, 2, 4, 6, 8], elevationsM: [2, 0, 1.5, 0, 2] };
    const g = wettedGeometry(section, 1);
    expect(g.wetStretches).toHaveLength(2);
    // Each pool is a triangle 1 m deep: its sides fall 2 m over 2 m (wet for 1 m) and rise 1.5 m
    // over 2 m (wet for 2/1.5 m), so its surface is 1 + 1.333 m wide.
    const onePool = 0.5 * 1 * (1 + 2 / 1.5);
    expect(g.areaM2).toBeCloseTo(2 * onePool, 12);
    expect(wettedGeometry(section, 0).areaM2).toBe(0);
    expect(wettedGeometry(section, 0).wettedPerimeterM).toBe(0);
  });

  it('a station range leaves the vertical dividers out of the wetted perimeter', () => {
    const rect = trapezoid(6, 0, 3);
    const left = wettedGeometry(rect, 1.6, 0, 3);
    const right = wettedGeometry(rect, 1.6, 3, rect.stationsM[3]);
    expect(left.areaM2).toBeCloseTo(4.8, 7);
    expect(left.wettedPerimeterM).toBeCloseTo(1.6 + 3, 7); // one wall and half the bed, no divider
    expect(left.rightEndWet).toBe(true);
    expect(left.wettedPerimeterM + right.wettedPerimeterM).toBeCloseTo(9.2, 7);
  });

  it('does not change its input', () => {
    const section = frozen({ stationsM: [0, 1, 2, 3], elevationsM: [2, 0, 0.5, 2] });
    expect(() => wettedGeometry(section, 1, 0.5, 2.5)).not.toThrow();
    expect(section).toEqual({ stationsM: [0, 1, 2, 3], elevationsM: [2, 0, 0.5, 2] });
  });

  it('refuses a malformed section with a message that says what to fix', () => {
    expect(() => wettedGeometry({ stationsM: [0, 1, 1], elevationsM: [1, 0, 1] }, 0.5)).toThrow(/increase strictly/);
    expect(() => wettedGeometry({ stationsM: [0, 1], elevationsM: [1] }, 0.5)).toThrow(/one elevation per station/);
    expect(() => wettedGeometry({ stationsM: [0], elevationsM: [1] }, 0.5)).toThrow(HydraulicsInputError);
    expect(() => wettedGeometry({ stationsM: [0, 1], elevationsM: [1, Number.NaN] }, 0.5)).toThrow(/finite/);
    expect(() => wettedGeometry(trapezoid(1, 1, 1), 0.5, 2, 1)).toThrow(/smaller to a larger/);
  });

  // Heights and distances in whole centimetres: no subnormal numbers, whose rounding would test
  // floating point rather than geometry.
  const centimetres = (min: number, max: number) => fc.integer({ min, max }).map((cm) => cm / 100);
  const profile = fc
    .array(fc.tuple(centimetres(5, 500), centimetres(-300, 300)), { minLength: 1, maxLength: 12 })
    .map((steps): CrossSection => {
      const stationsM = [0];
      const elevationsM = [0];
      for (const [dx, z] of steps) {
        stationsM.push(stationsM[stationsM.length - 1]! + dx);
        elevationsM.push(z);
      }
      return { stationsM, elevationsM };
    });

  it('area equals the integral of the depth across the section, and T the wet width (property)', () => {
    fc.assert(
      fc.property(profile, centimetres(-300, 400), (section, stageM) => {
        const g = wettedGeometry(section, stageM);
        const xs = section.stationsM;
        const n = 4000;
        const width = xs[xs.length - 1]!;
        let integral = 0;
        let wetWidth = 0;
        for (let k = 0; k < n; k++) {
          const x = ((k + 0.5) * width) / n;
          let i = 0;
          while (xs[i + 1]! < x) i++;
          const t = (x - xs[i]!) / (xs[i + 1]! - xs[i]!);
          const z = section.elevationsM[i]! + t * (section.elevationsM[i + 1]! - section.elevationsM[i]!);
          integral += (Math.max(0, stageM - z) * width) / n;
          if (z < stageM) wetWidth += width / n;
        }
        expect(g.areaM2).toBeCloseTo(integral, 1);
        expect(Math.abs(g.areaM2 - integral)).toBeLessThanOrEqual(1e-3 * Math.max(1, integral) + 0.01);
        expect(Math.abs(g.topWidthM - wetWidth)).toBeLessThanOrEqual(0.01 * width + 1e-9);
        expect(g.wettedPerimeterM).toBeGreaterThanOrEqual(g.topWidthM - 1e-9);
      }),
      { numRuns: 60 },
    );
  });

  it('splitting the range anywhere adds up to the whole (property)', () => {
    fc.assert(
      fc.property(profile, centimetres(-300, 400), fc.double({ min: 0, max: 1, noNaN: true }), (section, stageM, f) => {
        const last = section.stationsM[section.stationsM.length - 1]!;
        const cut = f * last;
        const whole = wettedGeometry(section, stageM);
        const a = wettedGeometry(section, stageM, 0, cut);
        const b = wettedGeometry(section, stageM, cut, last);
        expect(a.areaM2 + b.areaM2).toBeCloseTo(whole.areaM2, 9);
        expect(a.wettedPerimeterM + b.wettedPerimeterM).toBeCloseTo(whole.wettedPerimeterM, 9);
        expect(a.topWidthM + b.topWidthM).toBeCloseTo(whole.topWidthM, 9);
      }),
      { numRuns: 100 },
    );
  });
});
