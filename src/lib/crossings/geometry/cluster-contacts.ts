import type { DrainageIndex } from './drainage-index';
import type { MeasuredLine } from './measured-line';
import { SNAP_M, type RawContact } from './scan-fence';

/** A point on a line: a vertex (index ≥ 0) or a fraction t of a segment (vertex −1), and its chainage. */
export interface LinePoint {
  readonly line: MeasuredLine;
  readonly vertex: number;
  readonly segment: number;
  readonly t: number;
  readonly chainageM: number;
}

/** One meeting point of the fence with drainage line `line` (its index), on both lines. */
export interface ContactCluster {
  readonly line: number;
  fence: LinePoint;
  drainage: LinePoint;
}

/**
 * Groups the raw contacts of one fence by drainage line and joins those less than 2 mm apart
 * in chainage along both lines into one point (the same vertex reached from two segments, or a
 * crossing within a millimetre of a vertex), preferring a vertex over a point between vertices.
 *
 * @returns for each drainage line index, its meeting points in fence chainage order
 */
export function clusterContacts(contacts: readonly RawContact[], fence: MeasuredLine, index: DrainageIndex): Map<number, ContactCluster[]> {
  const byLine = new Map<number, ContactCluster[]>();
  const sorted = contacts
    .map((c): ContactCluster => ({
      line: c.line,
      fence: pointOn(fence, c.fenceSegment, c.t),
      drainage: pointOn(index.lines[c.line]!.line, c.drainageSegment, c.u),
    }))
    .sort((a, b) => a.line - b.line || a.fence.chainageM - b.fence.chainageM || a.drainage.chainageM - b.drainage.chainageM);
  for (const contact of sorted) {
    const clusters = byLine.get(contact.line) ?? [];
    byLine.set(contact.line, clusters);
    let joined = false;
    for (let k = clusters.length - 1; k >= 0 && clusters[k]!.fence.chainageM >= contact.fence.chainageM - 2 * SNAP_M; k--) {
      const cluster = clusters[k]!;
      if (Math.abs(cluster.drainage.chainageM - contact.drainage.chainageM) <= 2 * SNAP_M) {
        if (cluster.fence.vertex < 0 && contact.fence.vertex >= 0) cluster.fence = contact.fence;
        if (cluster.drainage.vertex < 0 && contact.drainage.vertex >= 0) cluster.drainage = contact.drainage;
        joined = true;
        break;
      }
    }
    if (!joined) clusters.push(contact);
  }
  for (const clusters of byLine.values()) {
    clusters.sort((a, b) => a.fence.chainageM - b.fence.chainageM || a.drainage.chainageM - b.drainage.chainageM);
  }
  return byLine;
}

/** The point at fraction t of a segment (t exactly 0 or 1: a vertex). */
export function pointOn(line: MeasuredLine, segment: number, t: number): LinePoint {
  const vertex = t === 0 ? segment : t === 1 ? segment + 1 : -1;
  const chainageM = vertex >= 0 ? line.cumulativeM[vertex]! : line.chainageM(segment, t);
  return { line, vertex, segment, t, chainageM };
}

/** The point at a chainage. */
export function pointAtChainage(line: MeasuredLine, chainageM: number): LinePoint {
  const { segment, t } = line.locate(chainageM);
  return { line, vertex: -1, segment, t, chainageM };
}

/** `[lon, lat]` of a cluster: the fence's vertex, else the drainage line's vertex, else the point between. */
export function clusterPosition({ fence, drainage }: ContactCluster): [number, number] {
  const vertexOf = (p: LinePoint): [number, number] => [p.line.coordinates[p.vertex]![0], p.line.coordinates[p.vertex]![1]];
  if (fence.vertex >= 0) return vertexOf(fence);
  if (drainage.vertex >= 0) return vertexOf(drainage);
  return fence.line.pointOn(fence.segment, fence.t);
}
