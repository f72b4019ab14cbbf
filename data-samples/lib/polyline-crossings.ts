/**
 * Where two polylines cross, and at what angle, in a projected CRS.
 */

type Point = readonly [number, number];

/** One crossing of polyline A by polyline B. */
export interface PolylineCrossing {
  /** Crossing point `[x, y]`, same CRS as the input. */
  readonly point: [number, number];
  /** Index of the segment of A (from vertex i to i + 1) and of B that cross. */
  readonly segmentA: number;
  readonly segmentB: number;
  /** Acute angle between the two segments, degrees in [0, 90]; 90 = square. */
  readonly angleDeg: number;
}

/**
 * Every proper crossing of two polylines (segments that intersect, touching ends included once
 * per segment pair), with the acute angle between the crossing segments. Brute force over
 * segment pairs: meant for fence lines of a few vertices against a creek of a few hundred.
 *
 * @param a - first polyline, `[x, y]` in metres
 * @param b - second polyline, `[x, y]` in metres
 */
export function findPolylineCrossings(a: readonly Point[], b: readonly Point[]): PolylineCrossing[] {
  const out: PolylineCrossing[] = [];
  for (let i = 0; i < a.length - 1; i++) {
    const [ax, ay] = a[i]!;
    const rx = a[i + 1]![0] - ax;
    const ry = a[i + 1]![1] - ay;
    for (let j = 0; j < b.length - 1; j++) {
      const [bx, by] = b[j]!;
      const sx = b[j + 1]![0] - bx;
      const sy = b[j + 1]![1] - by;
      const denom = rx * sy - ry * sx;
      if (denom === 0) continue;
      const t = ((bx - ax) * sy - (by - ay) * sx) / denom;
      const u = ((bx - ax) * ry - (by - ay) * rx) / denom;
      // Half-open on the far end so a crossing exactly at a shared vertex counts once.
      if (t < 0 || t >= 1 || u < 0 || u >= 1) continue;
      const cos = Math.abs(rx * sx + ry * sy) / (Math.hypot(rx, ry) * Math.hypot(sx, sy));
      out.push({
        point: [ax + t * rx, ay + t * ry],
        segmentA: i,
        segmentB: j,
        angleDeg: (Math.acos(Math.min(1, cos)) * 180) / Math.PI,
      });
    }
  }
  return out;
}
