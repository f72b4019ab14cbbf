/**
 * The channel's cross-section at a crossing, taken from the ground profile along the fence.
 */
import { checkGroundProfile, checkNumber, groundAtM, type GroundPoint } from './ground-profile';
import { knownStretch } from './known-stretch';

/** A point of the section: its station across the channel, its chainage on the fence, its ground height. */
export interface SectionPoint {
  /** Distance across the channel from the crossing, perpendicular to the flow, in metres. */
  readonly stationM: number;
  /** Distance along the fence line, in metres. */
  readonly chainageM: number;
  /** Ground height in metres. */
  readonly elevationM: number;
}

/** Options of {@link channelCrossSection}. */
export interface CrossSectionOptions {
  /** How far along the fence to take the section each side of the crossing, in metres (> 0). */
  readonly halfWidthM: number;
  /** How far along the fence from the crossing to look for the bed, in metres; default min(20, halfWidthM). */
  readonly bedSearchM?: number;
  /** A bank is where the ground has climbed to within this fraction of the relief below its side's top; default 0.1. */
  readonly bankToleranceFraction?: number;
  /** Shallower than this (metres, bed to the lower side's top) is no channel; default 0.1. */
  readonly minChannelDepthM?: number;
}

/** A channel cross-section, in the form the hydraulics take (`stationsM`, `elevationsM`). */
export interface ChannelCrossSection {
  /** Stations across the channel in metres, increasing; 0 at the crossing. */
  readonly stationsM: number[];
  /** Ground heights at the stations, in metres. */
  readonly elevationsM: number[];
  /** Chainages along the fence of the stations, in metres. */
  readonly chainagesM: number[];
  /** sin(crossing angle): stations are (chainage − crossing chainage) × this. */
  readonly stationScale: number;
  /** The lowest point within the bed search distance of the crossing. */
  readonly bed: SectionPoint;
  /** Bank on the low-chainage side, then on the high-chainage side. */
  readonly banks: readonly [SectionPoint, SectionPoint];
  /** The stations of the two banks, for splitting main channel from overbanks. */
  readonly bankStationsM: readonly [number, number];
  /** Lower side's top (highest ground on that side within the half-width) above the bed, in metres. */
  readonly channelDepthM: number;
  /** Plain-words notes: the section cut short by a gap or the profile's end, a very oblique crossing. */
  readonly warnings: string[];
}

/** Thrown when the profile shows no channel at the crossing (flat, or sloping one way only). */
export class NoChannelError extends RangeError {
  override readonly name = 'NoChannelError';
}

/**
 * Cuts the channel's cross-section perpendicular to the flow from the ground profile along the
 * fence. A fence crossing at angle θ to the flow is 1/sin θ longer across the channel than the
 * channel is wide, so station = (chainage − crossing chainage) × sin θ (plane geometry).
 *
 * The section takes the known ground within `halfWidthM` of the crossing along the fence (ends
 * interpolated), stopping early at a gap. The bed is its lowest point within `bedSearchM` of the
 * crossing (nearest the crossing on a tie). Bank rule (our own, simple and stated): on each side,
 * the side's top is its highest ground within the section; where the ground stands well above
 * the straight line from the bed to that top (a quarter of the relief or more), the bank is the
 * break of slope farthest above that line — the top of a trapezoid's side slope even when the
 * plain beyond keeps rising gently; otherwise, walking out from the bed, the bank is the first
 * sample whose ground has climbed to within `bankToleranceFraction` of the relief below the top.
 *
 * @param profile - ground along the fence, sorted by chainage, nulls for gaps; not modified
 * @param crossingChainageM - where the drainage line meets the fence, metres along the fence
 * @param crossingAngleDeg - angle between fence and flow, degrees in (0, 180); 90 = square
 * @returns stations, heights, bed, banks and channel depth
 * @throws RangeError on malformed input or settings; {@link NoChannelError} when the lower side
 *   rises less than `minChannelDepthM` above the bed (a flat profile, or ground sloping one way)
 */
export function channelCrossSection(
  profile: readonly GroundPoint[],
  crossingChainageM: number,
  crossingAngleDeg: number,
  options: CrossSectionOptions,
): ChannelCrossSection {
  checkGroundProfile(profile);
  checkNumber(crossingChainageM, 'crossingChainageM', -1e9, 1e9, 'm');
  if (!(Number.isFinite(crossingAngleDeg) && crossingAngleDeg > 0 && crossingAngleDeg < 180)) {
    throw new RangeError(`crossingAngleDeg must be an angle between 0 and 180 degrees (90 = square), got ${crossingAngleDeg}`);
  }
  if (typeof options !== 'object' || options === null) throw new RangeError('options must be { halfWidthM, … }');
  const halfWidthM = checkNumber(options.halfWidthM, 'halfWidthM', Number.MIN_VALUE, 1e5, 'm');
  const bedSearchM = checkNumber(options.bedSearchM ?? Math.min(20, halfWidthM), 'bedSearchM', 0, halfWidthM, 'm');
  const tolerance = checkNumber(options.bankToleranceFraction ?? 0.1, 'bankToleranceFraction', 0, 0.99, '');
  const minDepthM = checkNumber(options.minChannelDepthM ?? 0.1, 'minChannelDepthM', 0, 100, 'm');
  if (groundAtM(profile, crossingChainageM) === null) {
    throw new RangeError(`no ground height is known at the crossing (chainage ${crossingChainageM} m): it is off the profile or in a gap`);
  }

  const warnings: string[] = [];
  const stationScale = Math.sin((crossingAngleDeg * Math.PI) / 180);
  const fromM = crossingChainageM - halfWidthM;
  const toM = crossingChainageM + halfWidthM;
  const points = knownStretch(profile, crossingChainageM, fromM, toM, warnings).map((p) => ({
    stationM: (p.chainageM - crossingChainageM) * stationScale,
    chainageM: p.chainageM,
    elevationM: p.elevationM,
  }));
  if (stationScale < Math.sin(Math.PI / 3)) {
    warnings.push(`The fence crosses the flow at ${crossingAngleDeg}°: it is ${(1 / stationScale).toFixed(2)} times longer across the channel than square; cross closer to a right angle if the country allows (common practice).`);
  }

  let bedIndex = -1;
  points.forEach((p, i) => {
    const offM = Math.abs(p.chainageM - crossingChainageM);
    if (offM > bedSearchM) return;
    const bed = points[bedIndex];
    if (!bed || p.elevationM < bed.elevationM || (p.elevationM === bed.elevationM && offM < Math.abs(bed.chainageM - crossingChainageM))) bedIndex = i;
  });
  const bed = points[bedIndex]!;
  const startBank = findBank(points, bedIndex, -1, tolerance);
  const endBank = findBank(points, bedIndex, 1, tolerance);
  const channelDepthM = Math.min(startBank.topM, endBank.topM) - bed.elevationM;
  if (!(channelDepthM >= minDepthM)) {
    throw new NoChannelError(
      `no channel at the crossing (chainage ${crossingChainageM} m): within ${halfWidthM} m along the fence the ground rises only ` +
        `${Math.max(0, channelDepthM).toFixed(3)} m above its lowest point on one side (at least ${minDepthM} m needed). ` +
        'A flat or one-way sloping profile has no channel to lay a floodgate across: check where the drainage line meets the fence, or widen the half-width.',
    );
  }
  return {
    stationsM: points.map((p) => p.stationM),
    elevationsM: points.map((p) => p.elevationM),
    chainagesM: points.map((p) => p.chainageM),
    stationScale,
    bed,
    banks: [startBank.point, endBank.point],
    bankStationsM: [startBank.point.stationM, endBank.point.stationM],
    channelDepthM,
    warnings,
  };
}

/**
 * Walks out from the bed on one side to the bank (see {@link channelCrossSection}). Where the side
 * has a clear top of bank — ground standing well above the straight line from the bed to the
 * side's top (at least a quarter of the relief) — the bank is that break of slope, the point
 * farthest above the line; otherwise (a V, or an even slope) the tolerance rule applies.
 */
function findBank(points: readonly SectionPoint[], bedIndex: number, dir: 1 | -1, tolerance: number): { point: SectionPoint; topM: number } {
  const bed = points[bedIndex]!;
  const bedM = bed.elevationM;
  let topM = bedM;
  let topIndex = bedIndex;
  for (let i = bedIndex; i >= 0 && i < points.length; i += dir) {
    if (points[i]!.elevationM > topM) {
      topM = points[i]!.elevationM;
      topIndex = i;
    }
  }
  const top = points[topIndex]!;
  let kneeIndex = -1;
  let kneeHeightM = 0;
  for (let i = bedIndex + dir; i !== topIndex && i >= 0 && i < points.length; i += dir) {
    const p = points[i]!;
    const chordM = bedM + ((topM - bedM) * (p.stationM - bed.stationM)) / (top.stationM - bed.stationM);
    if (p.elevationM - chordM > kneeHeightM) {
      kneeHeightM = p.elevationM - chordM;
      kneeIndex = i;
    }
  }
  if (kneeIndex >= 0 && kneeHeightM >= 0.25 * (topM - bedM)) return { point: points[kneeIndex]!, topM };
  const thresholdM = topM - tolerance * (topM - bedM);
  for (let i = bedIndex + dir; i >= 0 && i < points.length; i += dir) {
    if (points[i]!.elevationM >= thresholdM) return { point: points[i]!, topM };
  }
  return { point: points[bedIndex]!, topM };
}
