/**
 * checkFenceLine and cleanFenceLine on hand-made lines (invented coordinates); self-crossing
 * points checked against Turf's `kinks` (Turf 7.4, @turf/kinks), a general-purpose library.
 */
import { kinks, lineString } from '@turf/turf';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkFenceLine, cleanFenceLine, findSelfCrossings, type Position } from '../../../../src/lib/crossings/geometry/index';
import { deepFreeze, destination, inverseM, ORIGIN } from './helpers';

const A: Position = [142.5, -31.5];
const B: Position = [142.501, -31.5];
const C: Position = [142.501, -31.499];
const D: Position = [142.5, -31.499];

describe('checkFenceLine', () => {
  it('finds nothing wrong with an ordinary line, or a closed paddock boundary', () => {
    expect(checkFenceLine([A, B, C])).toEqual([]);
    expect(checkFenceLine([A, B, C, D, A])).toEqual([]);
  });

  it('lists repeated vertices (zero-length segments) by index', () => {
    const near = destination(B, 45, 0.004); // 4 mm away: the same point for a fence
    const problems = checkFenceLine([A, B, B, near, C]);
    expect(problems.map((p) => [p.code, p.vertexIndex])).toEqual([
      ['repeated-vertex', 2],
      ['repeated-vertex', 3],
    ]);
    expect(problems[0]!.message).toMatch(/vertex 2 repeats vertex 1 \(less than 1 cm apart\): a zero-length segment/);
  });

  it('needs at least two distinct points', () => {
    expect(checkFenceLine([])).toMatchObject([{ code: 'too-few-points', message: 'a fence line needs at least two distinct points, got 0' }]);
    expect(checkFenceLine([A])).toMatchObject([{ code: 'too-few-points' }]);
    expect(checkFenceLine([A, A]).map((p) => p.code)).toEqual(['repeated-vertex', 'too-few-points']);
  });

  it('reports positions out of range or not numbers, and swapped order', () => {
    const bad = [A, [200, -31.5], [-31.5, 142.5], [142.5, Number.NaN], 'x', [1]] as unknown as Position[];
    const problems = checkFenceLine(bad);
    expect(problems.map((p) => [p.code, p.vertexIndex])).toEqual([
      ['bad-position', 1],
      ['bad-position', 2],
      ['bad-position', 3],
      ['bad-position', 4],
      ['bad-position', 5],
    ]);
    expect(problems[0]!.message).toMatch(/vertex 1: longitude 200 is outside −180…180 degrees/);
    expect(problems[1]!.message).toMatch(/latitude 142.5 is outside −90…90 degrees \(is the order \[lon, lat\]\?\)/);
    expect(checkFenceLine('nope' as unknown as Position[])).toMatchObject([{ code: 'not-a-line' }]);
  });

  it('reports a line crossing the antimeridian', () => {
    expect(checkFenceLine([[179.9, -20], [-179.9, -20]])).toMatchObject([{ code: 'antimeridian' }]);
  });

  it('says where a fence crosses itself, with the segments involved', () => {
    // A figure eight: A → C crosses B → D at the square's centre.
    const problems = checkFenceLine([A, C, B, D]);
    expect(problems).toHaveLength(1);
    expect(problems[0]!.code).toBe('self-crossing');
    expect(problems[0]!.message).toMatch(/the segment from vertex 0 to 1 meets the segment from vertex 2 to 3/);
    expect(inverseM(problems[0]!.position!, [142.5005, -31.4995])).toBeLessThan(0.001);
  });

  it('counts original vertex numbers even after repeats', () => {
    const problems = checkFenceLine([A, A, C, B, D]);
    expect(problems.map((p) => p.code)).toEqual(['repeated-vertex', 'self-crossing']);
    expect(problems[1]!.message).toMatch(/from vertex 0 to 2 meets the segment from vertex 3 to 4/);
  });

  it('reports a fence doubling back over itself and one touching itself at a vertex', () => {
    expect(checkFenceLine([A, B, destination(A, 90, 30)]).map((p) => p.code)).toEqual(['self-crossing']);
    const touching = [A, B, C, [142.5005, -31.5] as Position, [142.5005, -31.501] as Position];
    expect(checkFenceLine(touching)).toMatchObject([{ code: 'self-crossing' }]);
  });

  it('agrees with Turf kinks on random zigzags (transversal self-crossings)', () => {
    // Uniform over a 100 m square at 1e-12° (0.1 µm) steps: no touches or collinear pieces.
    const point = fc.tuple(fc.integer({ min: 0, max: 1e9 }), fc.integer({ min: 0, max: 1e9 }));
    fc.assert(
      fc.property(fc.array(point, { minLength: 2, maxLength: 12 }), (raw) => {
        // Scrambled with the vertex index, so fast-check's favourite values (0, small, equal) do not line up.
        const line = raw.map(([x, y], k): Position => [
          ORIGIN[0] + ((x * 7919 + k * 104_729 * (k + 3)) % 1e9) * 1e-12,
          ORIGIN[1] + ((y * 6007 + k * 130_363 * (k + 7)) % 1e9) * 1e-12,
        ]);
        // Segments of 1 m or more: shorter ones can double back within the 1 mm tolerance, a touch Turf does not see.
        fc.pre(line.every((p, k) => k === 0 || inverseM(line[k - 1]!, p) >= 1));
        const ours = findSelfCrossings(line);
        const theirs = kinks(lineString(line.map((p) => [...p]))).features;
        // Turf reports each transversal crossing once; our list adds touches, which random lines do not have.
        expect(ours.length).toBe(theirs.length);
        for (const k of theirs) expect(ours.some((o) => inverseM(o.position, k.geometry.coordinates) < 0.002)).toBe(true);
      }),
      { numRuns: 300 },
    );
  });

  it('does not modify its input', () => {
    const line = deepFreeze([A, A, C, B, D]);
    const before = structuredClone(line);
    checkFenceLine(line);
    expect(line).toEqual(before);
  });
});

describe('cleanFenceLine', () => {
  it('drops repeated vertices and keeps the rest in order as new [lon, lat] arrays', () => {
    const near = destination(B, 45, 0.004);
    const line = deepFreeze([A, A, B, near, B, C, C]);
    const cleaned = cleanFenceLine(line);
    expect(cleaned).toEqual([A, B, C]);
    expect(cleaned[0]).not.toBe(A);
    expect(checkFenceLine(cleaned)).toEqual([]);
    expect(line).toHaveLength(7);
  });

  it('rejects what is not a position', () => {
    expect(() => cleanFenceLine([A, [200, 0]])).toThrow(/vertex 1: longitude 200 is outside/);
  });
});
