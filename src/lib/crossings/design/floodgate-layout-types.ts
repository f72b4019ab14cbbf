/**
 * The shape of a floodgate layout (see `layoutFloodgate`).
 */
import type { EndStrainer } from './end-strainer';
import type { FloodgateStyle } from './floodgate-input';
import type { FloodgatePost } from './floodgate-posts';
import type { FloodgateSettings } from './floodgate-settings';
import type { WetZone } from './wet-zone';
import type { WireRequirement } from './wire-kinds';

/** A stretch of fence, metres along it. */
export interface Stretch {
  readonly startChainageM: number;
  readonly endChainageM: number;
  readonly lengthM: number;
}

/** A breakaway tie and why it is there. */
export interface BreakawayTie {
  readonly chainageM: number;
  /** At the lowest floodgate post, or hooking the drop-down section to an end assembly. */
  readonly at: 'lowest-post' | 'end-assembly';
  readonly reason: string;
}

/** What the chosen style adds; both share the fields used to compare them. */
export interface StyleDetail {
  readonly style: FloodgateStyle;
  /** The fence's wires run unbroken through the floodgate (continuous) or end at its end strainers (drop-down). */
  readonly wiresRunThrough: boolean;
  /** Strained wire needed each side beyond the end strainers, metres (0 for a drop-down section). */
  readonly flexRunEachSideM: number;
  /** The rule of thumb's least flex run for this floodgate, metres (0 for a drop-down section). */
  readonly recommendedMinFlexRunM: number;
  /** The next strainers away from the crossing, at the end of each flex run (none for a drop-down section). */
  readonly flexRunStrainers: { side: 'start' | 'end'; chainageM: number; groundM: number | null }[];
  /** The light sacrificial section between the end assemblies (null for a continuous floodgate). */
  readonly sacrificialSection: Stretch | null;
  /** Stays on each end strainer: 2 where wires pass through, 1 on a terminating end assembly (judgement). */
  readonly staysPerEndStrainer: number;
  /** Length each wire runs for this crossing, metres: strainer to strainer, plus the flex runs when continuous. */
  readonly wireRunM: number;
  readonly reasons: string[];
}

/** A floodgate layout (see {@link layoutFloodgate}). Metres along the fence and on the profile's datum. */
export interface FloodgateLayout {
  readonly style: FloodgateStyle;
  readonly crossingChainageM: number;
  readonly crossingAngleDeg: number;
  readonly floodLevelM: number;
  /** Flood level + freeboard, metres. */
  readonly designLevelM: number;
  readonly wetZone: WetZone;
  /** The floodgate itself: the wet zone. */
  readonly floodgate: Stretch & { reason: string };
  readonly endStrainers: readonly [EndStrainer, EndStrainer];
  /** From end strainer to end strainer. */
  readonly span: Stretch;
  readonly posts: FloodgatePost[];
  readonly breakawayTies: BreakawayTie[];
  readonly wires: WireRequirement[];
  readonly styleDetail: StyleDetail;
  /** Strainer and floodgate posts: heavy, and how deep, with the reason. */
  readonly heavyPosts: { minSizeMm: number; minEmbedmentM: number; preferredEmbedmentM: number; reason: string };
  /** The wet zone reaches the end of the profile: the layout is provisional (see warnings). */
  readonly overtopsProfile: boolean;
  readonly warnings: string[];
  readonly cautions: readonly string[];
  readonly settings: FloodgateSettings;
}
