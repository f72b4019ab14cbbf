/**
 * The part of segment O→B (O at the origin of a plane in metres, B = (bx, by)) that lies within
 * `bufferM` of segment C→D, as fractions [t0, t1] along O→B, or null when no part does.
 *
 * Method: the buffer of a segment is a capsule, the union of a rectangle (the segment swept
 * sideways by ±bufferM) and a disc of radius bufferM at each end. A line meets each of these
 * convex pieces in an interval (linear slab clipping for the rectangle, a quadratic for each
 * disc); the capsule is convex, so the union of the three is one interval, clipped to [0, 1].
 */
export function intervalWithinBuffer(
  bx: number, by: number, cx: number, cy: number, dx: number, dy: number, bufferM: number,
): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  const include = (range: [number, number] | null): void => {
    if (range === null) return;
    lo = Math.min(lo, range[0]);
    hi = Math.max(hi, range[1]);
  };
  include(discInterval(bx, by, cx, cy, bufferM));
  include(discInterval(bx, by, dx, dy, bufferM));
  // Rectangle, in C→D's own axes: along a = (P − C)·ŝ ∈ [0, |s|], across c = ŝ × (P − C) ∈ [−b, b].
  const length = Math.hypot(dx - cx, dy - cy);
  const ux = (dx - cx) / length;
  const uy = (dy - cy) / length;
  const along = slab(bx * ux + by * uy, -(cx * ux + cy * uy), 0, length);
  const across = slab(ux * by - uy * bx, -(ux * cy - uy * cx), -bufferM, bufferM);
  if (along !== null && across !== null) {
    const start = Math.max(along[0], across[0]);
    const end = Math.min(along[1], across[1]);
    if (start <= end) include([start, end]);
  }
  const t0 = Math.max(0, lo);
  const t1 = Math.min(1, hi);
  return t0 <= t1 ? [t0, t1] : null;
}

/** Values of t with |t·B − P| ≤ r. */
function discInterval(bx: number, by: number, px: number, py: number, r: number): [number, number] | null {
  const a = bx * bx + by * by;
  const halfB = -(bx * px + by * py);
  const c = px * px + py * py - r * r;
  const discriminant = halfB * halfB - a * c;
  if (discriminant < 0) return null;
  const root = Math.sqrt(discriminant);
  return [(-halfB - root) / a, (-halfB + root) / a];
}

/** Values of t with lo ≤ slope·t + offset ≤ hi. */
function slab(slope: number, offset: number, lo: number, hi: number): [number, number] | null {
  if (Math.abs(slope) < 1e-12) return offset >= lo && offset <= hi ? [-Infinity, Infinity] : null;
  const t1 = (lo - offset) / slope;
  const t2 = (hi - offset) / slope;
  return t1 <= t2 ? [t1, t2] : [t2, t1];
}
