/**
 * The planar building blocks of the crossing core, by hand and against brute force:
 * segment intersection with its tolerance, the part of a segment within a buffer of another, the
 * angle classes, and directions along a measured line. Distances are plane geometry (metres).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { classifyCrossingAngle } from '../../../../src/lib/crossings/geometry/index';
import { MeasuredLine } from '../../../../src/lib/crossings/geometry/measured-line';
import { intervalWithinBuffer } from '../../../../src/lib/crossings/geometry/segment-buffer';
import { intersectSegments } from '../../../../src/lib/crossings/geometry/segment-intersection';
import { alongBearing, geodesic, inverseM, ORIGIN, range, staircase } from './helpers';

describe('intersectSegments', () => {
  const eps = 0.001;
  it('finds a proper crossing by hand: (0,0)→(10,0) and (4,−3)→(4,7) meet at t = 0.4, u = 0.3', () => {
    expect(intersectSegments(0, 0, 10, 0, 4, -3, 4, 7, eps)).toEqual([{ t: 0.4, u: 0.3, collinear: false }]);
  });
  it('snaps within the tolerance to the ends, and sees an end touching the other segment', () => {
    expect(intersectSegments(0, 0, 10, 0, 10.0005, -1, 10.0005, 1, eps)).toEqual([{ t: 1, u: 0.5, collinear: false }]);
    expect(intersectSegments(0, 0, 10, 0, 5, 0.0004, 5, 3, eps)).toEqual([{ t: 0.5, u: 0, collinear: false }]);
    expect(intersectSegments(0, 0, 10, 0, 10.01, -1, 10.01, 1, eps)).toEqual([]);
  });
  it('gives the ends of a collinear overlap, and nothing for parallel lines apart', () => {
    expect(intersectSegments(0, 0, 10, 0, 4, 0, 20, 0, eps)).toEqual([
      { t: 0.4, u: 0, collinear: true },
      { t: 1, u: 0.375, collinear: true },
    ]);
    expect(intersectSegments(0, 0, 10, 0, 10, 0, 20, 0, eps)).toEqual([{ t: 1, u: 0, collinear: true }]);
    expect(intersectSegments(0, 0, 10, 0, 0, 1, 10, 1, eps)).toEqual([]);
  });
  it('catches a near-parallel end within the tolerance far from where the lines cross', () => {
    // C→D leaves (10, 0) at a slope of 1e-6: its far end (−20, 3e-5) lies on A→B's line within 1 mm.
    const contacts = intersectSegments(-30, 0, 10, 0, 10, 0, -20, 0.00003, eps);
    expect(contacts).toContainEqual({ t: 0.25, u: 1, collinear: false });
  });
});

describe('intervalWithinBuffer', () => {
  it('clips by hand: a line 5 m beside a 10 m segment, buffer 5 → exactly beside it', () => {
    // O→B = (0,5)…(20,5) is not at the origin; shift: O = origin, B = (20, 0), C→D = (5,−5)→(15,−5).
    expect(intervalWithinBuffer(20, 0, 5, -5, 15, -5, 5)).toEqual([0.25, 0.75]);
    const [t0, t1] = intervalWithinBuffer(20, 0, 5, -3, 15, -3, 5)!;
    expect(t0 * 20).toBeCloseTo(1, 12); // the end discs reach 4 m further: 5 − 4 = 1
    expect(t1 * 20).toBeCloseTo(19, 12);
    expect(intervalWithinBuffer(20, 0, 5, -6, 15, -6, 5)).toBeNull();
  });
  it('agrees with sampled distances on random segments', () => {
    const coordinate = fc.integer({ min: -100, max: 100 });
    fc.assert(
      fc.property(fc.tuple(coordinate, coordinate, coordinate, coordinate, coordinate, coordinate, fc.integer({ min: 1, max: 60 })), ([bx, by, cx, cy, dx, dy, r]) => {
        fc.pre((bx !== 0 || by !== 0) && (cx !== dx || cy !== dy));
        const interval = intervalWithinBuffer(bx, by, cx, cy, dx, dy, r);
        for (let k = 0; k <= 200; k++) {
          const t = k / 200;
          const distance = segmentDistance(t * bx, t * by, cx, cy, dx, dy);
          if (distance < r - 1e-9) expect(interval !== null && t >= interval[0] - 1e-9 && t <= interval[1] + 1e-9).toBe(true);
          if (distance > r + 1e-9) expect(interval === null || t < interval[0] + 1e-9 || t > interval[1] - 1e-9).toBe(true);
        }
      }),
      { numRuns: 500 },
    );
  });
});

describe('classifyCrossingAngle', () => {
  const defaults = { goodWithinDeg: 20, fairWithinDeg: 45 };
  it('is inclusive at the tolerance boundaries', () => {
    expect(classifyCrossingAngle(90, defaults)).toBe('good');
    expect(classifyCrossingAngle(70, defaults)).toBe('good');
    expect(classifyCrossingAngle(69.999, defaults)).toBe('fair');
    expect(classifyCrossingAngle(45, defaults)).toBe('fair');
    expect(classifyCrossingAngle(44.999, defaults)).toBe('poor');
    expect(classifyCrossingAngle(0, defaults)).toBe('poor');
    expect(classifyCrossingAngle(80, { goodWithinDeg: 5, fairWithinDeg: 10 })).toBe('fair');
  });
  it('rejects angles outside 0…90', () => {
    expect(() => classifyCrossingAngle(91, defaults)).toThrow(/between 0 and 90, got 91/);
    expect(() => classifyCrossingAngle(Number.NaN, defaults)).toThrow(/between 0 and 90/);
  });
});

describe('MeasuredLine', () => {
  const line = new MeasuredLine(alongBearing(ORIGIN, 30, range(0, 1000, 100)));
  it('measures geodesic chainage and finds points by it (GeographicLib Inverse, Karney 2013)', () => {
    expect(line.lengthM).toBeCloseTo(1000, 4);
    expect(line.locate(250)).toEqual({ segment: 2, t: expect.closeTo(0.5, 6) });
    expect(line.locate(-5)).toEqual({ segment: 0, t: 0 });
    expect(line.locate(5000)).toEqual({ segment: 9, t: 1 });
    expect(inverseM(line.pointAt(250), line.coordinates[0]!)).toBeCloseTo(250, 3);
  });
  it('gives the course over a window, the segment at 0, and the bisector at a vertex', () => {
    // The geodesic's own azimuth there (GeographicLib azi2): 30° less the meridians' convergence.
    const p = line.pointAt(500);
    expect(line.bearingAtDeg(500, 40)).toBeCloseTo(geodesic.Inverse(ORIGIN[1], ORIGIN[0], p[1], p[0]).azi2!, 4);
    const zigzag = new MeasuredLine(staircase(ORIGIN, [0, 90], 10, 40));
    expect(zigzag.bearingAtDeg(105, 40)).toBeCloseTo(45, 2);
    expect(zigzag.bearingAtDeg(105, 0)).toBeCloseTo(0, 3);
    expect(zigzag.bearingAtDeg(zigzag.cumulativeM[11]!, 0)).toBeCloseTo(45, 3);
  });
});

function segmentDistance(px: number, py: number, cx: number, cy: number, dx: number, dy: number): number {
  const vx = dx - cx;
  const vy = dy - cy;
  const f = Math.min(1, Math.max(0, ((px - cx) * vx + (py - cy) * vy) / (vx * vx + vy * vy)));
  return Math.hypot(cx + f * vx - px, cy + f * vy - py);
}
