/**
 * The small pure pieces the demo terrain is built from. Hand-checkable cases and invariants;
 * the shapes are invented, so there is no outside source to compare with.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createPolylineNearest } from '../../data-samples/lib/polyline-nearest';
import { createMulberry32, drawNormal, hashToUnit } from '../../data-samples/lib/prng';
import {
  channelIncisionM,
  PLAIN_BASE_M,
  plainElevationM,
  smoothstep,
  type ChannelProfile,
} from '../../data-samples/lib/terrain-shape';

const profile: ChannelProfile = { bedHalfWidthM: 2, bankTopM: 6, floodFlatDepthM: 0.5, floodFlatHalfWidthM: 30, reachM: 50 };

describe('smoothstep', () => {
  it('is 0 below, 1 above, 0.5 halfway', () => {
    expect(smoothstep(0, 10, -1)).toBe(0);
    expect(smoothstep(0, 10, 5)).toBe(0.5);
    expect(smoothstep(0, 10, 11)).toBe(1);
  });
  it('rejects edges in the wrong order', () => {
    expect(() => smoothstep(1, 1, 0)).toThrow(/edge1 > edge0/);
  });
});

describe('channelIncisionM', () => {
  it('has a full-depth bed, a straight bank to the flood flat and nothing beyond the reach', () => {
    expect(channelIncisionM(0, 3, profile)).toBe(3);
    expect(channelIncisionM(2, 3, profile)).toBe(3);
    // Halfway up the bank: (3 + 0.5) / 2.
    // Bank: halfway from the 3 m bed up to the flood flat's edge at 0.5 + 0.01 × (30 − 6) = 0.74 m.
    expect(channelIncisionM(4, 3, profile)).toBeCloseTo(1.87, 12);
    // Flood flat: 0.5 m at its outer edge, falling 1 in 100 towards the bank.
    expect(channelIncisionM(20, 3, profile)).toBeCloseTo(0.6, 12);
    expect(channelIncisionM(30, 3, profile)).toBeCloseTo(0.5, 12);
    expect(channelIncisionM(40, 3, profile)).toBeCloseTo(0.25, 12);
    expect(channelIncisionM(50, 3, profile)).toBe(0);
    expect(channelIncisionM(500, 3, profile)).toBe(0);
  });
  it('never deepens away from the centreline', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 60, noNaN: true }), fc.double({ min: 0, max: 60, noNaN: true }), fc.double({ min: 0.6, max: 5, noNaN: true }), (a, b, depth) => {
        const [near, far] = a <= b ? [a, b] : [b, a];
        expect(channelIncisionM(far, depth, profile)).toBeLessThanOrEqual(channelIncisionM(near, depth, profile));
      }),
    );
  });
});

describe('plainElevationM', () => {
  it('falls 2.2 m per km to the south and rises away from the main creek', () => {
    expect(plainElevationM(0, 0)).toBe(PLAIN_BASE_M);
    expect(plainElevationM(1000, 0) - plainElevationM(0, 0)).toBeCloseTo(2.2, 9);
    expect(plainElevationM(0, 500)).toBeGreaterThan(plainElevationM(0, 0));
    expect(plainElevationM(0, -500)).toBeCloseTo(plainElevationM(0, 500), 12);
  });
});

describe('seeded random numbers', () => {
  it('repeat for the same seed, differ for another, stay in [0, 1)', () => {
    const a = createMulberry32(7);
    const b = createMulberry32(7);
    const c = createMulberry32(8);
    const seqA = Array.from({ length: 1000 }, a);
    expect(Array.from({ length: 1000 }, b)).toEqual(seqA);
    expect(Array.from({ length: 1000 }, c)).not.toEqual(seqA);
    for (const v of seqA) {
      expect(v).toBeGreaterThanOrEqual(0);
      expect(v).toBeLessThan(1);
    }
    expect(hashToUnit(3, 4, 5)).toBe(hashToUnit(3, 4, 5));
    expect(hashToUnit(3, 4, 5)).not.toBe(hashToUnit(4, 3, 5));
  });
  it('give normal deviates with mean near 0 and spread near 1', () => {
    const next = createMulberry32(99);
    const xs = Array.from({ length: 5000 }, () => drawNormal(next));
    const mean = xs.reduce((s, x) => s + x, 0) / xs.length;
    const sd = Math.sqrt(xs.reduce((s, x) => s + (x - mean) ** 2, 0) / xs.length);
    expect(Math.abs(mean)).toBeLessThan(0.05);
    expect(Math.abs(sd - 1)).toBeLessThan(0.05);
  });
});

describe('createPolylineNearest', () => {
  it('finds the distance and position along a line, and nothing out of reach', () => {
    const line: [number, number][] = [[0, 0], [100, 0], [100, 100]];
    const copy = structuredClone(line);
    const nearest = createPolylineNearest(line, 50);
    expect(nearest(50, 10)).toEqual({ distanceM: 10, alongFraction: 0.25 });
    expect(nearest(130, 50)).toEqual({ distanceM: 30, alongFraction: 0.75 });
    expect(nearest(50, 200)).toBeNull();
    expect(line).toEqual(copy);
  });
  it('rejects a single point and a non-positive reach', () => {
    expect(() => createPolylineNearest([[0, 0]], 10)).toThrow(/at least 2 points/);
    expect(() => createPolylineNearest([[0, 0], [1, 1]], 0)).toThrow(/positive/);
  });
});
