import { describePositionProblem, MIN_SEGMENT_M, nearDistanceM } from './position-checks';
import type { Position } from './types';

/** The part of a fence or drainage line every entry check needs. */
export interface LineLike {
  readonly id: string | number;
  readonly coordinates: readonly Position[];
}

/**
 * Checks a list of lines at the entry of the core: each has a string or finite-number id, unique
 * in the list, and at least two positions `[lon, lat]` in WGS84 degrees, with consecutive
 * vertices at least 1 cm apart and no segment spanning more than 180° of longitude (lines must
 * not cross the antimeridian). Nothing is modified.
 *
 * @param what - how to name the lines in messages, e.g. `'fence line'`
 * @throws TypeError or RangeError naming the line (by id and list index) and the vertex at fault;
 *   `cleanFenceLine` removes repeated vertices
 */
export function checkLineInputs(lines: readonly LineLike[], what: string): void {
  if (!Array.isArray(lines)) throw new TypeError(`expected an array of ${what}s`);
  const seen = new Set<string | number>();
  lines.forEach((line, index) => {
    const id: unknown = line?.id;
    if (!(typeof id === 'string' || (typeof id === 'number' && Number.isFinite(id)))) {
      throw new TypeError(`${what} at index ${index}: id must be a string or a finite number`);
    }
    const name = `${what} ${JSON.stringify(id)} (index ${index})`;
    if (seen.has(id)) throw new RangeError(`${name}: id ${JSON.stringify(id)} is used by an earlier ${what}`);
    seen.add(id);
    const coordinates: unknown = line.coordinates;
    if (!Array.isArray(coordinates)) throw new TypeError(`${name}: coordinates must be an array of [lon, lat] positions`);
    if (coordinates.length < 2) {
      throw new RangeError(`${name}: needs at least two positions, got ${coordinates.length}`);
    }
    coordinates.forEach((position: unknown, k) => {
      const problem = describePositionProblem(position);
      if (problem !== null) throw new RangeError(`${name}: vertex ${k}: ${problem}`);
    });
    for (let k = 1; k < coordinates.length; k++) {
      const a = coordinates[k - 1] as Position;
      const b = coordinates[k] as Position;
      if (Math.abs(b[0] - a[0]) > 180) {
        throw new RangeError(`${name}: segment ${k - 1} crosses the antimeridian; split the line there`);
      }
      if (nearDistanceM(a, b) < MIN_SEGMENT_M) {
        throw new RangeError(
          `${name}: vertices ${k - 1} and ${k} are the same point (less than ${MIN_SEGMENT_M * 100} cm apart); remove the repeat`,
        );
      }
    }
  });
}
