import { clusterContacts, clusterPosition, pointAtChainage, type ContactCluster, type LinePoint } from './cluster-contacts';
import type { DrainageIndex } from './drainage-index';
import { fenceSides } from './fence-sides';
import type { MeasuredLine } from './measured-line';
import { SNAP_M, type RawContact } from './scan-fence';
import type { TouchReason } from './types';

/** One meeting of the fence with a drainage line, before directions and attributes are added. */
export interface Meeting {
  /** Index of the drainage line in the index. */
  readonly line: number;
  readonly kind: 'crossing' | 'touch';
  readonly touchReason: TouchReason | null;
  readonly fenceSegment: number;
  readonly drainageSegment: number;
  readonly position: [number, number];
  readonly fenceChainageM: number;
  readonly drainageChainageM: number;
}

/**
 * Turns the raw contacts of one fence into meetings (`clusterContacts` joins those within
 * 2 mm): a `crossing` where the fence passes from one side of the drainage line to the other,
 * else a `touch` with its reason.
 *
 * Method (`fenceSides`): the sides on which the fence arrives and leaves. Different sides: a
 * crossing; the same side: a touch (`tangent`). Where the fence lies on the drainage line for a
 * stretch, the stretch is followed to where the fence leaves it and judged by the sides before
 * and after it (`along` when the same), and reported at its middle. A point at either end of the
 * fence or of the drainage line is a touch (`fence-end`, `drainage-end`), and a stretch reaching
 * such an end belongs to that touch. So the answer does not depend on which way either line runs.
 *
 * @returns meetings in fence chainage order, then drainage line order
 */
export function classifyMeetings(contacts: readonly RawContact[], fence: MeasuredLine, index: DrainageIndex): Meeting[] {
  const meetings: Meeting[] = [];
  for (const clusters of clusterContacts(contacts, fence, index).values()) {
    // Stretches the fence is on: where each began and the side the fence came from (null: from an end).
    const open: { start: ContactCluster; side: number | null }[] = [];
    for (const cluster of clusters) {
      const { before, after } = fenceSides(cluster);
      const end = endReason(cluster);
      const stretchHere = before === 0 ? takeStretch(open, cluster) : null;
      if (end !== null) {
        // A stretch ending or starting at an end of either line is part of that end's touch.
        meetings.push(atPoint(cluster, 'touch', end));
        if (after === 0) open.push({ start: cluster, side: null });
      } else if (before === 0 && stretchHere === null) {
        meetings.push(atPoint(cluster, 'touch', 'along'));
      } else if (stretchHere !== null && after === 0) {
        open.push(stretchHere);
      } else if (stretchHere !== null) {
        if (stretchHere.side !== null) {
          const crossing = stretchHere.side !== after;
          meetings.push(stretch(stretchHere.start, cluster, crossing ? 'crossing' : 'touch', crossing ? null : 'along'));
        }
      } else if (after === 0) {
        open.push({ start: cluster, side: before });
      } else {
        meetings.push(atPoint(cluster, before === after ? 'touch' : 'crossing', before === after ? 'tangent' : null));
      }
    }
    for (const { start, side } of open) if (side !== null) meetings.push(atPoint(start, 'touch', 'along'));
  }
  return meetings.sort((a, b) => a.fenceChainageM - b.fenceChainageM || a.line - b.line);
}

/**
 * Removes and returns the open stretch that arrives at `cluster`: the one whose length along the
 * fence equals its length along the drainage line (the same ground), or null.
 */
function takeStretch(open: { start: ContactCluster; side: number | null }[], cluster: ContactCluster) {
  const k = open.findIndex(({ start }) => {
    const fenceM = cluster.fence.chainageM - start.fence.chainageM;
    const drainageM = Math.abs(cluster.drainage.chainageM - start.drainage.chainageM);
    return Math.abs(fenceM - drainageM) <= 4 * SNAP_M + 1e-6 * fenceM;
  });
  return k < 0 ? null : open.splice(k, 1)[0]!;
}

function endReason({ fence, drainage }: ContactCluster): TouchReason | null {
  if (fence.vertex === 0 || fence.vertex === fence.line.coordinates.length - 1) return 'fence-end';
  if (drainage.vertex === 0 || drainage.vertex === drainage.line.coordinates.length - 1) return 'drainage-end';
  return null;
}

function segmentOf({ line, vertex, segment }: LinePoint): number {
  return vertex >= 0 ? Math.min(vertex, line.coordinates.length - 2) : segment;
}

function atPoint(cluster: ContactCluster, kind: Meeting['kind'], touchReason: TouchReason | null): Meeting {
  return {
    line: cluster.line,
    kind,
    touchReason,
    fenceSegment: segmentOf(cluster.fence),
    drainageSegment: segmentOf(cluster.drainage),
    position: clusterPosition(cluster),
    fenceChainageM: cluster.fence.chainageM,
    drainageChainageM: cluster.drainage.chainageM,
  };
}

/** A meeting at the middle of the stretch from `start` to `finish` where the fence lies on the line. */
function stretch(start: ContactCluster, finish: ContactCluster, kind: Meeting['kind'], touchReason: TouchReason | null): Meeting {
  if (start === finish) return atPoint(start, kind, touchReason);
  const fence = pointAtChainage(start.fence.line, (start.fence.chainageM + finish.fence.chainageM) / 2);
  const drainage = pointAtChainage(start.drainage.line, (start.drainage.chainageM + finish.drainage.chainageM) / 2);
  return {
    line: start.line,
    kind,
    touchReason,
    fenceSegment: fence.segment,
    drainageSegment: drainage.segment,
    position: fence.line.pointOn(fence.segment, fence.t),
    fenceChainageM: fence.chainageM,
    drainageChainageM: drainage.chainageM,
  };
}
