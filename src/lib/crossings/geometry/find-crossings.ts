import { checkLineInputs } from './check-lines';
import { classifyCrossingAngle } from './classify-crossing-angle';
import { classifyMeetings, type Meeting } from './classify-meetings';
import { resolveCrossingOptions, type CrossingSettings, type FindCrossingsOptions } from './crossing-options';
import { buildDrainageIndex, type DrainageIndex } from './drainage-index';
import { acuteAngleDeg } from './local-frame';
import { MeasuredLine } from './measured-line';
import { collectRunsAlong } from './runs-along';
import { scanFence } from './scan-fence';
import type { Crossing, CrossingsResult, DrainageLineInput, FenceLineInput } from './types';

/**
 * Finds every point where each fence line meets a drainage line, and how square each crossing is.
 *
 * - Meetings: `crossing` where the fence passes from one side of the line to the other, `touch`
 *   where it only meets it (an end or a vertex on the line, a tangent, a shared stretch left on
 *   the side it came from; see `classifyMeetings`). Points within about a millimetre are one
 *   point; a meeting along a shared stretch is placed at the stretch's middle.
 * - Geometry: segments are straight in degrees; whether and where they meet is found in a local
 *   east–north plane at each fence segment's start (`localFrameAt`, equirectangular with the
 *   WGS84 radii of curvature), exact for the straight-in-degrees segments and within millimetres
 *   of the geodesic ones at fence scale. Chainages and lengths are geodesic on WGS84
 *   (GeographicLib, Karney 2013, J. Geodesy 87:43–55).
 * - Flow direction: the chord of the drainage line between the points `flowWindowM` (default
 *   40 m) upstream and downstream of the crossing, along the line and clamped to its ends —
 *   equal to the length-weighted mean of its segment directions in the window, so cell-by-cell
 *   zigzags do not decide it. Lines are not followed across confluences into other lines.
 *   Fence direction: the fence segment at the crossing (at a vertex, the bisector of the two
 *   segments), or a chord over ±`fenceWindowM` when that is set.
 * - Crossing angle: the acute angle between those two directions, 0–90° (90° is square), classed
 *   by `classifyCrossingAngle` (defaults: within 20° of square good, within 45° fair, else poor).
 * - Upstream area: interpolated linearly by chainage between the line's values at its ends (a
 *   simplification: the true area grows in steps where tributaries join); null when unknown.
 * - Special cases, reported, never dropped: touches (above); `crosses-twice` on each of two or
 *   more crossings of the same fence and line within `crossesTwiceWithinM` (default 100 m) along
 *   the fence; `runs-along` stretches longer than `runsAlongMinLengthM` (default 100 m) within
 *   `runsAlongBufferM` (default 20 m) of a line and within `runsAlongMaxAngleDeg` (default 25°) of
 *   parallel to its averaged flow.
 *
 * @param fences - fence lines with unique ids, coordinates `[lon, lat]` WGS84 degrees, at least two
 *   positions, vertices ≥ 1 cm apart (`cleanFenceLine` removes repeats). Not modified.
 * @param drainage - drainage lines (upstream → downstream), or an index from `buildDrainageIndex`
 *   to reuse across calls. Not modified.
 * @returns crossings and touches by fence (input order) and chainage; runs-along stretches
 * @throws TypeError or RangeError naming the line, vertex or setting at fault
 */
export function findCrossings(
  fences: readonly FenceLineInput[],
  drainage: readonly DrainageLineInput[] | DrainageIndex,
  options: FindCrossingsOptions = {},
): CrossingsResult {
  const settings = resolveCrossingOptions(options);
  checkLineInputs(fences, 'fence line');
  const index = isDrainageIndex(drainage) ? drainage : buildDrainageIndex(drainage);
  const crossings: Crossing[] = [];
  const runsAlong: CrossingsResult['runsAlong'] = [];
  for (const input of fences) {
    const fence = new MeasuredLine(input.coordinates);
    const { contacts, along } = scanFence(fence, index, settings);
    const meetings = classifyMeetings(contacts, fence, index);
    crossings.push(...flagCrossesTwice(meetings.map((m) => describe(m, input.id, fence, index, settings)), settings));
    runsAlong.push(...collectRunsAlong(along, input.id, index, settings));
  }
  return { crossings, runsAlong };
}

function isDrainageIndex(value: readonly DrainageLineInput[] | DrainageIndex): value is DrainageIndex {
  if (Array.isArray(value)) return false;
  if ((value as Partial<DrainageIndex> | null)?.kind !== 'drainage-index') {
    throw new TypeError('drainage must be an array of drainage lines or an index from buildDrainageIndex');
  }
  return true;
}

function describe(m: Meeting, fenceId: string | number, fence: MeasuredLine, index: DrainageIndex, settings: CrossingSettings): Crossing {
  const drainage = index.lines[m.line]!;
  const flowBearingDeg = drainage.line.bearingAtDeg(m.drainageChainageM, settings.flowWindowM);
  const fenceBearingDeg = fence.bearingAtDeg(m.fenceChainageM, settings.fenceWindowM);
  const crossingAngleDeg = acuteAngleDeg(fenceBearingDeg, flowBearingDeg);
  const { upstreamAreaStartM2: startM2, upstreamAreaEndM2: endM2 } = drainage;
  const fraction = Math.min(1, Math.max(0, m.drainageChainageM / drainage.line.lengthM));
  return {
    kind: m.kind,
    touchReason: m.touchReason,
    flags: [],
    pairedChainageM: null,
    fenceId,
    drainageId: drainage.id,
    position: m.position,
    fenceChainageM: m.fenceChainageM,
    fenceSegmentIndex: m.fenceSegment,
    drainageSegmentIndex: m.drainageSegment,
    drainageChainageM: m.drainageChainageM,
    upstreamAreaM2: startM2 !== null && endM2 !== null ? startM2 + (endM2 - startM2) * fraction : null,
    streamOrder: drainage.streamOrder,
    crossingAngleDeg,
    flowBearingDeg,
    fenceBearingDeg,
    angleClass: classifyCrossingAngle(crossingAngleDeg, settings),
  };
}

/** Flags each crossing that has another crossing of the same drainage line within the setting along the fence. */
function flagCrossesTwice(crossings: Crossing[], settings: CrossingSettings): Crossing[] {
  const flagged = [...crossings];
  // Per drainage line, the positions in the list of its crossings (the list is in chainage order).
  const byLine = new Map<string | number, number[]>();
  crossings.forEach((c, k) => {
    if (c.kind !== 'crossing') return;
    const positions = byLine.get(c.drainageId) ?? [];
    positions.push(k);
    byLine.set(c.drainageId, positions);
  });
  for (const positions of byLine.values()) {
    positions.forEach((k, n) => {
      const here = crossings[k]!.fenceChainageM;
      let pairedChainageM: number | null = null;
      for (const m of [positions[n - 1], positions[n + 1]]) {
        if (m === undefined) continue;
        const there = crossings[m]!.fenceChainageM;
        const gapM = Math.abs(there - here);
        if (gapM <= settings.crossesTwiceWithinM && (pairedChainageM === null || gapM < Math.abs(pairedChainageM - here))) {
          pairedChainageM = there;
        }
      }
      if (pairedChainageM !== null) flagged[k] = { ...crossings[k]!, flags: ['crosses-twice'], pairedChainageM };
    });
  }
  return flagged;
}
