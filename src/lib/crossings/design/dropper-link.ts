/**
 * Open or closed hanger link of a hung dropper.
 */

/** The hanger link of a hung dropper and why. */
export interface DropperLink {
  /** `open`: open at the bottom; `closed`: closed. */
  readonly link: 'open' | 'closed';
  /** Ground below the straight line between the neighbouring posts, metres (positive = a low point). */
  readonly sagBelowChordM: number | null;
  /** Why, in plain words. */
  readonly reason: string;
}

/** Differences smaller than this (metres) are rounding, not a low point. */
const EPSILON_M = 1e-9;

/**
 * Chooses the hanger link of the hung dropper at a post. The wires are strained straight from
 * post to post at a set height above the ground at each, so where the ground at a post lies below
 * the straight line between its neighbours the wires pull the dropper upward: a low point, where
 * the link is open at the bottom. Elsewhere it is closed. (Rule of thumb in DESIGN.md: common
 * practice, no published source.) With a neighbour's ground unknown the link is closed, and the
 * reason says to check on site.
 *
 * @param prev - the previous post toward lower chainage: chainage and ground, metres
 * @param here - this post
 * @param next - the next post toward higher chainage
 */
export function chooseDropperLink(
  prev: { chainageM: number; groundM: number | null },
  here: { chainageM: number; groundM: number | null },
  next: { chainageM: number; groundM: number | null },
): DropperLink {
  if (prev.groundM === null || here.groundM === null || next.groundM === null) {
    return { link: 'closed', sagBelowChordM: null, reason: 'Closed link: the ground at this post or a neighbour is not on the profile; check on site whether it is a low point (open link there).' };
  }
  const span = next.chainageM - prev.chainageM;
  const t = span > 0 ? (here.chainageM - prev.chainageM) / span : 0.5;
  const chordM = prev.groundM + t * (next.groundM - prev.groundM);
  const sagM = chordM - here.groundM;
  if (sagM > EPSILON_M) {
    return {
      link: 'open',
      sagBelowChordM: sagM,
      reason: `Open link: the ground here is ${sagM.toFixed(2)} m below the straight line between the neighbouring posts, a low point where the wires pull the dropper upward (common practice).`,
    };
  }
  return { link: 'closed', sagBelowChordM: sagM, reason: 'Closed link: not a low point, the wires do not pull the dropper upward here (common practice).' };
}
