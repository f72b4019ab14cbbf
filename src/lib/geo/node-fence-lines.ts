import Flatbush from 'flatbush';
import { localFrameAt, type LocalFrame } from '../crossings/geometry/local-frame';
import { describePositionProblem } from '../crossings/geometry/position-checks';
import { intersectSegments } from '../crossings/geometry/segment-intersection';

type XY = [x: number, y: number];

/** Fence lines joined into one planar graph: every meeting point a node, every stretch between two an edge. */
export interface NodedLines {
  /** The plane: x = (lon − lon0)·kx, y = (lat − lat0)·ky, metres east and north. */
  readonly frame: LocalFrame;
  /** Node positions `[x, y]` in metres of the frame. */
  readonly nodes: XY[];
  /** Edges as pairs of node indices, lower first, each once. */
  readonly edges: [number, number][];
}

/** Points closer than this (metres) are one node; a line's vertices closer than this are one vertex. */
export const NODE_EPS_M = 0.005;

/**
 * Joins fence lines into a planar graph in a local east–north plane (`localFrameAt` at the
 * middle of their extent: equirectangular, Snyder 1987 §3; its scale is true to about 1e-3
 * across 20 km, far finer than the snapping).
 *
 * 1. Ends that nearly meet are joined: line ends within `snapM` of each other (chained: a end
 *    near b near c joins all three) move to their mean, and a line's own two ends when it has
 *    at least three vertices (a fence drawn round and back to its start).
 * 2. An end (or a joined group of ends) within `snapM` of another line, or of its own line away
 *    from its last segment, moves onto the nearest point of it (a fence stopping short of the
 *    one it runs to).
 * 3. Noding: every contact between two segments (`intersectSegments`, within 5 mm) splits both
 *    there; overlapping stretches become one edge.
 *
 * Overshoots (an end just past the fence it meets) need no snapping: the crossing is a node,
 * and the stub beyond it is an edge leading nowhere, which `planarFaces` drops.
 *
 * @param lines - fence lines, each `[lon, lat]` WGS84 degrees; not modified
 * @param snapM - how far apart ends may be and still meet, metres, 0 or more
 * @throws RangeError naming the first line and vertex that is not a position, or a bad `snapM`
 */
export function nodeFenceLines(lines: readonly (readonly (readonly number[])[])[], snapM: number): NodedLines {
  if (!Array.isArray(lines)) throw new RangeError('expected fence lines as an array of [lon, lat] arrays');
  if (!(Number.isFinite(snapM) && snapM >= 0)) throw new RangeError(`snapM must be a distance in metres, 0 or more, got ${snapM}`);
  lines.forEach((line, i) => {
    if (!Array.isArray(line)) throw new RangeError(`fence line ${i}: expected an array of [lon, lat] positions`);
    line.forEach((p, k) => {
      const problem = describePositionProblem(p);
      if (problem !== null) throw new RangeError(`fence line ${i}, vertex ${k}: ${problem}`);
    });
  });
  let [west, south, east, north] = [Infinity, Infinity, -Infinity, -Infinity];
  for (const line of lines) {
    for (const [lon, lat] of line) {
      [west, south, east, north] = [Math.min(west, lon!), Math.min(south, lat!), Math.max(east, lon!), Math.max(north, lat!)];
    }
  }
  const frame = west <= east ? localFrameAt((west + east) / 2, (south + north) / 2) : localFrameAt(0, 0);
  const toXY = (p: readonly number[]): XY => [(p[0]! - frame.lon0) * frame.kx, (p[1]! - frame.lat0) * frame.ky];
  const paths = joinEnds(lines.map((line) => dropRepeats(line.map(toXY))).filter((path) => path.length >= 2), snapM);
  return { frame, ...splitAtContacts(paths.map(dropRepeats).filter((path) => path.length >= 2)) };
}

const distance = (a: XY, b: XY) => Math.hypot(a[0] - b[0], a[1] - b[1]);

function dropRepeats(path: XY[]): XY[] {
  return path.filter((p, k) => k === 0 || distance(path[k - 1]!, p) >= 2 * NODE_EPS_M);
}

/** Steps 1 and 2: moves ends that nearly meet an end or a line. Returns new paths. */
function joinEnds(input: XY[][], snapM: number): XY[][] {
  const paths = input.map((path) => path.map(([x, y]): XY => [x, y]));
  const ends = paths.flatMap((_, line) => [{ line, at: 0 }, { line, at: paths[line]!.length - 1 }]);
  const parent = ends.map((_, k) => k);
  const root = (k: number): number => (parent[k] === k ? k : (parent[k] = root(parent[k]!)));
  for (let a = 0; a < ends.length; a++) {
    for (let b = a + 1; b < ends.length; b++) {
      const same = ends[a]!.line === ends[b]!.line;
      if (same && paths[ends[a]!.line]!.length < 3) continue;
      if (distance(paths[ends[a]!.line]![ends[a]!.at]!, paths[ends[b]!.line]![ends[b]!.at]!) <= snapM) parent[root(a)] = root(b);
    }
  }
  const groups = new Map<number, number[]>();
  ends.forEach((_, k) => groups.set(root(k), [...(groups.get(root(k)) ?? []), k]));
  const meeting = [...groups.values()].map((members) => {
    const points = members.map((k) => paths[ends[k]!.line]![ends[k]!.at]!);
    return { members, point: [points.reduce((s, p) => s + p[0], 0) / points.length, points.reduce((s, p) => s + p[1], 0) / points.length] as XY };
  });
  const segments = paths.flatMap((path, line) => path.slice(1).map((b, k) => ({ line, k, a: path[k]!, b })));
  if (segments.length === 0) return paths;
  const index = new Flatbush(segments.length);
  for (const { a, b } of segments) index.add(Math.min(a[0], b[0]), Math.min(a[1], b[1]), Math.max(a[0], b[0]), Math.max(a[1], b[1]));
  index.finish();
  for (const group of meeting) {
    const [x, y] = group.point;
    // The segments that start at one of the group's ends are where it comes from, not what it runs to.
    const own = (s: { line: number; k: number }) =>
      group.members.some((m) => ends[m]!.line === s.line && (s.k === ends[m]!.at || s.k === ends[m]!.at - 1));
    let best: { d: number; p: XY } | null = null;
    for (const s of index.search(x - snapM, y - snapM, x + snapM, y + snapM)) {
      if (own(segments[s]!)) continue;
      const p = nearestOnSegment(group.point, segments[s]!.a, segments[s]!.b);
      const d = distance(p, group.point);
      if (d <= snapM && (!best || d < best.d)) best = { d, p };
    }
    const target = best && best.d > NODE_EPS_M ? best.p : group.point;
    for (const m of group.members) paths[ends[m]!.line]![ends[m]!.at] = [target[0], target[1]];
  }
  return paths;
}

function nearestOnSegment(p: XY, a: XY, b: XY): XY {
  const vx = b[0] - a[0];
  const vy = b[1] - a[1];
  const t = Math.min(1, Math.max(0, ((p[0] - a[0]) * vx + (p[1] - a[1]) * vy) / (vx * vx + vy * vy)));
  return [a[0] + t * vx, a[1] + t * vy];
}

/** Step 3: splits every segment where another touches it; nodes within `NODE_EPS_M` are one. */
function splitAtContacts(paths: XY[][]): { nodes: XY[]; edges: [number, number][] } {
  const nodes: XY[] = [];
  const grid = new Map<string, number[]>();
  const cell = (v: number) => Math.floor(v / NODE_EPS_M);
  const nodeAt = (p: XY): number => {
    const [cx, cy] = [cell(p[0]), cell(p[1])];
    for (let dx = -1; dx <= 1; dx++) {
      for (let dy = -1; dy <= 1; dy++) {
        const found = grid.get(`${cx + dx},${cy + dy}`)?.find((n) => distance(nodes[n]!, p) <= NODE_EPS_M);
        if (found !== undefined) return found;
      }
    }
    nodes.push(p);
    grid.set(`${cx},${cy}`, [...(grid.get(`${cx},${cy}`) ?? []), nodes.length - 1]);
    return nodes.length - 1;
  };
  const segments = paths.flatMap((path) => path.slice(1).map((b, k) => ({ a: path[k]!, b, splits: [] as { t: number; node: number }[] })));
  const index = new Flatbush(Math.max(1, segments.length));
  for (const { a, b } of segments) index.add(Math.min(a[0], b[0]) - NODE_EPS_M, Math.min(a[1], b[1]) - NODE_EPS_M, Math.max(a[0], b[0]) + NODE_EPS_M, Math.max(a[1], b[1]) + NODE_EPS_M);
  if (segments.length === 0) index.add(0, 0, 0, 0);
  index.finish();
  const along = (s: { a: XY; b: XY }, t: number): XY => (t === 0 ? s.a : t === 1 ? s.b : [s.a[0] + t * (s.b[0] - s.a[0]), s.a[1] + t * (s.b[1] - s.a[1])]);
  segments.forEach((s, i) => {
    s.splits.push({ t: 0, node: nodeAt(s.a) }, { t: 1, node: nodeAt(s.b) });
    const [minX, minY, maxX, maxY] = [Math.min(s.a[0], s.b[0]), Math.min(s.a[1], s.b[1]), Math.max(s.a[0], s.b[0]), Math.max(s.a[1], s.b[1])];
    for (const j of index.search(minX, minY, maxX, maxY)) {
      if (j <= i) continue;
      const o = segments[j]!;
      for (const { t, u } of intersectSegments(s.a[0], s.a[1], s.b[0], s.b[1], o.a[0], o.a[1], o.b[0], o.b[1], NODE_EPS_M)) {
        const node = nodeAt(t === 0 || t === 1 || (u !== 0 && u !== 1) ? along(s, t) : along(o, u));
        s.splits.push({ t, node });
        o.splits.push({ t: u, node });
      }
    }
  });
  const edges = new Map<string, [number, number]>();
  for (const { splits } of segments) {
    splits.sort((p, q) => p.t - q.t);
    for (let k = 1; k < splits.length; k++) {
      const [a, b] = [splits[k - 1]!.node, splits[k]!.node].sort((p, q) => p - q) as [number, number];
      if (a !== b) edges.set(`${a},${b}`, [a, b]);
    }
  }
  return { nodes, edges: [...edges.values()] };
}
