/**
 * The layout of a floodgate across one crossing: its extent, end strainers, posts, droppers,
 * breakaway ties and wires, each with its reason in plain words.
 */
import { FENCING_CAUTIONS } from './cautions';
import { placeEndStrainer, type EndStrainer } from './end-strainer';
import { checkFloodgateInput, type FloodgateInput } from './floodgate-input';
import type { BreakawayTie, FloodgateLayout, Stretch, StyleDetail } from './floodgate-layout-types';
import { layoutFloodgatePosts } from './floodgate-posts';
import { resolveFloodgateSettings } from './floodgate-settings';
import { groundAtM } from './ground-profile';
import { requiredWireKinds } from './wire-kinds';
import { findWetZone, type WetZone } from './wet-zone';

export type { BreakawayTie, FloodgateLayout, Stretch, StyleDetail } from './floodgate-layout-types';

const fmt = (x: number) => `${Number(x.toFixed(2))} m`;

/**
 * Lays out a floodgate across one crossing from the ground profile along the fence and the design
 * flood (rules of thumb from DESIGN.md, common practice with no published source, unless a step
 * names its source):
 * - the floodgate spans the wet zone, ground below flood level + freeboard ({@link findWetZone});
 * - an end strainer each side on dry ground, `strainerSetbackM` beyond the wet zone, moved further
 *   out past other low areas, or placed provisionally with a warning where the profile ends;
 * - continuous style: flex runs each side to the next strainers, wires unbroken through; drop-down
 *   style: the fence ends on each end assembly, a light sacrificial section hooked between them
 *   (NSW DPI Primefact 681, 2009), no flex run needed;
 * - posts at most `postSpacingM` apart with depth and local-depth velocity, stays past the
 *   thresholds, hung droppers with open links at low points, a breakaway tie at the lowest post;
 * - per wire, plain where it sits below flood level + freeboard at any post;
 * - heavy posts, embedment, and the usual cautions.
 *
 * @param input - see {@link FloodgateInput}; not modified
 * @returns the layout; when the flood overtops the profile it is still returned, flagged and warned
 * @throws RangeError on malformed input or settings, or when the crossing is not below flood level + freeboard
 */
export function layoutFloodgate(input: FloodgateInput): FloodgateLayout {
  checkFloodgateInput(input);
  const settings = resolveFloodgateSettings(input.settings);
  const { profile, crossingChainageM, style } = input;
  const wetZone = findWetZone(profile, crossingChainageM, input.floodLevelM, settings.freeboardM);
  const warnings: string[] = [];
  if (wetZone.overtopsProfile) {
    warnings.push('The wet zone reaches the end of the profile (or a gap in it): the fence section shown is too short to contain the flood, so the floodgate is longer than shown and this layout is provisional. Extend the profile.');
  }
  const sinAngle = Math.sin((input.crossingAngleDeg * Math.PI) / 180);
  if (sinAngle < Math.sin(Math.PI / 3)) {
    warnings.push(`The fence crosses the flow at ${input.crossingAngleDeg}°, making the floodgate ${(1 / sinAngle).toFixed(2)} times as long as a square crossing; cross closer to a right angle if the country allows (common practice).`);
  }
  const start = placeEndStrainer(profile, wetZone, 'start', settings.strainerSetbackM);
  const end = placeEndStrainer(profile, wetZone, 'end', settings.strainerSetbackM);
  for (const s of [start, end]) warnings.push(...s.warnings);
  const span = stretch(start.chainageM, end.chainageM);
  const posts = layoutFloodgatePosts(profile, {
    wetZone,
    startStrainerM: start.chainageM,
    endStrainerM: end.chainageM,
    crossingChainageM,
    floodLevelM: input.floodLevelM,
    meanVelocityMs: input.meanVelocityMs,
    energySlope: input.energySlope,
    manningN: input.manningN,
    settings,
  });
  const styleDetail = describeStyle(input, wetZone, start, end, span, warnings);
  const lowest = posts.find((p) => p.breakawayTie);
  const breakawayTies: BreakawayTie[] = lowest
    ? [{ chainageM: lowest.chainageM, at: 'lowest-post', reason: `Holds the floodgate down at its lowest post (ground ${fmt(lowest.groundM ?? 0)}) and lets go under flood load; re-tie it after the water drops (common practice).` }]
    : [];
  if (style === 'drop-down-section') {
    for (const s of [start, end]) {
      breakawayTies.push({ chainageM: s.chainageM, at: 'end-assembly', reason: 'Hooks the sacrificial section to this end assembly with a light tie, so the section drops when flood load or debris pulls on it (NSW DPI Primefact 681, 2009).' });
    }
  }
  return {
    style,
    crossingChainageM,
    crossingAngleDeg: input.crossingAngleDeg,
    floodLevelM: input.floodLevelM,
    designLevelM: wetZone.levelM,
    wetZone,
    floodgate: {
      ...stretch(wetZone.startChainageM, wetZone.endChainageM),
      reason:
        `The floodgate spans the wet zone, where the ground lies below the design flood level (${fmt(input.floodLevelM)}) plus a freeboard of ${fmt(settings.freeboardM)} (freeboard: common practice, no published source). ` +
        'Keep it light and able to lift, and set its posts on the upstream side of the wires (NSW DPI Primefact 681, 2009).',
    },
    endStrainers: [start, end],
    span,
    posts,
    breakawayTies,
    wires: requiredWireKinds(posts, input.fence, wetZone.levelM),
    styleDetail,
    heavyPosts: {
      minSizeMm: settings.heavyPostMinSizeMm,
      minEmbedmentM: settings.minEmbedmentM,
      preferredEmbedmentM: settings.preferredEmbedmentM,
      reason: `Strainer and floodgate posts are heavy (about ${settings.heavyPostMinSizeMm} mm steel or more) and go ${settings.minEmbedmentM} m into the ground at least, ${settings.preferredEmbedmentM} m preferred: depth matters more than diameter for what a strainer holds (common practice).`,
    },
    overtopsProfile: wetZone.overtopsProfile,
    warnings,
    cautions: FENCING_CAUTIONS,
    settings,
  };
}

function stretch(startChainageM: number, endChainageM: number): Stretch {
  return { startChainageM, endChainageM, lengthM: endChainageM - startChainageM };
}

/** The style's own parts, for drawing and for comparing the two styles. */
function describeStyle(input: FloodgateInput, wetZone: WetZone, start: EndStrainer, end: EndStrainer, span: Stretch, warnings: string[]): StyleDetail {
  if (input.style === 'drop-down-section') {
    return {
      style: input.style,
      wiresRunThrough: false,
      flexRunEachSideM: 0,
      recommendedMinFlexRunM: 0,
      flexRunStrainers: [],
      sacrificialSection: span,
      staysPerEndStrainer: 1,
      wireRunM: span.lengthM,
      reasons: [
        'Drop-down section: the fence is terminated on its own end assembly each side, so only the section is lost in a flood (NSW DPI Primefact 681, 2009).',
        'A light sacrificial section spans between the end assemblies, hooked and tied so it drops under flood load; no long flex run is needed.',
      ],
    };
  }
  const flexM = input.flexRunEachSideM ?? 0;
  // "About 20 m of floodgate wants at least about 50 m each side, longer proportionally more" (DESIGN.md, common practice).
  const recommendedMinFlexRunM = Math.max(50, 2.5 * wetZone.lengthM);
  if (flexM < recommendedMinFlexRunM) {
    warnings.push(`The flex run of ${fmt(flexM)} each side is shorter than the rule of thumb's ${fmt(recommendedMinFlexRunM)} for a ${fmt(wetZone.lengthM)} floodgate (at least about 50 m for 20 m, proportionally more for longer; common practice): the floodgate has less room to lift.`);
  }
  const at = (chainageM: number, side: 'start' | 'end') => ({ side, chainageM, groundM: groundAtM(input.profile, chainageM) });
  return {
    style: input.style,
    wiresRunThrough: true,
    flexRunEachSideM: flexM,
    recommendedMinFlexRunM,
    flexRunStrainers: [at(start.chainageM - flexM, 'start'), at(end.chainageM + flexM, 'end')],
    sacrificialSection: null,
    staysPerEndStrainer: 2,
    wireRunM: span.lengthM + 2 * flexM,
    reasons: [
      'Continuous floodgate: the wires run unbroken through the floodgate and its end strainers, and hung droppers let it swing up over the flow (common practice).',
      `Flex runs of ${fmt(flexM)} of strained wire each side, to the next strainers at ${fmt(start.chainageM - flexM)} and ${fmt(end.chainageM + flexM)}, give the floodgate room to lift.`,
    ],
  };
}
