type LonLat = [number, number];
type ScreenPoint = { x: number; y: number };

/** What a pointer can snap to while drawing: fence ends (to join fences) and imported tracks. */
export type SnapTargets = {
  /** First and last points of the existing fence lines. */
  fenceEnds: readonly LonLat[];
  /** Track lines, [lon, lat] each. */
  tracks: readonly (readonly LonLat[])[];
};

/** Map projection from [lon, lat] to screen pixels (MapLibre's `map.project`). */
export type Project = (lon: number, lat: number) => ScreenPoint;

const distance = (a: ScreenPoint, b: ScreenPoint) => Math.hypot(a.x - b.x, a.y - b.y);

/**
 * The position a pointer at `pointer` (screen pixels) snaps to, or undefined when nothing is within
 * `tolerancePx`. A fence end wins over a track, so new fences join old ones exactly; on a track, a
 * vertex wins over a point along a segment, so a fence follows the track's own points where it can.
 * A point along a segment is interpolated in [lon, lat] at the screen fraction, which at drawing
 * scales (a few hundred metres on screen) is within millimetres of the geodesic.
 */
export function snapToPlan(pointer: ScreenPoint, targets: SnapTargets, project: Project, tolerancePx: number): LonLat | undefined {
  const nearestOf = (points: readonly LonLat[]) => {
    let best: { position: LonLat; px: number } | undefined;
    for (const position of points) {
      const px = distance(pointer, project(position[0], position[1]));
      if (px <= tolerancePx && (!best || px < best.px)) best = { position, px };
    }
    return best;
  };

  const end = nearestOf(targets.fenceEnds);
  if (end) return [end.position[0], end.position[1]];

  const vertex = nearestOf(targets.tracks.flat());
  if (vertex) return [vertex.position[0], vertex.position[1]];

  let along: { position: LonLat; px: number } | undefined;
  for (const track of targets.tracks) {
    for (let i = 1; i < track.length; i += 1) {
      const a = track[i - 1]!;
      const b = track[i]!;
      const pa = project(a[0], a[1]);
      const pb = project(b[0], b[1]);
      const dx = pb.x - pa.x;
      const dy = pb.y - pa.y;
      const lengthSq = dx * dx + dy * dy;
      if (lengthSq === 0) continue;
      const t = Math.max(0, Math.min(1, ((pointer.x - pa.x) * dx + (pointer.y - pa.y) * dy) / lengthSq));
      const px = distance(pointer, { x: pa.x + t * dx, y: pa.y + t * dy });
      if (px <= tolerancePx && (!along || px < along.px)) along = { position: [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])], px };
    }
  }
  return along?.position;
}
