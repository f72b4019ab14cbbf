import Flatbush from 'flatbush';
import { localFrameAt } from './local-frame';
import { MIN_SEGMENT_M, nearDistanceM } from './position-checks';
import { SNAP_M } from './scan-fence';
import { intersectSegments } from './segment-intersection';
import type { Position } from './types';

/** Where a line meets itself: two of its segments (k runs from vertex k to k + 1) and the point. */
export interface SelfCrossing {
  readonly segmentA: number;
  readonly segmentB: number;
  /** `[lon, lat]` degrees. */
  readonly position: [number, number];
}

/**
 * Finds the points where a line crosses, touches or doubles back over itself: any contact
 * (within 1 mm) between two segments other than the vertex shared by neighbours, and a closed
 * line's start meeting its end. Candidate pairs come from a flatbush R-tree over the segments'
 * bounding boxes; each pair is tested in the local frame at the first segment's start
 * (`intersectSegments`).
 *
 * @param coordinates - `[lon, lat]` WGS84 degrees, valid positions, vertices ≥ 1 cm apart; not modified
 * @returns contacts ordered by first segment, one per point
 */
export function findSelfCrossings(coordinates: readonly Position[]): SelfCrossing[] {
  const n = coordinates.length - 1;
  if (n < 2) return [];
  const closed = nearDistanceM(coordinates[0]!, coordinates[n]!) < MIN_SEGMENT_M;
  const tree = new Flatbush(n);
  for (let k = 0; k < n; k++) {
    const a = coordinates[k]!;
    const b = coordinates[k + 1]!;
    tree.add(Math.min(a[0], b[0]), Math.min(a[1], b[1]), Math.max(a[0], b[0]), Math.max(a[1], b[1]));
  }
  tree.finish();
  const found: SelfCrossing[] = [];
  for (let i = 0; i < n; i++) {
    const a = coordinates[i]!;
    const b = coordinates[i + 1]!;
    const { kx, ky } = localFrameAt(a[0], a[1]);
    const pad = (2 * SNAP_M) / Math.min(kx, ky);
    const candidates = tree.search(
      Math.min(a[0], b[0]) - pad, Math.min(a[1], b[1]) - pad, Math.max(a[0], b[0]) + pad, Math.max(a[1], b[1]) + pad,
    );
    for (const j of candidates.filter((j) => j > i).sort((x, y) => x - y)) {
      const c = coordinates[j]!;
      const d = coordinates[j + 1]!;
      const contacts = intersectSegments(
        0, 0, (b[0] - a[0]) * kx, (b[1] - a[1]) * ky,
        (c[0] - a[0]) * kx, (c[1] - a[1]) * ky, (d[0] - a[0]) * kx, (d[1] - a[1]) * ky,
        SNAP_M,
      );
      for (const { t, u } of contacts) {
        if (j === i + 1 && t === 1 && u === 0) continue;
        if (closed && i === 0 && j === n - 1 && t === 0 && u === 1) continue;
        const position: [number, number] = [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
        if (!found.some((f) => nearDistanceM(f.position, position) < 2 * SNAP_M)) {
          found.push({ segmentA: i, segmentB: j, position });
        }
      }
    }
  }
  return found;
}
