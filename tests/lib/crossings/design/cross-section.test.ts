/**
 * Channel cross-sections from the ground profile along the fence.
 *
 * Outside references used here:
 * - Analytic (plane geometry): a fence crossing the flow at angle θ crosses the channel over a
 *   length 1/sin θ times its width, so stations across the channel are chainage offsets × sin θ.
 * - Analytic: the trapezoid and V profiles in ./fixtures.ts, whose bed and bank corners are known.
 * - The bank rule is our own (documented in channelCrossSection), not a published method.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { channelCrossSection, NoChannelError } from '../../../../src/lib/crossings/design/index';
import { deepFreeze, TRAPEZOID_PROFILE, V_PROFILE } from './fixtures';

describe('channelCrossSection', () => {
  it('finds the bed and the top corners of a trapezoid as banks, square crossing (by hand)', () => {
    const s = channelCrossSection(TRAPEZOID_PROFILE, 100, 90, { halfWidthM: 20 });
    expect(s.stationsM).toEqual([-20, -7, -3, 0, 3, 7, 20]);
    expect(s.elevationsM).toEqual([2, 2, 0, 0, 0, 2, 2]);
    expect(s.chainagesM).toEqual([80, 93, 97, 100, 103, 107, 120]);
    // The bed is flat from 97 to 103: the tie goes to the point nearest the crossing.
    expect(s.bed).toEqual({ stationM: 0, chainageM: 100, elevationM: 0 });
    expect(s.bankStationsM).toEqual([-7, 7]);
    expect(s.channelDepthM).toBe(2);
    expect(s.warnings).toEqual([]);
  });

  it('shrinks stations by sin(angle) for an oblique fence: 30° halves them (analytic)', () => {
    const s = channelCrossSection(TRAPEZOID_PROFILE, 100, 30, { halfWidthM: 20 });
    const sin30 = Math.sin(Math.PI / 6);
    expect(s.stationScale).toBeCloseTo(0.5, 12);
    [-20, -7, -3, 0, 3, 7, 20].forEach((st, i) => expect(s.stationsM[i]).toBeCloseTo(st * sin30, 12));
    expect(s.bankStationsM[0]).toBeCloseTo(-3.5, 12);
    expect(s.bankStationsM[1]).toBeCloseTo(3.5, 12);
    // The channel is 14 m wide at the top, the fence crosses 28 m of it.
    expect(s.warnings.some((w) => /30°/.test(w) && /2\.00 times/.test(w))).toBe(true);
  });

  it('gives stations that are the square stations × sin(angle) for any angle (analytic, property)', () => {
    const square = channelCrossSection(V_PROFILE, 100, 90, { halfWidthM: 50 });
    fc.assert(
      fc.property(fc.double({ min: 1, max: 179, noNaN: true }), (angleDeg) => {
        const s = channelCrossSection(V_PROFILE, 100, angleDeg, { halfWidthM: 50 });
        const sin = Math.sin((angleDeg * Math.PI) / 180);
        s.stationsM.forEach((st, i) => expect(st).toBeCloseTo(square.stationsM[i]! * sin, 9));
        expect(s.elevationsM).toEqual(square.elevationsM);
      }),
    );
  });

  it('interpolates the section ends and puts the V banks at the window edge (by hand)', () => {
    const s = channelCrossSection(V_PROFILE, 100, 90, { halfWidthM: 30 });
    expect(s.stationsM).toEqual([-30, 0, 30]);
    expect(s.elevationsM[0]).toBeCloseTo(3, 12);
    expect(s.elevationsM[2]).toBeCloseTo(3, 12);
    // Threshold 3 − 0.1 × 3 = 2.7: first reached at the window edge on each side.
    expect(s.bankStationsM).toEqual([-30, 30]);
  });

  it('finds the bed off the crossing within the search distance', () => {
    const s = channelCrossSection(V_PROFILE, 95, 90, { halfWidthM: 40, bedSearchM: 10 });
    expect(s.bed.chainageM).toBe(100);
    expect(s.bed.stationM).toBe(5);
  });

  it('stops at a gap and says so', () => {
    const profile = [
      { chainageM: 0, elevationM: 10 },
      { chainageM: 90, elevationM: 1 },
      { chainageM: 100, elevationM: 0 },
      { chainageM: 110, elevationM: 1 },
      { chainageM: 115, elevationM: null },
      { chainageM: 200, elevationM: 10 },
    ];
    const s = channelCrossSection(profile, 100, 90, { halfWidthM: 20 });
    expect(s.chainagesM).toEqual([80, 90, 100, 110]);
    expect(s.warnings.some((w) => /ends at chainage 110/.test(w))).toBe(true);
  });

  it('reports a flat profile as no channel (bad input)', () => {
    const flat = [
      { chainageM: 0, elevationM: 5 },
      { chainageM: 200, elevationM: 5 },
    ];
    expect(() => channelCrossSection(flat, 100, 90, { halfWidthM: 50 })).toThrow(NoChannelError);
    expect(() => channelCrossSection(flat, 100, 90, { halfWidthM: 50 })).toThrow(/no channel/);
  });

  it('reports ground sloping one way only as no channel', () => {
    const slope = [
      { chainageM: 0, elevationM: 10 },
      { chainageM: 200, elevationM: 0 },
    ];
    expect(() => channelCrossSection(slope, 100, 90, { halfWidthM: 50 })).toThrow(NoChannelError);
  });

  it('rejects bad input with messages that say what was expected', () => {
    expect(() => channelCrossSection(V_PROFILE, 100, 0, { halfWidthM: 20 })).toThrow(/crossingAngleDeg/);
    expect(() => channelCrossSection(V_PROFILE, 100, 180, { halfWidthM: 20 })).toThrow(/crossingAngleDeg/);
    expect(() => channelCrossSection(V_PROFILE, 100, 90, { halfWidthM: 0 })).toThrow(/halfWidthM/);
    expect(() => channelCrossSection(V_PROFILE, 300, 90, { halfWidthM: 20 })).toThrow(/no ground height/);
    expect(() => channelCrossSection([{ chainageM: 5, elevationM: 1 }, { chainageM: 1, elevationM: 0 }], 3, 90, { halfWidthM: 1 })).toThrow(/sorted/);
    expect(() => channelCrossSection([{ chainageM: 0, elevationM: Number.NaN }, { chainageM: 1, elevationM: 0 }], 0.5, 90, { halfWidthM: 1 })).toThrow(/elevationM/);
  });

  it('does not mutate its input', () => {
    const profile = deepFreeze(structuredClone(TRAPEZOID_PROFILE));
    const options = deepFreeze({ halfWidthM: 20 });
    expect(() => channelCrossSection(profile, 100, 60, options)).not.toThrow();
    expect(profile).toEqual(TRAPEZOID_PROFILE);
  });
});
