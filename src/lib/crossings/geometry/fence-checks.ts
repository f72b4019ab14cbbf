import { describePositionProblem, MIN_SEGMENT_M, nearDistanceM } from './position-checks';
import { findSelfCrossings } from './self-crossings';
import type { Position } from './types';

/** A problem found in a fence line, in words a person can act on. */
export interface FenceProblem {
  readonly code: 'not-a-line' | 'bad-position' | 'repeated-vertex' | 'too-few-points' | 'antimeridian' | 'self-crossing';
  readonly message: string;
  /** The vertex concerned (index in the input), or null. */
  readonly vertexIndex: number | null;
  /** Where, `[lon, lat]` degrees, or null. */
  readonly position: [number, number] | null;
}

/**
 * Checks a fence line's coordinates and lists every problem: not an array; a position that is
 * not `[lon, lat]` finite degrees in range (then nothing further is checked); a vertex repeating
 * the one before (less than 1 cm away, a zero-length segment); fewer than two distinct points; a
 * segment spanning more than 180° of longitude; the line crossing, touching or doubling back over
 * itself (`findSelfCrossings`, with the segments and the point). A closed line (last point on the
 * first) is not a self-crossing.
 *
 * @param coordinates - `[lon, lat]` WGS84 degrees, as drawn or imported; not modified
 * @returns problems in vertex order (self-crossings last); empty when the line is usable
 */
export function checkFenceLine(coordinates: readonly Position[]): FenceProblem[] {
  if (!Array.isArray(coordinates)) {
    return [{ code: 'not-a-line', message: 'expected an array of [lon, lat] positions', vertexIndex: null, position: null }];
  }
  const problems: FenceProblem[] = [];
  coordinates.forEach((value: unknown, k) => {
    const problem = describePositionProblem(value);
    if (problem !== null) problems.push({ code: 'bad-position', message: `vertex ${k}: ${problem}`, vertexIndex: k, position: null });
  });
  if (problems.length > 0) return problems;
  const kept: number[] = [];
  coordinates.forEach((p, k) => {
    const previous = kept.length > 0 ? coordinates[kept[kept.length - 1]!]! : null;
    if (previous !== null && nearDistanceM(previous, p) < MIN_SEGMENT_M) {
      problems.push({
        code: 'repeated-vertex',
        message: `vertex ${k} repeats vertex ${kept[kept.length - 1]} (less than ${MIN_SEGMENT_M * 100} cm apart): a zero-length segment`,
        vertexIndex: k,
        position: [p[0], p[1]],
      });
    } else kept.push(k);
  });
  if (kept.length < 2) {
    problems.push({
      code: 'too-few-points',
      message: `a fence line needs at least two distinct points, got ${kept.length}`,
      vertexIndex: null,
      position: null,
    });
    return problems;
  }
  for (let k = 1; k < kept.length; k++) {
    const a = coordinates[kept[k - 1]!]!;
    const b = coordinates[kept[k]!]!;
    if (Math.abs(b[0] - a[0]) > 180) {
      problems.push({
        code: 'antimeridian',
        message: `the segment from vertex ${kept[k - 1]} to ${kept[k]} crosses the antimeridian; split the line there`,
        vertexIndex: kept[k - 1]!,
        position: null,
      });
      return problems;
    }
  }
  for (const { segmentA, segmentB, position } of findSelfCrossings(kept.map((k) => coordinates[k]!))) {
    const [lon, lat] = position;
    problems.push({
      code: 'self-crossing',
      message:
        `the fence crosses itself at [${lon.toFixed(6)}, ${lat.toFixed(6)}]: the segment from vertex ${kept[segmentA]} ` +
        `to ${kept[segmentA + 1]} meets the segment from vertex ${kept[segmentB]} to ${kept[segmentB + 1]}`,
      vertexIndex: kept[segmentA]!,
      position,
    });
  }
  return problems;
}

/**
 * A copy of a fence line without repeated vertices: a vertex less than 1 cm (`MIN_SEGMENT_M`)
 * from the last kept one is dropped. Positions are copied as `[lon, lat]` (a height is dropped).
 *
 * @param coordinates - `[lon, lat]` WGS84 degrees; not modified
 * @throws RangeError naming the first vertex that is not a valid position
 */
export function cleanFenceLine(coordinates: readonly Position[]): [number, number][] {
  if (!Array.isArray(coordinates)) throw new TypeError('expected an array of [lon, lat] positions');
  const cleaned: [number, number][] = [];
  coordinates.forEach((p: unknown, k) => {
    const problem = describePositionProblem(p);
    if (problem !== null) throw new RangeError(`vertex ${k}: ${problem}`);
    const [lon, lat] = p as Position;
    const last = cleaned[cleaned.length - 1];
    if (last === undefined || nearDistanceM(last, [lon, lat]) >= MIN_SEGMENT_M) cleaned.push([lon, lat]);
  });
  return cleaned;
}
