import { clusterPosition, type ContactCluster, type LinePoint } from './cluster-contacts';
import { localFrameAt } from './local-frame';

/**
 * Where the fence's rays lie at a meeting point: −1 or +1 for the two sides of the drainage line,
 * 0 along it, 2 off it where the drainage line ends (no second side), null where the fence ends.
 */
export type RaySide = -1 | 0 | 1 | 2 | null;

/** Rays within this angle (radians) are one direction. */
const ANGLE_TOLERANCE = 1e-9;

/**
 * The side of the drainage line on which the fence arrives (`before`) and leaves (`after`) a
 * meeting point. At the point, the drainage line's rays back (upstream) and forward (downstream)
 * split the plane into two wedges; each fence ray (towards the previous and the next vertex) lies
 * in one of them (±1) or on a drainage ray (0). Directions are taken in the local east–north
 * frame at the point (`localFrameAt`); the test depends only on orientation, which that affine
 * frame preserves.
 */
export function fenceSides(cluster: ContactCluster): { before: RaySide; after: RaySide } {
  const [lon, lat] = clusterPosition(cluster);
  const { kx, ky } = localFrameAt(lon, lat);
  const [fenceBack, fenceForward] = rays(cluster.fence, kx, ky);
  const [drainageBack, drainageForward] = rays(cluster.drainage, kx, ky);
  const side = (ray: [number, number] | null): RaySide => {
    if (ray === null) return null;
    const angle = Math.atan2(ray[1], ray[0]);
    const drainageRays = [drainageBack, drainageForward].filter((r) => r !== null);
    if (drainageRays.some((r) => Math.abs(relativeAngle(angle, Math.atan2(r[1], r[0])) - Math.PI) > Math.PI - ANGLE_TOLERANCE)) return 0;
    if (drainageBack === null || drainageForward === null) return 2;
    const forwardAngle = Math.atan2(drainageForward[1], drainageForward[0]);
    const back = relativeAngle(Math.atan2(drainageBack[1], drainageBack[0]), forwardAngle);
    return relativeAngle(angle, forwardAngle) < back ? 1 : -1;
  };
  return { before: side(fenceBack), after: side(fenceForward) };
}

/** Directions (metres east, north) from the point back to the previous vertex and on to the next; null past an end. */
function rays({ line, vertex, segment }: LinePoint, kx: number, ky: number): [[number, number] | null, [number, number] | null] {
  const c = line.coordinates;
  const vector = (from: readonly number[], to: readonly number[]): [number, number] => [(to[0]! - from[0]!) * kx, (to[1]! - from[1]!) * ky];
  if (vertex < 0) {
    const forward = vector(c[segment]!, c[segment + 1]!);
    return [[-forward[0], -forward[1]], forward];
  }
  return [vertex > 0 ? vector(c[vertex]!, c[vertex - 1]!) : null, vertex < c.length - 1 ? vector(c[vertex]!, c[vertex + 1]!) : null];
}

/** Angle from `reference` to `angle`, 0 ≤ result < 2π. */
function relativeAngle(angle: number, reference: number): number {
  const rel = (angle - reference) % (2 * Math.PI);
  return rel < 0 ? rel + 2 * Math.PI : rel;
}
