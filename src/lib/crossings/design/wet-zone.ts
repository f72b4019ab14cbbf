/**
 * The wet zone: the stretch of fence around a crossing that the design flood (plus freeboard) covers.
 */
import { checkGroundProfile, checkNumber, groundAtM, walkToLevel, type GroundPoint, type LevelWalk } from './ground-profile';

/** Why a wet zone's edge is where it is. */
export type WetZoneEdge = 'ground' | 'gap' | 'profile-end';

/** The wet zone of one crossing (see {@link findWetZone}). */
export interface WetZone {
  /** Chainage of the low-chainage edge, in metres. */
  readonly startChainageM: number;
  /** Chainage of the high-chainage edge, in metres. */
  readonly endChainageM: number;
  /** Length along the fence, in metres. */
  readonly lengthM: number;
  /** Design flood level minus the lowest ground in the zone, in metres (0 if the flood only reaches it with the freeboard). */
  readonly maxDepthM: number;
  /** Lowest ground in the zone, in metres. */
  readonly lowestGroundM: number;
  /** Chainage of that lowest ground, in metres. */
  readonly lowestAtChainageM: number;
  /** The level the zone is cut at: flood level + freeboard, in metres. */
  readonly levelM: number;
  /** What stopped each edge: the ground rising to the level, a gap in the profile, or its end. */
  readonly startEdge: WetZoneEdge;
  /** See `startEdge`. */
  readonly endEdge: WetZoneEdge;
  /**
   * The wet zone reaches the end of the known profile (its end or a gap) on at least one side:
   * the fence section is too short to contain the flood, and the zone is longer than shown.
   */
  readonly overtopsProfile: boolean;
}

/**
 * Finds the contiguous stretch of fence around the crossing where the ground lies below the
 * design flood level plus freeboard. Each edge is where the ground first rises to that level,
 * interpolated linearly between profile samples; where the known ground runs out first (a gap or
 * the profile's end) the edge is the last known sample and `overtopsProfile` is set.
 *
 * @param profile - ground along the fence, sorted by chainage, nulls for gaps; not modified
 * @param crossingChainageM - where the drainage line meets the fence, metres along the fence
 * @param floodLevelM - design flood level, metres on the profile's datum
 * @param freeboardM - margin above the flood level, metres (≥ 0)
 * @returns the wet zone, its edges and deepest point
 * @throws RangeError on malformed input, when no ground is known at the crossing, or when the
 *   ground at the crossing stands at or above flood level + freeboard (no wet zone: check the
 *   flood level's datum, or that the crossing chainage is in the channel)
 */
export function findWetZone(
  profile: readonly GroundPoint[],
  crossingChainageM: number,
  floodLevelM: number,
  freeboardM: number,
): WetZone {
  checkGroundProfile(profile);
  checkNumber(crossingChainageM, 'crossingChainageM', -1e9, 1e9, 'm');
  checkNumber(floodLevelM, 'floodLevelM', -1e5, 1e5, 'm');
  checkNumber(freeboardM, 'freeboardM', 0, 10, 'm');
  const levelM = floodLevelM + freeboardM;
  const crossingGroundM = groundAtM(profile, crossingChainageM);
  if (crossingGroundM === null) {
    throw new RangeError(`no ground height is known at the crossing (chainage ${crossingChainageM} m): it is off the profile or in a gap`);
  }
  if (crossingGroundM >= levelM) {
    throw new RangeError(
      `no wet zone: the ground at the crossing (${crossingGroundM.toFixed(3)} m at chainage ${crossingChainageM} m) is not below ` +
        `flood level + freeboard (${levelM.toFixed(3)} m); check the flood level's datum and that the crossing chainage is in the channel`,
    );
  }
  const start = walkToLevel(profile, crossingChainageM, -Infinity, levelM, 'rise');
  const end = walkToLevel(profile, crossingChainageM, Infinity, levelM, 'rise');
  const lowest = start.lowestM <= end.lowestM ? start : end;
  return {
    startChainageM: start.chainageM,
    endChainageM: end.chainageM,
    lengthM: end.chainageM - start.chainageM,
    maxDepthM: Math.max(0, floodLevelM - lowest.lowestM),
    lowestGroundM: lowest.lowestM,
    lowestAtChainageM: lowest.lowestAtM,
    levelM,
    startEdge: edgeOf(start),
    endEdge: edgeOf(end),
    overtopsProfile: start.stop !== 'level' || end.stop !== 'level',
  };
}

function edgeOf(walk: LevelWalk): WetZoneEdge {
  return walk.stop === 'level' ? 'ground' : walk.stop === 'gap' ? 'gap' : 'profile-end';
}
