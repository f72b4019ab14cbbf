import type { DesignedCrossingView } from '../../../lib/schemas/crossing-view';

/**
 * What the crossing's profile chart draws, worked out from the stored design alone (no drawing
 * here, so it can be tested without a canvas). Positions are metres along the fence from the
 * crossing: negative towards the fence's start, positive towards its end. Heights are the
 * elevation model's, in metres.
 */

export type ProfileMarkKind = 'end-strainer' | 'post' | 'stayed-post' | 'breakaway-tie';

export type ProfileMark = {
  kind: ProfileMarkKind;
  /** Metres from the crossing. */
  xM: number;
  /** Ground height under the mark, metres; null where the ground is not known. */
  groundM: number | null;
  /** Floodgate post or end strainer (dark) rather than a line post (bark brown). */
  inFloodgate: boolean;
};

export type ProfileChartData = {
  /** Metres from the crossing, ascending: the profile's samples plus the points where water and wet zone meet the ground. */
  xM: number[];
  /** Ground height at each x; null in gaps of the elevation model. */
  groundM: (number | null)[];
  /** The design flood level where the ground lies below it (the water surface), else null. */
  floodM: (number | null)[];
  /** Flood level plus freeboard across the wet zone, else null. */
  designM: (number | null)[];
  xRangeM: [number, number];
  yRangeM: [number, number];
  floodLevelM: number;
  designLevelM: number;
  wetZoneM: [number, number];
  /** The floodgate's stretch, when the layout gives one. */
  floodgateM: [number, number] | null;
  marks: ProfileMark[];
  /** Water width along the fence at the design flood (first to last wet point), metres; 0 when only the freeboard reaches the ground. */
  floodWidthM: number;
  /** Design flood level above the lowest ground in the wet zone, metres. */
  floodDepthM: number;
  /** End strainers, metres from the crossing: [start side, end side]. */
  strainersM: [number, number];
};

type Known = { chainageM: number; elevationM: number };

/** Ground height at a chainage, linear between the two samples around it; null off the profile or beside a gap. */
export function groundAt(profile: readonly { chainageM: number; elevationM: number | null }[], chainageM: number): number | null {
  for (let i = 1; i < profile.length; i += 1) {
    const a = profile[i - 1]!;
    const b = profile[i]!;
    if (chainageM < a.chainageM || chainageM > b.chainageM) continue;
    if (a.elevationM === null || b.elevationM === null) return chainageM === a.chainageM ? a.elevationM : chainageM === b.chainageM ? b.elevationM : null;
    const t = b.chainageM === a.chainageM ? 0 : (chainageM - a.chainageM) / (b.chainageM - a.chainageM);
    return a.elevationM + t * (b.elevationM - a.elevationM);
  }
  return null;
}

/**
 * The chart's series and marks for one designed crossing, framed on the end strainers with a
 * margin either side. Null when fewer than two ground heights are known in that frame.
 *
 * @param design - the stored design (profile chainages in metres along the fence)
 * @param crossingChainageM - where the drainage line meets the fence, metres along the fence
 */
export function buildProfileChart(design: DesignedCrossingView, crossingChainageM: number): ProfileChartData | null {
  const { layout } = design;
  const profile = [...(design.profile ?? [])].sort((a, b) => a.chainageM - b.chainageM);
  const known = profile.filter((point): point is Known => point.elevationM !== null);
  if (known.length < 2) return null;

  const [startStrainer, endStrainer] = layout.endStrainers;
  const margin = Math.max(10, (endStrainer.chainageM - startStrainer.chainageM) * 0.15);
  const fromM = Math.max(known[0]!.chainageM, startStrainer.chainageM - margin);
  const toM = Math.min(known[known.length - 1]!.chainageM, endStrainer.chainageM + margin);
  const inFrame = profile.filter((point) => point.chainageM >= fromM && point.chainageM <= toM);
  if (inFrame.filter((point) => point.elevationM !== null).length < 2) return null;

  const { floodLevelM, designLevelM } = layout;
  const wet = { fromM: layout.wetZone.startChainageM, toM: layout.wetZone.endChainageM };
  const isWet = (chainageM: number) => chainageM >= wet.fromM - 1e-9 && chainageM <= wet.toM + 1e-9;

  // Extra points where the flood level and the wet zone's edges meet the ground, so the water
  // surface and the freeboard line end on the ground rather than at the nearest sample.
  const extra = new Set<number>([wet.fromM, wet.toM].filter((chainageM) => chainageM > fromM && chainageM < toM));
  for (let i = 1; i < inFrame.length; i += 1) {
    const a = inFrame[i - 1]!;
    const b = inFrame[i]!;
    if (a.elevationM === null || b.elevationM === null) continue;
    if (a.elevationM < floodLevelM !== b.elevationM < floodLevelM && a.elevationM !== b.elevationM) {
      const chainageM = a.chainageM + ((floodLevelM - a.elevationM) / (b.elevationM - a.elevationM)) * (b.chainageM - a.chainageM);
      if (isWet(chainageM)) extra.add(chainageM);
    }
  }
  const chainages = [...new Set([...inFrame.map((point) => point.chainageM), ...extra])].sort((a, b) => a - b);
  const groundM = chainages.map((chainageM) => groundAt(profile, chainageM));
  // Round off the float noise of the interpolated edges, so a point on the level counts as on it.
  const atOrBelow = (heightM: number | null, levelM: number) => heightM !== null && heightM <= levelM + 1e-6;
  const floodM = chainages.map((chainageM, i) => (isWet(chainageM) && atOrBelow(groundM[i]!, floodLevelM) ? floodLevelM : null));
  const designM = chainages.map((chainageM) => (isWet(chainageM) ? designLevelM : null));

  const wetX = chainages.filter((_, i) => floodM[i] !== null);
  const floodWidthM = wetX.length > 1 ? wetX[wetX.length - 1]! - wetX[0]! : 0;

  const rel = (chainageM: number) => chainageM - crossingChainageM;
  const groundUnder = (chainageM: number, givenM?: number | null) => givenM ?? groundAt(profile, chainageM);
  const marks: ProfileMark[] = [
    ...layout.endStrainers.map((strainer) => ({
      kind: 'end-strainer' as const,
      xM: rel(strainer.chainageM),
      groundM: groundUnder(strainer.chainageM, strainer.groundM),
      inFloodgate: true,
    })),
    ...layout.posts.map((post) => ({
      kind: post.braced ? ('stayed-post' as const) : ('post' as const),
      xM: rel(post.chainageM),
      groundM: groundUnder(post.chainageM, post.groundM),
      inFloodgate: post.role === 'floodgate',
    })),
    ...layout.breakawayTies.map((tie) => ({ kind: 'breakaway-tie' as const, xM: rel(tie.chainageM), groundM: groundUnder(tie.chainageM), inFloodgate: true })),
  ].filter((mark) => mark.xM >= rel(fromM) && mark.xM <= rel(toM));

  const heights = groundM.filter((heightM): heightM is number => heightM !== null);
  const lowM = Math.min(...heights);
  const highM = Math.max(designLevelM, ...heights);
  const padM = Math.max(0.2, (highM - lowM) * 0.12);
  const { startChainageM, endChainageM } = layout.floodgate;

  return {
    xM: chainages.map(rel),
    groundM,
    floodM,
    designM,
    xRangeM: [rel(fromM), rel(toM)],
    // More room above than below: the floodgate's bar and the tie's mark sit over the ground.
    yRangeM: [lowM - padM, highM + 2 * padM],
    floodLevelM,
    designLevelM,
    wetZoneM: [rel(wet.fromM), rel(wet.toM)],
    floodgateM: startChainageM !== undefined && endChainageM !== undefined ? [rel(startChainageM), rel(endChainageM)] : null,
    marks,
    floodWidthM,
    floodDepthM: layout.wetZone.maxDepthM,
    strainersM: [rel(startStrainer.chainageM), rel(endStrainer.chainageM)],
  };
}

const offsetFormat = new Intl.NumberFormat('en-AU', { maximumFractionDigits: 0, signDisplay: 'exceptZero' });

/** Metres from the crossing with its sign and a true minus, e.g. "−31 m", "+28 m", "0 m". */
export function formatOffset(offsetM: number, unit = ' m'): string {
  return `${offsetFormat.format(offsetM).replace('-', '\u2212')}${unit}`;
}

/** The chart's text alternative in one sentence: flood width and depth, floodgate, end strainers. */
export function describeProfileChart(data: ProfileChartData, fenceName: string): string {
  const flood =
    data.floodWidthM > 0
      ? `flood ${Math.round(data.floodWidthM)} m wide, ${data.floodDepthM.toFixed(1)} m deep`
      : `the flood itself does not reach the ground shown; with freeboard the wet zone is ${Math.round(data.wetZoneM[1] - data.wetZoneM[0])} m wide`;
  const floodgate = data.floodgateM ? `; floodgate ${Math.round(data.floodgateM[1] - data.floodgateM[0])} m` : '';
  const [start, end] = data.strainersM;
  return `Ground profile along ${fenceName} across the channel: ${flood}${floodgate}; end strainers at ${formatOffset(start)} and ${formatOffset(end)} from the crossing.`;
}
