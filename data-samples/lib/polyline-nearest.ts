/**
 * Nearest-point queries against one polyline, fast enough to ask for every cell of a raster:
 * segments are filed into square buckets once, so a query looks at one bucket only.
 */

/** Where a query point meets a polyline. */
export interface NearestOnPolyline {
  /** Distance from the query point to the polyline, metres. */
  readonly distanceM: number;
  /** Position of the nearest point along the polyline, 0 at its first vertex, 1 at its last. */
  readonly alongFraction: number;
}

/** A nearest-point query: `null` when the polyline is farther than the reach. */
export type PolylineNearestQuery = (x: number, y: number) => NearestOnPolyline | null;

/**
 * Build a query for the nearest point on a polyline, within a reach.
 *
 * Each segment is filed into every bucket (side `reachM`) that its bounding box, grown by `reachM`,
 * touches; a point within `reachM` of a segment lies inside that grown box, so the point's own
 * bucket holds every segment that can be within reach.
 *
 * @param points - vertices `[x, y]` in metres (a projected CRS), at least two
 * @param reachM - largest distance of interest, metres, positive
 * @throws Error if there are fewer than two points or the reach is not positive
 */
export function createPolylineNearest(points: readonly (readonly [number, number])[], reachM: number): PolylineNearestQuery {
  if (points.length < 2) throw new Error(`a polyline needs at least 2 points, got ${points.length}`);
  if (!(reachM > 0)) throw new Error(`reach must be a positive number of metres, got ${reachM}`);
  const xs = points.map((p) => p[0]);
  const ys = points.map((p) => p[1]);
  const cumulativeM = [0];
  for (let i = 1; i < points.length; i++) {
    cumulativeM.push(cumulativeM[i - 1]! + Math.hypot(xs[i]! - xs[i - 1]!, ys[i]! - ys[i - 1]!));
  }
  const totalM = cumulativeM[cumulativeM.length - 1]!;
  const buckets = new Map<string, number[]>();
  const bucketOf = (v: number) => Math.floor(v / reachM);
  for (let i = 0; i < points.length - 1; i++) {
    const bx0 = bucketOf(Math.min(xs[i]!, xs[i + 1]!) - reachM);
    const bx1 = bucketOf(Math.max(xs[i]!, xs[i + 1]!) + reachM);
    const by0 = bucketOf(Math.min(ys[i]!, ys[i + 1]!) - reachM);
    const by1 = bucketOf(Math.max(ys[i]!, ys[i + 1]!) + reachM);
    for (let bx = bx0; bx <= bx1; bx++) {
      for (let by = by0; by <= by1; by++) {
        const key = `${bx},${by}`;
        const list = buckets.get(key);
        if (list) list.push(i);
        else buckets.set(key, [i]);
      }
    }
  }
  return (x, y) => {
    const list = buckets.get(`${bucketOf(x)},${bucketOf(y)}`);
    if (!list) return null;
    let best = Infinity;
    let bestAlongM = 0;
    for (const i of list) {
      const ax = xs[i]!;
      const ay = ys[i]!;
      const dx = xs[i + 1]! - ax;
      const dy = ys[i + 1]! - ay;
      const len2 = dx * dx + dy * dy;
      const t = len2 === 0 ? 0 : Math.min(1, Math.max(0, ((x - ax) * dx + (y - ay) * dy) / len2));
      const d = Math.hypot(x - (ax + t * dx), y - (ay + t * dy));
      if (d < best) {
        best = d;
        bestAlongM = cumulativeM[i]! + t * Math.sqrt(len2);
      }
    }
    if (best > reachM) return null;
    return { distanceM: best, alongFraction: totalM === 0 ? 0 : bestAlongM / totalM };
  };
}
