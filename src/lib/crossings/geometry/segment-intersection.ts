/** Where two straight segments meet in a plane, with a distance tolerance. */

/** A meeting point of segments A→B and C→D, as fractions along each. */
export interface SegmentContact {
  /** Fraction along A→B, 0…1; exactly 0 or 1 when the point is within the tolerance of A or B. */
  readonly t: number;
  /** Fraction along C→D, 0…1; exactly 0 or 1 when within the tolerance of C or D. */
  readonly u: number;
  /** True when the two segments lie on one line and overlap (the contacts are the overlap's ends). */
  readonly collinear: boolean;
}

/** Sine of the angle below which two segments count as parallel. */
const PARALLEL_SINE = 1e-10;

/**
 * Finds where segment A→B meets segment C→D, coordinates in metres of one plane.
 *
 * Method: the parametric intersection of two lines (t, u from 2-D cross products, as in
 * O'Rourke 1998, *Computational Geometry in C*, §7.7, from memory), and a check of each of the
 * four end points against the other segment, so that an end lying within `epsM` of the other
 * segment is always a contact, whatever the angle (near-parallel segments can touch at an end
 * far from where their lines cross).
 * Parallel segments meet only when collinear within `epsM`; then the ends of their overlap are
 * the contacts. Fractions within `epsM` of an end snap to exactly 0 or 1, so that the same vertex
 * reached from two segments is recognised as one point.
 *
 * @param epsM - distance tolerance in metres, > 0; both segments must be longer than it
 * @returns the contacts, none to a few (near-parallel segments can touch at two ends)
 */
export function intersectSegments(
  ax: number, ay: number, bx: number, by: number,
  cx: number, cy: number, dx: number, dy: number,
  epsM: number,
): SegmentContact[] {
  const rx = bx - ax;
  const ry = by - ay;
  const sx = dx - cx;
  const sy = dy - cy;
  const lr = Math.hypot(rx, ry);
  const ls = Math.hypot(sx, sy);
  const qx = cx - ax;
  const qy = cy - ay;
  const denom = rx * sy - ry * sx;
  if (Math.abs(denom) <= PARALLEL_SINE * lr * ls) {
    if (Math.abs(qx * ry - qy * rx) / lr > epsM) return [];
    const tc = (qx * rx + qy * ry) / (lr * lr);
    const td = ((dx - ax) * rx + (dy - ay) * ry) / (lr * lr);
    const lo = Math.max(0, Math.min(tc, td));
    const hi = Math.min(1, Math.max(tc, td));
    if ((lo - hi) * lr > epsM) return [];
    const ts = (hi - lo) * lr <= epsM ? [Math.min(1, Math.max(0, (lo + hi) / 2))] : [lo, hi];
    return ts.map((t) => {
      const u = ((ax + t * rx - cx) * sx + (ay + t * ry - cy) * sy) / (ls * ls);
      return { t: snap(t, lr, epsM), u: snap(u, ls, epsM), collinear: true };
    });
  }
  const t = (qx * sy - qy * sx) / denom;
  const u = (qx * ry - qy * rx) / denom;
  const contacts: SegmentContact[] = [];
  const add = (contact: SegmentContact): void => {
    if (!contacts.some((c) => c.t === contact.t && c.u === contact.u)) contacts.push(contact);
  };
  if (t >= 0 && t <= 1 && u >= 0 && u <= 1) add({ t: snap(t, lr, epsM), u: snap(u, ls, epsM), collinear: false });
  // Ends within the tolerance of the other segment: at a shallow angle, possibly far from where the lines cross.
  for (const end of [0, 1]) {
    const fraction = nearestFraction(ax + end * rx, ay + end * ry, cx, cy, sx, sy, ls, epsM);
    if (fraction !== null) add({ t: end, u: snap(fraction, ls, epsM), collinear: false });
  }
  for (const end of [0, 1]) {
    const fraction = nearestFraction(cx + end * sx, cy + end * sy, ax, ay, rx, ry, lr, epsM);
    if (fraction !== null) add({ t: snap(fraction, lr, epsM), u: end, collinear: false });
  }
  return contacts;
}

/** Fraction along the segment (origin o, vector v, length l) nearest to p, or null when farther than epsM. */
function nearestFraction(
  px: number, py: number, ox: number, oy: number, vx: number, vy: number, l: number, epsM: number,
): number | null {
  const f = Math.min(1, Math.max(0, ((px - ox) * vx + (py - oy) * vy) / (l * l)));
  return Math.hypot(ox + f * vx - px, oy + f * vy - py) <= epsM ? f : null;
}

function snap(fraction: number, lengthM: number, epsM: number): number {
  if (fraction * lengthM <= epsM) return 0;
  if ((1 - fraction) * lengthM <= epsM) return 1;
  return fraction;
}
