/**
 * The posts between a floodgate's end strainers: where they stand, how deep and fast the flood
 * is at each, which are stayed, and how their droppers hang.
 */
import { chooseDropperLink, type DropperLink } from './dropper-link';
import type { FloodgateSettings } from './floodgate-settings';
import { groundAtM, type GroundPoint } from './ground-profile';
import { localVelocityMs } from './local-velocity';
import type { WetZone } from './wet-zone';

/** One post between the end strainers. */
export interface FloodgatePost {
  /** Chainage along the fence, metres. */
  readonly chainageM: number;
  /** Ground height, metres, or null off the profile. */
  readonly groundM: number | null;
  /** `floodgate`: in the wet zone (its edges included); `line`: an ordinary post between the wet zone and an end strainer. */
  readonly role: 'floodgate' | 'line';
  /** Design flood level minus ground, metres (0 where the ground is above the flood or unknown). */
  readonly floodDepthM: number;
  /** Approximate depth-averaged velocity from the local depth, m/s (see `localVelocityMs`). */
  readonly velocityMs: number;
  /** The local-depth velocity was capped at a multiple of the mean velocity. */
  readonly velocityCapped: boolean;
  /** A heavy post (strainer weight) set to the preferred embedment. */
  readonly heavy: boolean;
  /** Carries a stay. */
  readonly braced: boolean;
  /** The hung dropper at this post and its link; null for an ordinary post on dry ground. */
  readonly hungDropper: DropperLink | null;
  /** Holds the floodgate's breakaway tie (the lowest floodgate post). */
  readonly breakawayTie: boolean;
  /** Why the post is as it is, in plain words. */
  readonly reasons: string[];
}

/** What {@link layoutFloodgatePosts} needs beyond the profile. */
export interface PostLayoutInput {
  readonly wetZone: WetZone;
  readonly startStrainerM: number;
  readonly endStrainerM: number;
  readonly crossingChainageM: number;
  readonly floodLevelM: number;
  readonly meanVelocityMs: number;
  readonly energySlope: number;
  readonly manningN: number;
  readonly settings: FloodgateSettings;
}

const fmt = (x: number) => Number(x.toFixed(2)).toString();

/**
 * Lays the posts from one end strainer to the other. Across the wet zone, edges included, posts
 * are evenly spaced at most `postSpacingM` apart with at least one between the edges (to carry the
 * breakaway tie); between the wet zone and each end strainer, ordinary line posts at most
 * `postSpacingM` apart. Each gets its flood depth and local-depth velocity; a stay where either
 * exceeds its threshold; a hung dropper (open or closed link) in the wet zone and wherever the
 * ground is below flood level + freeboard; and the lowest floodgate post gets the breakaway tie.
 * Internal to the floodgate layout: the inputs are already checked.
 */
export function layoutFloodgatePosts(profile: readonly GroundPoint[], input: PostLayoutInput): FloodgatePost[] {
  const { wetZone, settings } = input;
  const spacing = settings.postSpacingM;
  const zoneIntervals = wetZone.lengthM > 0 ? Math.max(2, Math.ceil(wetZone.lengthM / spacing)) : 0;
  const zone = evenly(wetZone.startChainageM, wetZone.endChainageM, zoneIntervals, true);
  const before = evenly(input.startStrainerM, wetZone.startChainageM, Math.ceil((wetZone.startChainageM - input.startStrainerM) / spacing), false);
  const after = evenly(wetZone.endChainageM, input.endStrainerM, Math.ceil((input.endStrainerM - wetZone.endChainageM) / spacing), false);
  const capMs = settings.velocityCapFactor * input.meanVelocityMs;

  const drafts = [...before.map((c) => [c, 'line'] as const), ...zone.map((c) => [c, 'floodgate'] as const), ...after.map((c) => [c, 'line'] as const)].map(
    ([chainageM, role]) => {
      const groundM = groundAtM(profile, chainageM);
      const floodDepthM = groundM === null ? 0 : Math.max(0, input.floodLevelM - groundM);
      const v = localVelocityMs(floodDepthM, input.manningN, input.energySlope, capMs);
      return { chainageM, groundM, role, floodDepthM, velocityMs: v.velocityMs, velocityCapped: v.capped };
    },
  );
  const lowest = drafts.reduce<(typeof drafts)[number] | null>((best, p) => {
    if (p.role !== 'floodgate' || p.groundM === null) return best;
    if (!best || best.groundM === null || p.groundM < best.groundM) return p;
    const nearer = Math.abs(p.chainageM - input.crossingChainageM) < Math.abs(best.chainageM - input.crossingChainageM);
    return p.groundM === best.groundM && nearer ? p : best;
  }, null);
  const chain = [{ chainageM: input.startStrainerM, groundM: groundAtM(profile, input.startStrainerM) }, ...drafts, { chainageM: input.endStrainerM, groundM: groundAtM(profile, input.endStrainerM) }];

  return drafts.map((p, i): FloodgatePost => {
    const reasons: string[] = [];
    const wet = p.groundM !== null && p.groundM < wetZone.levelM;
    const inGate = p.role === 'floodgate';
    if (p.groundM === null) reasons.push('The ground here is not on the profile: check the post on site.');
    if (inGate) {
      reasons.push(`Floodgate post: heavy (about ${settings.heavyPostMinSizeMm} mm steel or more), ${settings.minEmbedmentM} m in the ground at least, ${settings.preferredEmbedmentM} m preferred (common practice).`);
    } else if (wet) {
      reasons.push('Stands in another low area between the wet zone and the end strainer: hang its dropper like a floodgate post.');
    } else {
      reasons.push('Ordinary line post on dry ground between the wet zone and the end strainer.');
    }
    if (p.floodDepthM > 0) {
      reasons.push(
        `Flood depth ${fmt(p.floodDepthM)} m; velocity about ${fmt(p.velocityMs)} m/s from the local depth ` +
          `(approximation: v = (1/n) d^(2/3) S^(1/2)${p.velocityCapped ? `, capped at ${settings.velocityCapFactor} × the mean velocity` : ''}).`,
      );
    }
    const deep = p.floodDepthM > settings.braceDepthM;
    const fast = p.velocityMs > settings.braceVelocityMs;
    const braced = deep || fast;
    if (braced) {
      const why = [deep ? `deeper than ${settings.braceDepthM} m` : '', fast ? `faster than ${settings.braceVelocityMs} m/s` : ''].filter(Boolean).join(' and ');
      reasons.push(`Stayed: the flow here is ${why}; set the stay to take the push of the flow without fouling the floodgate as it swings (common practice and judgement).`);
    } else if (p.groundM !== null && p.floodDepthM === 0 && (inGate || wet)) {
      reasons.push('No stay: the ground here is above the flood level; posts on low rises between channels need none (common practice).');
    } else if (p.floodDepthM > 0) {
      reasons.push(`No stay: the flow here is no deeper than ${settings.braceDepthM} m and no faster than ${settings.braceVelocityMs} m/s.`);
    }
    const hungDropper = inGate || wet ? chooseDropperLink(chain[i]!, chain[i + 1]!, chain[i + 2]!) : null;
    if (hungDropper) reasons.push(`Hung dropper from the top of the post so the fence can swing up. ${hungDropper.reason}`);
    const breakawayTie = p === lowest;
    if (breakawayTie) reasons.push('Breakaway tie: the lowest floodgate post; a light tie holds the floodgate down and lets go under flood load. Re-tie it after the water drops (common practice).');
    return { ...p, heavy: inGate || wet, braced, hungDropper, breakawayTie, reasons };
  });
}

/** `intervals` equal steps from a to b: the points between, and the ends too when `withEnds`. */
function evenly(a: number, b: number, intervals: number, withEnds: boolean): number[] {
  if (!(intervals > 0)) return withEnds ? [a] : [];
  const out: number[] = [];
  for (let k = withEnds ? 0 : 1; k <= (withEnds ? intervals : intervals - 1); k++) out.push(k === intervals ? b : a + ((b - a) * k) / intervals);
  return out;
}
