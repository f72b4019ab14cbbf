type XY = readonly [x: number, y: number];

/** A bounded face of a planar graph: its outer ring and holes as node indices, closed. */
export interface PlanarFace {
  /** Counterclockwise, first node repeated at the end. */
  readonly outer: number[];
  /** Clockwise, each closed: the outlines of parts of the graph standing free inside the face. */
  readonly holes: number[][];
  /** Area in the plane's units squared, holes subtracted. */
  readonly area: number;
}

/**
 * The bounded faces of a noded planar graph (edges meet only at nodes): the areas its edges
 * close off, each once, with any free-standing part of the graph inside as a hole.
 *
 * Method: edges leading nowhere (dangles) are pruned, then each face is traced along half-edges
 * keeping it on the left — at each node the next edge is the first clockwise from the one
 * arrived by (the doubly-connected edge list walk of de Berg et al. 2008, *Computational
 * Geometry*, §2.2, from memory). An edge with the same face on both sides is a bridge, closes
 * nothing, and is removed before tracing again. Faces traced counterclockwise are bounded; each
 * connected part's clockwise outline becomes a hole of the smallest face of another part that
 * holds it.
 *
 * @param nodes - positions `[x, y]` in a plane (x east, y north); not modified
 * @param edges - pairs of node indices; duplicates and self-loops are ignored; not modified
 * @returns the bounded faces, largest first
 * @throws RangeError when an edge names a node that does not exist
 */
export function planarFaces(nodes: readonly XY[], edges: readonly (readonly [number, number])[]): PlanarFace[] {
  const neighbours = nodes.map(() => new Set<number>());
  for (const [a, b] of edges) {
    if (!(Number.isInteger(a) && Number.isInteger(b) && a >= 0 && b >= 0 && a < nodes.length && b < nodes.length)) {
      throw new RangeError(`edge [${a}, ${b}] names a node outside 0…${nodes.length - 1}`);
    }
    if (a === b) continue;
    neighbours[a]!.add(b);
    neighbours[b]!.add(a);
  }
  let faces: number[][];
  for (;;) {
    pruneDangles(neighbours);
    const traced = traceFaces(nodes, neighbours);
    const bridges = traced.bridges;
    faces = traced.faces;
    if (bridges.length === 0) break;
    for (const [a, b] of bridges) {
      neighbours[a]!.delete(b);
      neighbours[b]!.delete(a);
    }
  }
  const part = connectedParts(neighbours);
  const areas = faces.map((face) => signedArea(nodes, face));
  const bounded = faces.map((outer, k) => ({ outer, area: areas[k]!, holes: [] as number[][] })).filter((face) => face.area > 0);
  faces.forEach((outline, k) => {
    if (areas[k]! >= 0) return;
    const probe = nodes[outline[0]!]!;
    const holder = bounded
      .filter((face) => part[face.outer[0]!] !== part[outline[0]!] && contains(nodes, face.outer, probe))
      .sort((p, q) => p.area - q.area)[0];
    if (holder) holder.holes.push(outline);
  });
  return bounded
    .map(({ outer, area, holes }) => ({ outer, holes, area: area + holes.reduce((sum, hole) => sum + signedArea(nodes, hole), 0) }))
    .sort((p, q) => q.area - p.area);
}

function pruneDangles(neighbours: Set<number>[]): void {
  const queue = neighbours.flatMap((set, n) => (set.size === 1 ? [n] : []));
  while (queue.length) {
    const n = queue.pop()!;
    for (const m of neighbours[n]!) {
      neighbours[m]!.delete(n);
      if (neighbours[m]!.size === 1) queue.push(m);
    }
    neighbours[n]!.clear();
  }
}

function traceFaces(nodes: readonly XY[], neighbours: Set<number>[]): { faces: number[][]; bridges: [number, number][] } {
  // Neighbours of each node counterclockwise by direction.
  const around = neighbours.map((set, n) => {
    const [x, y] = nodes[n]!;
    return [...set].sort((a, b) => Math.atan2(nodes[a]![1] - y, nodes[a]![0] - x) - Math.atan2(nodes[b]![1] - y, nodes[b]![0] - x));
  });
  const faceOf = new Map<string, number>();
  const faces: number[][] = [];
  around.forEach((list, start) => {
    for (const first of list) {
      if (faceOf.has(`${start},${first}`)) continue;
      const face = [start];
      let [from, to] = [start, first];
      while (!faceOf.has(`${from},${to}`)) {
        faceOf.set(`${from},${to}`, faces.length);
        face.push(to);
        const turn = around[to]!;
        const next = turn[(turn.indexOf(from) - 1 + turn.length) % turn.length]!;
        [from, to] = [to, next];
      }
      faces.push(face);
    }
  });
  const bridges: [number, number][] = [];
  neighbours.forEach((set, a) => {
    for (const b of set) if (a < b && faceOf.get(`${a},${b}`) === faceOf.get(`${b},${a}`)) bridges.push([a, b]);
  });
  return { faces, bridges };
}

function connectedParts(neighbours: Set<number>[]): number[] {
  const part = neighbours.map(() => -1);
  neighbours.forEach((_, seed) => {
    if (part[seed] !== -1) return;
    const stack = [seed];
    part[seed] = seed;
    while (stack.length) {
      for (const m of neighbours[stack.pop()!]!) {
        if (part[m] === -1) {
          part[m] = seed;
          stack.push(m);
        }
      }
    }
  });
  return part;
}

/** Shoelace area of a closed ring of node indices: positive when counterclockwise. */
function signedArea(nodes: readonly XY[], ring: readonly number[]): number {
  let twice = 0;
  for (let k = 1; k < ring.length; k++) {
    const [ax, ay] = nodes[ring[k - 1]!]!;
    const [bx, by] = nodes[ring[k]!]!;
    twice += ax * by - bx * ay;
  }
  return twice / 2;
}

/** Even–odd ray casting; the probe never lies on the ring (it belongs to another part of the graph). */
function contains(nodes: readonly XY[], ring: readonly number[], [px, py]: XY): boolean {
  let inside = false;
  for (let k = 1; k < ring.length; k++) {
    const [ax, ay] = nodes[ring[k - 1]!]!;
    const [bx, by] = nodes[ring[k]!]!;
    if (ay > py !== by > py && px < ax + ((py - ay) * (bx - ax)) / (by - ay)) inside = !inside;
  }
  return inside;
}
