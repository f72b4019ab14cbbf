/**
 * The input of a floodgate layout and its entry checks.
 */
import type { FloodgateSettings } from './floodgate-settings';
import { checkGroundProfile, checkNumber, type GroundPoint } from './ground-profile';
import type { FenceWires } from './wire-kinds';

/**
 * How the crossing is built.
 * - `continuous-floodgate`: the wires run unbroken through the floodgate between long flex runs;
 *   hung droppers let it swing up.
 * - `drop-down-section`: the fence ends on its own end assembly each side and a light sacrificial
 *   section between them is hooked and tied so it drops in a flood (NSW DPI Primefact 681, 2009).
 */
export type FloodgateStyle = 'continuous-floodgate' | 'drop-down-section';

/** The input of {@link layoutFloodgate}. Heights in metres on the profile's datum, distances in metres along the fence. */
export interface FloodgateInput {
  /** Ground along the fence through the crossing, sorted by chainage, nulls for gaps. */
  readonly profile: readonly GroundPoint[];
  /** Where the drainage line meets the fence, metres along the fence. */
  readonly crossingChainageM: number;
  /** Angle between fence and flow, degrees in (0, 180); 90 = square. */
  readonly crossingAngleDeg: number;
  /** Design flood level, metres (from the hydraulics or a flood mark). */
  readonly floodLevelM: number;
  /** The design flood's mean velocity through the section, m/s (from the hydraulics). */
  readonly meanVelocityMs: number;
  /** Energy slope of the flood, m/m (for the local-depth velocity). */
  readonly energySlope: number;
  /** Manning's n of the channel, s/m^(1/3). */
  readonly manningN: number;
  /** How the crossing is built. */
  readonly style: FloodgateStyle;
  /** Any subset of the settings; the rest take their defaults. */
  readonly settings?: Partial<FloodgateSettings>;
  /** The fence's wires, bottom to top. */
  readonly fence: FenceWires;
  /** Strained wire each side of the floodgate, metres, from the wire check; needed for the continuous style. */
  readonly flexRunEachSideM?: number;
}

/**
 * Checks a {@link FloodgateInput} at the entry (settings are checked by `resolveFloodgateSettings`).
 *
 * @throws RangeError naming the field and what was expected
 */
export function checkFloodgateInput(input: FloodgateInput): void {
  if (typeof input !== 'object' || input === null) throw new RangeError('layoutFloodgate needs an input object');
  checkGroundProfile(input.profile, 'profile');
  checkNumber(input.crossingChainageM, 'crossingChainageM', -1e9, 1e9, 'm');
  if (!(Number.isFinite(input.crossingAngleDeg) && input.crossingAngleDeg > 0 && input.crossingAngleDeg < 180)) {
    throw new RangeError(`crossingAngleDeg must be an angle between 0 and 180 degrees (90 = square), got ${input.crossingAngleDeg}`);
  }
  checkNumber(input.floodLevelM, 'floodLevelM', -1e5, 1e5, 'm');
  checkNumber(input.meanVelocityMs, 'meanVelocityMs', 0, 20, 'm/s');
  if (!(Number.isFinite(input.energySlope) && input.energySlope > 0 && input.energySlope <= 1)) {
    throw new RangeError(`energySlope must be a slope in m/m above 0 and at most 1, got ${input.energySlope}`);
  }
  if (!(Number.isFinite(input.manningN) && input.manningN > 0 && input.manningN <= 1)) {
    throw new RangeError(`manningN must be Manning's n above 0 and at most 1 (natural channels 0.025–0.15), got ${input.manningN}`);
  }
  if (input.style !== 'continuous-floodgate' && input.style !== 'drop-down-section') {
    throw new RangeError(`style must be 'continuous-floodgate' or 'drop-down-section', got ${String(input.style)}`);
  }
  checkFenceWires(input.fence);
  if (input.style === 'continuous-floodgate') {
    if (input.flexRunEachSideM === undefined) {
      throw new RangeError('flexRunEachSideM (metres of strained wire each side, from the wire check) is needed for a continuous floodgate');
    }
    checkNumber(input.flexRunEachSideM, 'flexRunEachSideM', 0, 10_000, 'm');
  }
}

/**
 * Checks a fence's wires: at least one, heights from 0 to 3 m rising bottom to top, each plain or barbed.
 *
 * @throws RangeError naming the wire
 */
export function checkFenceWires(fence: FenceWires): void {
  if (typeof fence !== 'object' || fence === null || !Array.isArray(fence.wireHeightsM) || !Array.isArray(fence.wireKinds)) {
    throw new RangeError('fence must be { wireHeightsM: number[], wireKinds: ("plain" | "barbed")[] }');
  }
  if (fence.wireHeightsM.length === 0) throw new RangeError('fence needs at least one wire');
  if (fence.wireKinds.length !== fence.wireHeightsM.length) {
    throw new RangeError(`fence has ${fence.wireHeightsM.length} wire heights but ${fence.wireKinds.length} wire kinds: give one kind per wire`);
  }
  fence.wireHeightsM.forEach((h, i) => {
    checkNumber(h, `fence.wireHeightsM[${i}]`, 0, 3, 'm above ground');
    if (i > 0 && h < fence.wireHeightsM[i - 1]!) throw new RangeError(`fence.wireHeightsM must go bottom to top: wire ${i} (${h} m) is below wire ${i - 1}`);
  });
  fence.wireKinds.forEach((k, i) => {
    if (k !== 'plain' && k !== 'barbed') throw new RangeError(`fence.wireKinds[${i}] must be 'plain' or 'barbed', got ${String(k)}`);
  });
}
