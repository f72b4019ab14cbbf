/**
 * Wet zones: the stretch of fence below flood level + freeboard.
 *
 * Outside references used here:
 * - Analytic: on a straight ground segment from (c0, z0) to (c1, z1) the level L is crossed at
 *   c0 + (L − z0)/(z1 − z0) · (c1 − c0) (linear interpolation), so the V and trapezoid of
 *   ./fixtures.ts have wet zone edges known in closed form.
 * - Freeboard: common practice, no published source.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { findWetZone } from '../../../../src/lib/crossings/design/index';
import { deepFreeze, groundAt, TRAPEZOID_PROFILE, V_PROFILE } from './fixtures';

/** Random profiles with their lowest point at the crossing. */
const profileArb = fc
  .record({
    steps: fc.array(fc.double({ min: 0.5, max: 20, noNaN: true }), { minLength: 4, maxLength: 30 }),
    heights: fc.array(fc.double({ min: 0, max: 10, noNaN: true }), { minLength: 31, maxLength: 31 }),
    bedAt: fc.nat(),
  })
  .map(({ steps, heights, bedAt }) => {
    let c = 0;
    const profile = [0, ...steps].map((s, i) => ({ chainageM: (c += i === 0 ? 0 : s), elevationM: heights[i]! }));
    const bed = 1 + (bedAt % (profile.length - 2));
    profile[bed] = { chainageM: profile[bed]!.chainageM, elevationM: -1 };
    return { profile, crossingChainageM: profile[bed]!.chainageM };
  });

describe('findWetZone', () => {
  it('interpolates the edges on a V: level 1.3 m crosses the 0.1 m/m sides 13 m from the bed (analytic)', () => {
    const z = findWetZone(V_PROFILE, 100, 1, 0.3);
    expect(z.startChainageM).toBeCloseTo(87, 9);
    expect(z.endChainageM).toBeCloseTo(113, 9);
    expect(z.lengthM).toBeCloseTo(26, 9);
    expect(z.maxDepthM).toBe(1);
    expect(z.levelM).toBeCloseTo(1.3, 12);
    expect(z.lowestAtChainageM).toBe(100);
    expect(z.overtopsProfile).toBe(false);
    expect([z.startEdge, z.endEdge]).toEqual(['ground', 'ground']);
  });

  it('interpolates the edges on a trapezoid: level 1.8 m on 1:2 sides is 3.6 m out from the bed corners (analytic)', () => {
    const z = findWetZone(TRAPEZOID_PROFILE, 100, 1.5, 0.3);
    expect(z.startChainageM).toBeCloseTo(97 - 3.6, 9);
    expect(z.endChainageM).toBeCloseTo(103 + 3.6, 9);
    expect(z.lengthM).toBeCloseTo(13.2, 9);
    expect(z.maxDepthM).toBe(1.5);
  });

  it('flags a flood above the whole profile as overtopping, and still gives the zone', () => {
    const z = findWetZone(V_PROFILE, 100, 12, 0.3);
    expect(z.overtopsProfile).toBe(true);
    expect([z.startChainageM, z.endChainageM]).toEqual([0, 200]);
    expect([z.startEdge, z.endEdge]).toEqual(['profile-end', 'profile-end']);
  });

  it('stops at a gap and flags it', () => {
    const profile = [...V_PROFILE.slice(0, 2), { chainageM: 105, elevationM: 0.5 }, { chainageM: 110, elevationM: null }, { chainageM: 200, elevationM: 10 }];
    const z = findWetZone(profile, 100, 1, 0.3);
    expect(z.endChainageM).toBe(105);
    expect(z.endEdge).toBe('gap');
    expect(z.overtopsProfile).toBe(true);
  });

  it('counts a freeboard-only margin as wet but not deep: maxDepth 0 when the flood does not reach the ground', () => {
    const z = findWetZone(V_PROFILE, 100, -0.1, 0.3);
    expect(z.lengthM).toBeCloseTo(4, 9);
    expect(z.maxDepthM).toBe(0);
  });

  it('rejects bad input: negative freeboard, a dry crossing, no ground at the crossing', () => {
    expect(() => findWetZone(V_PROFILE, 100, 1, -0.1)).toThrow(/freeboardM/);
    expect(() => findWetZone(V_PROFILE, 100, -1, 0.3)).toThrow(/no wet zone/);
    expect(() => findWetZone(V_PROFILE, 250, 1, 0.3)).toThrow(/no ground height/);
    expect(() => findWetZone(V_PROFILE, 100, Number.NaN, 0.3)).toThrow(/floodLevelM/);
    expect(() => findWetZone([{ chainageM: 0, elevationM: 1 }], 0, 2, 0)).toThrow(/at least two/);
  });

  it('puts each edge where the ground reaches the level, with only wet samples between (property)', () => {
    fc.assert(
      fc.property(profileArb, fc.double({ min: -0.5, max: 12, noNaN: true }), ({ profile, crossingChainageM }, floodLevelM) => {
        const z = findWetZone(profile, crossingChainageM, floodLevelM, 0.3);
        for (const p of profile) {
          if (p.chainageM > z.startChainageM && p.chainageM < z.endChainageM) expect(p.elevationM!).toBeLessThan(z.levelM);
        }
        if (z.startEdge === 'ground') expect(groundAt(profile, z.startChainageM)).toBeCloseTo(z.levelM, 6);
        if (z.endEdge === 'ground') expect(groundAt(profile, z.endChainageM)).toBeCloseTo(z.levelM, 6);
        expect(z.overtopsProfile).toBe(z.startEdge !== 'ground' || z.endEdge !== 'ground');
      }),
    );
  });

  it('never shortens when the flood rises (property)', () => {
    fc.assert(
      fc.property(profileArb, fc.double({ min: -0.5, max: 12, noNaN: true }), fc.double({ min: 0, max: 5, noNaN: true }), ({ profile, crossingChainageM }, low, rise) => {
        const a = findWetZone(profile, crossingChainageM, low, 0.3);
        const b = findWetZone(profile, crossingChainageM, low + rise, 0.3);
        expect(b.startChainageM).toBeLessThanOrEqual(a.startChainageM + 1e-9);
        expect(b.endChainageM).toBeGreaterThanOrEqual(a.endChainageM - 1e-9);
        expect(b.lengthM).toBeGreaterThanOrEqual(a.lengthM - 1e-9);
      }),
    );
  });

  it('does not mutate its input', () => {
    const profile = deepFreeze(structuredClone(V_PROFILE));
    findWetZone(profile, 100, 1, 0.3);
    expect(profile).toEqual(V_PROFILE);
  });
});
