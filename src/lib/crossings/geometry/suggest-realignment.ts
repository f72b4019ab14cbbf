import { checkLineInputs } from './check-lines';
import { cumulativeLengthsM } from './geodesic-length';
import { acuteAngleDeg, bearingOfDeg, localFrameAt } from './local-frame';
import { MeasuredLine } from './measured-line';
import { describePositionProblem, MIN_SEGMENT_M, nearDistanceM } from './position-checks';
import { findSelfCrossings } from './self-crossings';
import type { Crossing, Position } from './types';

export interface RealignmentOptions {
  /** Half-width of the wet zone measured across the flow from the crossing, metres (> 0). Default 30. */
  readonly wetZoneHalfWidthM?: number;
}

/** A suggested local change to a fence line. */
export interface Realignment {
  readonly ok: true;
  /** The whole new fence line, `[lon, lat]` degrees. */
  readonly coordinates: [number, number][];
  /** Geodesic length of the new line minus the original, metres (≥ 0 for a straight fence). */
  readonly addedLengthM: number;
  /** Angle between the new square section and the flow, degrees (90 up to rounding). */
  readonly newAngleDeg: number;
  /** Chainage range of the original fence that the dog-leg replaces, metres. */
  readonly replacedChainageRange: { readonly fromM: number; readonly toM: number };
}

export type RealignmentResult = Realignment | { readonly ok: false; readonly reason: string };

/**
 * Suggests a dog-leg that makes a fair or poor crossing square to the flow.
 *
 * Geometry, in the local east–north frame at the crossing X (`localFrameAt`): the wet zone is the
 * band of ground within h = `wetZoneHalfWidthM` of the channel, measured across the flow (the
 * averaged `flowBearingDeg` of `findCrossings`). Two new vertices P1 and P2 go on the band's
 * edges, on a line through X perpendicular to the flow, so the fence crosses the whole wet zone
 * square (2h long). From X the original fence is followed back and forward to where it first
 * leaves the band (R1, R2); legs R1→P1 and P2→R2 run along the band's edges, parallel to the flow
 * — the orientation in which floods damage fences least (NSW DPI Fisheries, "Fencing riparian
 * zones") — and the original between R1 and R2 is replaced. For a straight fence at angle θ to the
 * flow the added length is 2h (sin θ + cos θ − 1) / sin θ, which is ≥ 0. Lengths are geodesic
 * (GeographicLib, Karney 2013). The result is checked for self-crossings; re-run `findCrossings`
 * on it to see the new crossing and any other lines the legs meet.
 *
 * @param fenceCoordinates - the fence, `[lon, lat]` WGS84 degrees, ≥ 2 points ≥ 1 cm apart; not modified
 * @param crossing - a crossing of this fence from `findCrossings` (position, segment, flow bearing)
 * @returns the new line, or `ok: false` with the reason when the fence does not leave the wet zone
 *   on both sides, runs along the flow at the crossing, or the dog-leg would cross the fence itself
 * @throws RangeError on bad coordinates or options, or a crossing not on the given segment
 */
export function suggestRealignment(
  fenceCoordinates: readonly Position[],
  crossing: Pick<Crossing, 'position' | 'fenceSegmentIndex' | 'flowBearingDeg'>,
  options: RealignmentOptions = {},
): RealignmentResult {
  checkLineInputs([{ id: 'fence', coordinates: fenceCoordinates }], 'fence line');
  const h = options.wetZoneHalfWidthM ?? 30;
  if (!(Number.isFinite(h) && h > 0)) throw new RangeError(`wetZoneHalfWidthM must be metres > 0, got ${h}`);
  const { position, fenceSegmentIndex: i, flowBearingDeg } = crossing;
  const positionProblem = describePositionProblem(position);
  if (positionProblem !== null) throw new RangeError(`crossing.position: ${positionProblem}`);
  if (!(Number.isInteger(i) && i >= 0 && i < fenceCoordinates.length - 1)) {
    throw new RangeError(`crossing.fenceSegmentIndex must be a segment of the fence, 0…${fenceCoordinates.length - 2}, got ${i}`);
  }
  if (!Number.isFinite(flowBearingDeg)) throw new RangeError(`crossing.flowBearingDeg must be degrees, got ${flowBearingDeg}`);

  const frame = localFrameAt(position[0], position[1]);
  const local = fenceCoordinates.map(([lon, lat]) => [(lon - position[0]) * frame.kx, (lat - position[1]) * frame.ky] as const);
  const toLonLat = (x: number, y: number): [number, number] => [position[0] + x / frame.kx, position[1] + y / frame.ky];
  const [ax, ay] = local[i]!;
  const [bx, by] = local[i + 1]!;
  const lengthM = Math.hypot(bx - ax, by - ay);
  const distanceFromSegmentM = Math.abs(ax * by - ay * bx) / lengthM;
  const along = -(ax * (bx - ax) + ay * (by - ay)) / (lengthM * lengthM);
  if (distanceFromSegmentM > 0.01 || along < -1e-6 || along > 1 + 1e-6) {
    throw new RangeError(`crossing.position is not on fence segment ${i}`);
  }
  // p: unit vector across the flow, pointing the way the fence runs at the crossing.
  const beta = (flowBearingDeg * Math.PI) / 180;
  let [px, py] = [Math.cos(beta), -Math.sin(beta)];
  const ep = ((bx - ax) * px + (by - ay) * py) / lengthM;
  if (Math.abs(ep) < 1e-6) return { ok: false, reason: 'the fence runs along the flow at this point, so it does not cross the channel here' };
  if (ep < 0) [px, py] = [-px, -py];
  const across = (k: number): number => local[k]![0] * px + local[k]![1] * py;

  // Walk back from X to where the fence first reaches the band edge −h, then forward to +h.
  const exit = (direction: -1 | 1): { segment: number; x: number; y: number } | null => {
    let previous = { x: 0, y: 0, g: 0 };
    for (let k = direction < 0 ? i : i + 1; k >= 0 && k < local.length; k += direction) {
      const g = across(k);
      if (g * direction >= h) {
        const s = (direction * h - previous.g) / (g - previous.g);
        const x = previous.x + s * (local[k]![0] - previous.x);
        const y = previous.y + s * (local[k]![1] - previous.y);
        return { segment: direction < 0 ? k : k - 1, x, y };
      }
      previous = { x: local[k]![0], y: local[k]![1], g };
    }
    return null;
  };
  const r1 = exit(-1);
  const r2 = exit(1);
  if (r1 === null || r2 === null) {
    return {
      ok: false,
      reason: `the fence ${r1 === null ? 'starts' : 'ends'} inside the wet zone (within ${h} m of the channel across the flow), so there is no room for a dog-leg on that side`,
    };
  }
  const coordinates: [number, number][] = [];
  const push = (p: [number, number]): void => {
    const last = coordinates[coordinates.length - 1];
    if (last === undefined || nearDistanceM(last, p) >= MIN_SEGMENT_M) coordinates.push(p);
  };
  for (let k = 0; k <= r1.segment; k++) push([fenceCoordinates[k]![0], fenceCoordinates[k]![1]]);
  push(toLonLat(r1.x, r1.y));
  const p1 = toLonLat(-h * px, -h * py);
  const p2 = toLonLat(h * px, h * py);
  push(p1);
  push(p2);
  push(toLonLat(r2.x, r2.y));
  for (let k = r2.segment + 1; k < fenceCoordinates.length; k++) push([fenceCoordinates[k]![0], fenceCoordinates[k]![1]]);

  const selfCrossings = findSelfCrossings(coordinates);
  if (selfCrossings.length > 0) {
    const [lon, lat] = selfCrossings[0]!.position;
    return { ok: false, reason: `the dog-leg would make the fence cross itself at [${lon.toFixed(6)}, ${lat.toFixed(6)}]; realign this crossing by hand` };
  }
  const original = new MeasuredLine(fenceCoordinates);
  const chainageOf = ({ segment, x, y }: { segment: number; x: number; y: number }): number => {
    const [sx, sy] = local[segment]!;
    const [ex, ey] = local[segment + 1]!;
    const t = ((x - sx) * (ex - sx) + (y - sy) * (ey - sy)) / ((ex - sx) ** 2 + (ey - sy) ** 2);
    return original.chainageM(segment, Math.min(1, Math.max(0, t)));
  };
  const newLengths = cumulativeLengthsM(coordinates);
  return {
    ok: true,
    coordinates,
    addedLengthM: newLengths[newLengths.length - 1]! - original.lengthM,
    newAngleDeg: acuteAngleDeg(bearingOfDeg((p2[0] - p1[0]) * frame.kx, (p2[1] - p1[1]) * frame.ky), flowBearingDeg),
    replacedChainageRange: { fromM: chainageOf(r1), toM: chainageOf(r2) },
  };
}
