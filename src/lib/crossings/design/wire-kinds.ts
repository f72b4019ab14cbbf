/**
 * Which wires of a fence must be plain through a floodgate.
 */

/** Kinds of fence wire. */
export type WireKind = 'plain' | 'barbed';

/** The wires of a fence, bottom to top. */
export interface FenceWires {
  /** Height of each wire above the ground at the posts, metres, bottom to top. */
  readonly wireHeightsM: readonly number[];
  /** Kind of each wire as specified for the fence, same order. */
  readonly wireKinds: readonly WireKind[];
}

/** One wire's requirement through the floodgate. */
export interface WireRequirement {
  /** Position in the fence's wire list, 0 = bottom. */
  readonly index: number;
  /** Height above ground at the posts, metres. */
  readonly heightM: number;
  /** Kind as specified for the fence. */
  readonly specifiedKind: WireKind;
  /** Kind to use through the floodgate. */
  readonly kind: WireKind;
  /** Its lowest height among the posts (ground + height), metres; null when no post's ground is known. */
  readonly lowestElevationM: number | null;
  /** Chainage of that lowest point, metres. */
  readonly lowestAtChainageM: number | null;
  /** The wire sits below flood level + freeboard somewhere, so it must be plain. */
  readonly mustBePlain: boolean;
  /** Why, in plain words. */
  readonly reason: string;
}

/**
 * Decides wire by wire which must be plain. A wire strained straight from post to post is lowest
 * at a post, at ground + its height there; where that is below flood level + freeboard at any
 * post the wire sits in the flow and must be plain, not barbed, so it sheds debris (rule of thumb
 * in DESIGN.md: common practice, no published source; also WA Water and Rivers Commission Water
 * Note WN19, 2000, details from memory). Other wires keep the kind specified.
 *
 * @param posts - the posts between the end strainers: chainage and ground (null if unknown), metres
 * @param fence - the fence's wires, already checked
 * @param levelM - flood level + freeboard, metres
 */
export function requiredWireKinds(
  posts: readonly { chainageM: number; groundM: number | null }[],
  fence: FenceWires,
  levelM: number,
): WireRequirement[] {
  const known = posts.filter((p): p is { chainageM: number; groundM: number } => p.groundM !== null);
  const lowest = known.reduce<{ chainageM: number; groundM: number } | null>((best, p) => (!best || p.groundM < best.groundM ? p : best), null);
  return fence.wireHeightsM.map((heightM, index): WireRequirement => {
    const specifiedKind = fence.wireKinds[index]!;
    const lowestElevationM = lowest ? lowest.groundM + heightM : null;
    const lowestAtChainageM = lowest ? lowest.chainageM : null;
    const mustBePlain = lowestElevationM !== null && lowestElevationM < levelM;
    const at = `${Number((lowestElevationM ?? 0).toFixed(2))} m at chainage ${Number((lowestAtChainageM ?? 0).toFixed(2))} m`;
    let reason: string;
    if (lowestElevationM === null) {
      reason = 'No post ground is known: check this wire against the flood level on site.';
    } else if (mustBePlain) {
      reason = `Plain wire: at its lowest (${at}) it sits below flood level + freeboard (${Number(levelM.toFixed(2))} m), in the flow; plain wire sheds debris (common practice).`;
    } else {
      reason = `Stays ${specifiedKind} as specified: at its lowest (${at}) it is above flood level + freeboard.`;
    }
    return { index, heightM, specifiedKind, kind: mustBePlain ? 'plain' : specifiedKind, lowestElevationM, lowestAtChainageM, mustBePlain, reason };
  });
}
