/**
 * Property tests of findCrossings on random fences and drainage lines in a 1 km square (fast-check).
 *
 * - The flatbush index gives exactly what testing every pair of segments gives.
 * - The meeting points agree with Turf's `lineIntersect` (Turf 7.4, @turf/line-intersect; planar
 *   in degrees, as our segments are straight in degrees), a general-purpose reference library.
 * - Chainages agree with sums of GeographicLib Inverse distances (Karney 2013, Journal of Geodesy
 *   87:43–55) within 0.1 %.
 * Every coordinate is invented.
 */
import { lineIntersect, lineString } from '@turf/turf';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildDrainageIndex, findCrossings, findSelfCrossings, type DrainageLineInput, type FenceLineInput } from '../../../../src/lib/crossings/geometry/index';
import { inverseM, lineLengthM, ORIGIN } from './helpers';

const M_PER_DEG_LAT = 110_870; // about right at 31.5° S; only used to place random points
const M_PER_DEG_LON = 95_050;

/** A random polyline in a 1 km square: integer millimetres, so shrinking lands on tidy, often degenerate, geometry. */
function polyline(minVertices: number, maxVertices: number): fc.Arbitrary<[number, number][]> {
  const vertex = fc.tuple(fc.integer({ min: -500_000, max: 500_000 }), fc.integer({ min: -500_000, max: 500_000 }));
  return fc
    .array(vertex, { minLength: minVertices, maxLength: maxVertices })
    .map((points) => points.filter((p, k) => k === 0 || Math.hypot(p[0] - points[k - 1]![0], p[1] - points[k - 1]![1]) >= 20))
    .filter((points) => points.length >= 2)
    .map((points) => points.map(([x, y]): [number, number] => [ORIGIN[0] + x / 1000 / M_PER_DEG_LON, ORIGIN[1] + y / 1000 / M_PER_DEG_LAT]));
}

const scenario = fc.record({
  fences: fc.array(polyline(2, 8), { minLength: 1, maxLength: 4 }),
  drainage: fc.array(polyline(2, 15), { minLength: 1, maxLength: 5 }),
});

function toInputs({ fences, drainage }: { fences: [number, number][][]; drainage: [number, number][][] }) {
  return {
    fenceLines: fences.map((coordinates, k): FenceLineInput => ({ id: `f${k}`, coordinates })),
    drainageLines: drainage.map((coordinates, k): DrainageLineInput => ({
      id: k,
      coordinates,
      streamOrder: 1 + (k % 3),
      upstreamAreaStartM2: 1000 * k,
      upstreamAreaEndM2: 1000 * k + 5000,
    })),
  };
}

describe('findCrossings on random lines', () => {
  it('gives the same crossings, touches and runs-along through the index as through all pairs', () => {
    fc.assert(
      fc.property(scenario, (s) => {
        const { fenceLines, drainageLines } = toInputs(s);
        const indexed = findCrossings(fenceLines, buildDrainageIndex(drainageLines));
        const allPairs = findCrossings(fenceLines, drainageLines, { search: 'all-pairs' });
        expect(indexed).toEqual(allPairs);
      }),
      { numRuns: 300 },
    );
  });

  it('meets the drainage lines where Turf lineIntersect says, fence by fence and line by line', () => {
    // Random fractional coordinates: no exact touches, so every meeting is a transversal crossing.
    const fractional = fc.record({
      fences: fc.array(polyline(2, 6), { minLength: 1, maxLength: 3 }),
      drainage: fc.array(polyline(2, 10), { minLength: 1, maxLength: 4 }),
      jitter: fc.integer({ min: 1, max: 1_000_000 }),
    });
    fc.assert(
      fc.property(fractional, ({ fences, drainage, jitter }) => {
        const shift = (line: [number, number][], k: number) =>
          line.map(([lon, lat], v): [number, number] => [lon + ((jitter * (v + 1) * (k + 3)) % 997) * 1.3e-9, lat + ((jitter * (v + 7)) % 991) * 1.1e-9]);
        const { fenceLines, drainageLines } = toInputs({ fences: fences.map(shift), drainage: drainage.map((l, k) => shift(l, k + 11)) });
        const { crossings } = findCrossings(fenceLines, drainageLines);
        for (const fence of fenceLines) {
          for (const creek of drainageLines) {
            const ours = crossings.filter((c) => c.fenceId === fence.id && c.drainageId === creek.id).map((c) => c.position);
            const turf = lineIntersect(lineString(fence.coordinates.map((p) => [...p])), lineString(creek.coordinates.map((p) => [...p]))).features.map(
              (f) => f.geometry.coordinates,
            );
            expect(ours.length).toBe(turf.length);
            for (const p of turf) {
              // Within 2 mm: points within 1 mm of a vertex snap to it.
              expect(ours.some((q) => inverseM(q, p) < 0.002)).toBe(true);
            }
          }
        }
      }),
      { numRuns: 200 },
    );
  });

  it('gives chainages equal to sums of GeographicLib Inverse distances within 0.1 %', () => {
    fc.assert(
      fc.property(scenario, (s) => {
        const { fenceLines, drainageLines } = toInputs(s);
        for (const c of findCrossings(fenceLines, drainageLines).crossings) {
          const fence = fenceLines.find((f) => f.id === c.fenceId)!.coordinates;
          const creek = drainageLines.find((d) => d.id === c.drainageId)!.coordinates;
          const fenceM = lineLengthM(fence.slice(0, c.fenceSegmentIndex + 1)) + inverseM(fence[c.fenceSegmentIndex]!, c.position);
          const creekM = lineLengthM(creek.slice(0, c.drainageSegmentIndex + 1)) + inverseM(creek[c.drainageSegmentIndex]!, c.position);
          expect(Math.abs(c.fenceChainageM - fenceM)).toBeLessThanOrEqual(0.001 * fenceM + 1e-6);
          expect(Math.abs(c.drainageChainageM - creekM)).toBeLessThanOrEqual(0.001 * creekM + 1e-6);
          expect(c.crossingAngleDeg).toBeGreaterThanOrEqual(0);
          expect(c.crossingAngleDeg).toBeLessThanOrEqual(90);
        }
      }),
      { numRuns: 200 },
    );
  });

  it('is symmetric on grid lines full of shared vertices and overlaps: reversing a line keeps every meeting', () => {
    // Vertices on a 4 × 4 grid of 0.001° steps: touches, vertex hits and collinear stretches abound.
    const gridLine = fc
      .array(fc.tuple(fc.integer({ min: 0, max: 3 }), fc.integer({ min: 0, max: 3 })), { minLength: 2, maxLength: 6 })
      .map((points) => points.filter((p, k) => k === 0 || p[0] !== points[k - 1]![0] || p[1] !== points[k - 1]![1]))
      .filter((points) => points.length >= 2)
      .map((points) => points.map(([i, j]): [number, number] => [ORIGIN[0] + i * 0.001, ORIGIN[1] + j * 0.001]));
    const summary = (r: ReturnType<typeof findCrossings>, fenceLengthM: number, reversedFence: boolean) =>
      r.crossings
        .map((c) => `${c.kind}:${c.touchReason}:${Math.round(reversedFence ? fenceLengthM - c.fenceChainageM : c.fenceChainageM)}`)
        .sort();
    fc.assert(
      fc.property(gridLine, gridLine, (fence, creek) => {
        // Lines that cross or double back over themselves are checkFenceLine's business.
        fc.pre(findSelfCrossings(fence).length === 0 && findSelfCrossings(creek).length === 0);
        const length = lineLengthM(fence);
        const forward = findCrossings([{ id: 'f', coordinates: fence }], [{ id: 'd', coordinates: creek }]);
        const fenceReversed = findCrossings([{ id: 'f', coordinates: [...fence].reverse() }], [{ id: 'd', coordinates: creek }]);
        const creekReversed = findCrossings([{ id: 'f', coordinates: fence }], [{ id: 'd', coordinates: [...creek].reverse() }]);
        expect(summary(fenceReversed, length, true)).toEqual(summary(forward, length, false));
        expect(summary(creekReversed, length, false)).toEqual(summary(forward, length, false));
      }),
      { numRuns: 1000 },
    );
  });
});
