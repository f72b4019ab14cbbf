import Flatbush from 'flatbush';
import { checkLineInputs } from './check-lines';
import { MeasuredLine } from './measured-line';
import type { DrainageLineInput, Position } from './types';

/** One drainage line in an index: its attributes (nulls for unknowns) and its measured course. */
export interface IndexedDrainageLine {
  readonly id: string | number;
  readonly streamOrder: number | null;
  readonly upstreamAreaStartM2: number | null;
  readonly upstreamAreaEndM2: number | null;
  /** A copy of the input coordinates, upstream → downstream. */
  readonly line: MeasuredLine;
}

/**
 * Drainage lines prepared for many fence queries: a static packed Hilbert R-tree (flatbush,
 * V. Agafonkin) over the bounding boxes of every segment, in degrees `[lon, lat]`, and each
 * line's geodesic chainage (computed on first use). Build it once with `buildDrainageIndex` and
 * pass it to `findCrossings` in place of the drainage lines to reuse it across calls.
 */
export interface DrainageIndex {
  readonly kind: 'drainage-index';
  readonly lines: readonly IndexedDrainageLine[];
  /** Total number of segments; item k of the tree is segment `segmentIndex[k]` of line `segmentLine[k]`. */
  readonly segmentCount: number;
  readonly segmentLine: Uint32Array;
  readonly segmentIndex: Uint32Array;
  /** Null when there are no segments. */
  readonly tree: Flatbush | null;
}

/**
 * Builds the spatial index of drainage lines for `findCrossings`. The input is copied, never
 * modified; later changes to it do not reach the index.
 *
 * @param drainage - lines with unique ids, coordinates `[lon, lat]` WGS84 degrees from upstream to
 *   downstream (≥ 2 positions, vertices ≥ 1 cm apart), stream order and upstream areas (m²) or null
 * @throws TypeError or RangeError naming the line and the value at fault
 */
export function buildDrainageIndex(drainage: readonly DrainageLineInput[]): DrainageIndex {
  checkLineInputs(drainage, 'drainage line');
  const lines = drainage.map((input, index): IndexedDrainageLine => {
    const name = `drainage line ${JSON.stringify(input.id)} (index ${index})`;
    return {
      id: input.id,
      streamOrder: optionalNumber(input.streamOrder, `${name}: streamOrder`, 'a stream order ≥ 1', 1),
      upstreamAreaStartM2: optionalNumber(input.upstreamAreaStartM2, `${name}: upstreamAreaStartM2`, 'm² ≥ 0', 0),
      upstreamAreaEndM2: optionalNumber(input.upstreamAreaEndM2, `${name}: upstreamAreaEndM2`, 'm² ≥ 0', 0),
      line: new MeasuredLine(input.coordinates.map((p): Position => [p[0], p[1]])),
    };
  });
  const segmentCount = lines.reduce((sum, { line }) => sum + line.coordinates.length - 1, 0);
  const segmentLine = new Uint32Array(segmentCount);
  const segmentIndex = new Uint32Array(segmentCount);
  const tree = segmentCount > 0 ? new Flatbush(segmentCount) : null;
  let item = 0;
  lines.forEach(({ line }, lineIndex) => {
    const c = line.coordinates;
    for (let k = 0; k + 1 < c.length; k++, item++) {
      const a = c[k]!;
      const b = c[k + 1]!;
      segmentLine[item] = lineIndex;
      segmentIndex[item] = k;
      tree!.add(Math.min(a[0], b[0]), Math.min(a[1], b[1]), Math.max(a[0], b[0]), Math.max(a[1], b[1]));
    }
  });
  tree?.finish();
  return { kind: 'drainage-index', lines, segmentCount, segmentLine, segmentIndex, tree };
}

function optionalNumber(value: unknown, name: string, expected: string, minimum: number): number | null {
  if (value === null || value === undefined) return null;
  if (typeof value !== 'number' || !Number.isFinite(value) || value < minimum) {
    throw new RangeError(`${name} must be ${expected} or null, got ${String(value)}`);
  }
  return value;
}
