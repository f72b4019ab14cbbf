/**
 * Where a floodgate's end strainer stands: on dry ground, a set-back beyond the wet zone.
 */
import { groundAtM, walkToLevel, type GroundPoint } from './ground-profile';
import type { WetZone } from './wet-zone';

/** One end strainer of a floodgate. */
export interface EndStrainer {
  /** `start`: on the low-chainage side of the crossing; `end`: on the high-chainage side. */
  readonly side: 'start' | 'end';
  /** Chainage along the fence, metres. */
  readonly chainageM: number;
  /** Ground height there, metres, or null when the profile does not reach it. */
  readonly groundM: number | null;
  /** Distance from the wet zone's edge, metres. */
  readonly setbackFromWetZoneM: number;
  /** The ground was checked at or above flood level + freeboard from the set-back's start to the strainer. */
  readonly onDryGround: boolean;
  /** Why it stands there, in plain words. */
  readonly reasons: string[];
  /** What could not be checked, in plain words; empty when `onDryGround`. */
  readonly warnings: string[];
}

const fmt = (m: number) => `${Number(m.toFixed(2))} m`;

/**
 * Places the end strainer on one side of the wet zone. It starts `setbackM` beyond the zone's
 * edge (rule of thumb: roughly 15–20 m, common practice, no published source). If the ground
 * dips below flood level + freeboard anywhere between the edge and that place (another low
 * area), the set-back is measured again from the far edge of that low area, and so on. Where the
 * profile ends or has a gap before the strainer's place is proven dry, the strainer is placed
 * provisionally and a warning says what to check on site.
 *
 * Internal to the floodgate layout: the inputs are already checked.
 *
 * @param profile - ground along the fence; not modified
 * @param wetZone - the crossing's wet zone (its `levelM` is flood level + freeboard)
 * @param side - which side of the crossing
 * @param setbackM - set-back beyond the wet zone, metres (> 0)
 */
export function placeEndStrainer(
  profile: readonly GroundPoint[],
  wetZone: WetZone,
  side: 'start' | 'end',
  setbackM: number,
): EndStrainer {
  const dir = side === 'start' ? -1 : 1;
  const zoneEdgeM = side === 'start' ? wetZone.startChainageM : wetZone.endChainageM;
  const edgeKind = side === 'start' ? wetZone.startEdge : wetZone.endEdge;
  const level = wetZone.levelM;
  const reasons = [
    `End strainer on dry ground at least ${fmt(setbackM)} beyond the wet zone's edge, so it stands out of the flow (rule of thumb: roughly 15–20 m; common practice, no published source).`,
  ];
  const warnings: string[] = [];
  const result = (chainageM: number, onDryGround: boolean): EndStrainer => {
    const groundM = groundAtM(profile, chainageM);
    if (onDryGround && groundM !== null) {
      reasons.push(`Ground there is ${fmt(groundM)}, at or above flood level + freeboard (${fmt(level)}).`);
    }
    return { side, chainageM, groundM, setbackFromWetZoneM: Math.abs(chainageM - zoneEdgeM), onDryGround, reasons, warnings };
  };

  if (edgeKind !== 'ground') {
    const chainageM = zoneEdgeM + dir * setbackM;
    warnings.push(
      `The wet zone runs to the ${edgeKind === 'gap' ? 'gap' : 'end'} of the profile at ${fmt(zoneEdgeM)} on the ${side} side, so the flood's edge and dry ground for the strainer are unknown there. ` +
        `Placed provisionally at ${fmt(chainageM)}: extend the profile, or check on site that the ground there stands above ${fmt(level)}.`,
    );
    return result(chainageM, false);
  }

  let fromM = zoneEdgeM;
  for (let guard = 0; guard <= profile.length + 1; guard++) {
    const targetM = fromM + dir * setbackM;
    const toDry = walkToLevel(profile, fromM, targetM, level, 'fall');
    if (toDry.stop === 'reached') return result(targetM, true);
    if (toDry.stop !== 'level') {
      warnings.push(
        `The profile ${toDry.stop === 'gap' ? 'has a gap' : 'ends'} at ${fmt(toDry.chainageM)}, short of the strainer's place at ${fmt(targetM)}: ` +
          `check on site that the ground from there to the strainer stands above ${fmt(level)}.`,
      );
      return result(targetM, false);
    }
    const lowArea = walkToLevel(profile, toDry.chainageM, dir * Infinity, level, 'rise');
    if (lowArea.stop !== 'level') {
      // The ground never rises clear again on this side: rather than carry the floodgate across
      // all of it, the strainer keeps its set-back place and the warning says why it is not dry.
      warnings.push(
        `Another low area starts at ${fmt(toDry.chainageM)} and runs to the ${lowArea.stop === 'gap' ? 'gap' : 'end'} of the profile at ${fmt(lowArea.chainageM)}, all below flood level + freeboard: ` +
          `the strainer is placed provisionally at ${fmt(targetM)}, in ground the flood may reach. Check the ground on site, or consider moving the fence line.`,
      );
      return result(targetM, false);
    }
    reasons.push(
      `The ground from ${fmt(Math.min(toDry.chainageM, lowArea.chainageM))} to ${fmt(Math.max(toDry.chainageM, lowArea.chainageM))} (lowest ${fmt(lowArea.lowestM)}) also lies below flood level + freeboard, ` +
        `so the strainer was moved out to stand ${fmt(setbackM)} beyond that low area too.`,
    );
    fromM = lowArea.chainageM;
  }
  throw new Error('end strainer placement did not settle: the profile is malformed');
}
