import type { CrossingSettings } from './crossing-options';
import type { DrainageIndex } from './drainage-index';
import { acuteAngleDeg, bearingOfDeg, localFrameAt } from './local-frame';
import type { MeasuredLine } from './measured-line';
import { intervalWithinBuffer } from './segment-buffer';
import { intersectSegments } from './segment-intersection';

/** Distance within which two points are one, metres: far above rounding, far below survey accuracy. */
export const SNAP_M = 0.001;

/** A contact between fence segment `fenceSegment` (at fraction t) and a drainage segment (at u). */
export interface RawContact {
  /** Index of the drainage line in the index. */
  readonly line: number;
  readonly fenceSegment: number;
  readonly t: number;
  readonly drainageSegment: number;
  readonly u: number;
  readonly collinear: boolean;
}

/** A fence chainage range, metres, lying within the runs-along buffer of a drainage line and roughly parallel to it. */
export interface AlongInterval {
  readonly line: number;
  readonly fromM: number;
  readonly toM: number;
}

/**
 * Compares one fence line with the drainage lines of an index, segment by segment: every contact
 * (`intersectSegments`, tolerance 1 mm) and every piece of fence within `runsAlongBufferM` of a
 * drainage segment (`intervalWithinBuffer`) whose direction is within `runsAlongMaxAngleDeg` of
 * the flow averaged over `flowWindowM`. Both are planar tests in the local frame at the fence
 * segment's start (`localFrameAt`); candidates come from the index's R-tree, queried with the
 * segment's bounding box grown by the buffer, or from every segment when `search` is `all-pairs`.
 */
export function scanFence(
  fence: MeasuredLine,
  index: DrainageIndex,
  settings: CrossingSettings,
): { contacts: RawContact[]; along: AlongInterval[] } {
  const contacts: RawContact[] = [];
  const along: AlongInterval[] = [];
  const reachM = Math.max(settings.runsAlongBufferM, SNAP_M) * 1.01 + SNAP_M;
  const all = settings.search === 'all-pairs' ? Array.from({ length: index.segmentCount }, (_, k) => k) : null;
  const flowBearings = new Map<number, number>();
  const c = fence.coordinates;
  for (let i = 0; i + 1 < c.length; i++) {
    const [alon, alat] = c[i]!;
    const [blon, blat] = c[i + 1]!;
    const { kx, ky } = localFrameAt(alon, alat);
    const candidates =
      all ??
      index.tree?.search(
        Math.min(alon, blon) - reachM / kx, Math.min(alat, blat) - reachM / ky,
        Math.max(alon, blon) + reachM / kx, Math.max(alat, blat) + reachM / ky,
      ) ??
      [];
    const bx = (blon - alon) * kx;
    const by = (blat - alat) * ky;
    const fenceBearingDeg = bearingOfDeg(bx, by);
    for (const item of candidates) {
      const line = index.segmentLine[item]!;
      const j = index.segmentIndex[item]!;
      const drainage = index.lines[line]!.line;
      const p = drainage.coordinates[j]!;
      const q = drainage.coordinates[j + 1]!;
      const cx = (p[0] - alon) * kx;
      const cy = (p[1] - alat) * ky;
      const dx = (q[0] - alon) * kx;
      const dy = (q[1] - alat) * ky;
      for (const { t, u, collinear } of intersectSegments(0, 0, bx, by, cx, cy, dx, dy, SNAP_M)) {
        contacts.push({ line, fenceSegment: i, t, drainageSegment: j, u, collinear });
      }
      const interval = intervalWithinBuffer(bx, by, cx, cy, dx, dy, settings.runsAlongBufferM);
      if (interval === null) continue;
      let flowBearingDeg = flowBearings.get(item);
      if (flowBearingDeg === undefined) {
        flowBearingDeg = drainage.bearingAtDeg(drainage.chainageM(j, 0.5), settings.flowWindowM);
        flowBearings.set(item, flowBearingDeg);
      }
      if (acuteAngleDeg(fenceBearingDeg, flowBearingDeg) <= settings.runsAlongMaxAngleDeg) {
        along.push({ line, fromM: fence.chainageM(i, interval[0]), toM: fence.chainageM(i, interval[1]) });
      }
    }
  }
  return { contacts, along };
}
