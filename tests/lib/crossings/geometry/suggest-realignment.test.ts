/**
 * suggestRealignment: dog-legs that square a crossing, checked by running findCrossings on the
 * result, by the closed form of the added length for a straight fence, and against GeographicLib
 * Inverse lengths (Karney 2013, Journal of Geodesy 87:43–55).
 *
 * Closed form (derived here, plane geometry): a straight fence crossing a straight channel at θ,
 * dog-legged across a wet zone of half-width h, loses 2h / sin θ of its length and gains the
 * square section 2h and two legs h cot θ, so it grows by 2h (sin θ + cos θ − 1) / sin θ.
 * Every line is invented.
 */
import { describe, expect, it } from 'vitest';
import { checkFenceLine, findCrossings, suggestRealignment, type Position } from '../../../../src/lib/crossings/geometry/index';
import { alongBearing, arc, deepFreeze, destination, lineLengthM, ORIGIN, range } from './helpers';

const CREEK = { id: 'creek', coordinates: alongBearing(ORIGIN, 0, range(-1000, 1000, 50)) };

function realign(coordinates: Position[], creek = CREEK, h = 30) {
  const [crossing] = findCrossings([{ id: 'f', coordinates }], [creek]).crossings;
  const result = suggestRealignment(coordinates, crossing!, { wetZoneHalfWidthM: h });
  if (!result.ok) throw new Error(result.reason);
  return { crossing: crossing!, result };
}

describe('suggestRealignment', () => {
  it.each([10, 20, 30, 45, 60, 75, 85])('squares a straight fence crossing at %d° and adds 2h(sin θ + cos θ − 1)/sin θ', (angle) => {
    const fence = alongBearing(ORIGIN, angle, [-900, -500, -120, 70, 400, 900]);
    const h = 30;
    const { crossing, result } = realign(fence, CREEK, h);
    expect(crossing.crossingAngleDeg).toBeCloseTo(angle, 2);
    expect(result.newAngleDeg).toBeCloseTo(90, 6);
    // The new line, run through findCrossings again: one crossing, square to the averaged flow.
    const again = findCrossings([{ id: 'new', coordinates: result.coordinates }], [CREEK], { runsAlongBufferM: 1 });
    expect(again.crossings).toHaveLength(1);
    expect(again.crossings[0]!.kind).toBe('crossing');
    expect(Math.abs(again.crossings[0]!.crossingAngleDeg - 90)).toBeLessThan(1);
    // Added length: the closed form, and exactly the difference of GeographicLib lengths.
    const theta = (angle * Math.PI) / 180;
    const expected = (2 * h * (Math.sin(theta) + Math.cos(theta) - 1)) / Math.sin(theta);
    expect(result.addedLengthM).toBeGreaterThan(0);
    expect(Math.abs(result.addedLengthM - expected)).toBeLessThan(0.001 * expected + 0.005);
    expect(result.addedLengthM).toBeCloseTo(lineLengthM(result.coordinates) - lineLengthM(fence), 6);
    // The replaced part runs h / sin θ either side of the crossing.
    expect(result.replacedChainageRange.fromM).toBeCloseTo(crossing.fenceChainageM - h / Math.sin(theta), 1);
    expect(result.replacedChainageRange.toM).toBeCloseTo(crossing.fenceChainageM + h / Math.sin(theta), 1);
    expect(checkFenceLine(result.coordinates)).toEqual([]);
    expect(result.coordinates).toHaveLength(fence.length + 4 - countBetween(fence, crossing.fenceChainageM, h / Math.sin(theta)));
  });

  it('squares a crossing of a curved creek and of a bent fence, without self-crossings', () => {
    const bend = { id: 'bend', coordinates: arc(destination(ORIGIN, 90, 500), 500, 200, 340, 3) };
    const fence = [destination(ORIGIN, 225, 700), destination(ORIGIN, 240, 25), destination(ORIGIN, 30, 40), destination(ORIGIN, 50, 700)];
    const { crossing, result } = realign(fence, bend);
    expect(crossing.angleClass).not.toBe('good');
    const again = findCrossings([{ id: 'new', coordinates: result.coordinates }], [bend]).crossings;
    expect(again.filter((c) => c.kind === 'crossing')).toHaveLength(1);
    expect(Math.abs(again[0]!.crossingAngleDeg - 90)).toBeLessThan(1);
    expect(result.addedLengthM).toBeCloseTo(lineLengthM(result.coordinates) - lineLengthM(fence), 6);
    expect(checkFenceLine(result.coordinates)).toEqual([]);
  });

  it('changes nothing but adds no length for a crossing that is already square', () => {
    const fence = alongBearing(ORIGIN, 90, [-300, -100, 100, 300]);
    const { result } = realign(fence);
    expect(result.addedLengthM).toBeCloseTo(0, 6);
    expect(result.newAngleDeg).toBeCloseTo(90, 6);
    expect(checkFenceLine(result.coordinates)).toEqual([]);
  });

  it('says why when there is no room: a fence ending inside the wet zone', () => {
    const fence = alongBearing(ORIGIN, 45, [-20, 600]);
    const [crossing] = findCrossings([{ id: 'f', coordinates: fence }], [CREEK]).crossings;
    const result = suggestRealignment(fence, crossing!, { wetZoneHalfWidthM: 30 });
    expect(result).toEqual({ ok: false, reason: expect.stringMatching(/fence starts inside the wet zone \(within 30 m/) });
  });

  it('says why when the dog-leg would cross the fence itself', () => {
    // The fence hooks back across the line of the square section just beyond the wet zone.
    const fence = [destination(ORIGIN, 225, 300), destination(ORIGIN, 45, 100), destination(ORIGIN, 60, 200), destination(ORIGIN, 110, 60), destination(ORIGIN, 200, 300)];
    const [crossing] = findCrossings([{ id: 'f', coordinates: fence }], [CREEK]).crossings;
    const result = suggestRealignment(fence, crossing!, { wetZoneHalfWidthM: 80 });
    expect(result).toEqual({ ok: false, reason: expect.stringMatching(/cross itself/) });
  });

  it('does not modify its inputs', () => {
    const fence = deepFreeze(alongBearing(ORIGIN, 40, [-500, 10, 500]));
    const [found] = findCrossings([{ id: 'f', coordinates: fence }], [CREEK]).crossings;
    const crossing = deepFreeze({ ...found! });
    const before = structuredClone({ fence, crossing });
    expect(suggestRealignment(fence, crossing).ok).toBe(true);
    expect({ fence, crossing }).toEqual(before);
  });

  it('rejects bad input with a message', () => {
    const fence = alongBearing(ORIGIN, 40, [-500, 10, 500]);
    const [crossing] = findCrossings([{ id: 'f', coordinates: fence }], [CREEK]).crossings;
    expect(() => suggestRealignment([], crossing!)).toThrow(/at least two positions/);
    expect(() => suggestRealignment(fence, crossing!, { wetZoneHalfWidthM: 0 })).toThrow(/wetZoneHalfWidthM must be metres > 0/);
    expect(() => suggestRealignment(fence, { ...crossing!, fenceSegmentIndex: 1 })).toThrow(/not on fence segment 1/);
    expect(() => suggestRealignment(fence, { ...crossing!, fenceSegmentIndex: 7 })).toThrow(/fenceSegmentIndex must be a segment/);
    expect(() => suggestRealignment(fence, { ...crossing!, flowBearingDeg: Number.NaN })).toThrow(/flowBearingDeg/);
  });
});

/** How many of a straight fence's vertices lie within `halfM` of the crossing along it (they are replaced). */
function countBetween(fence: Position[], chainageM: number, halfM: number): number {
  let count = 0;
  for (let k = 0; k < fence.length; k++) {
    const c = lineLengthM(fence.slice(0, k + 1));
    if (Math.abs(c - chainageM) < halfM) count++;
  }
  return count;
}
