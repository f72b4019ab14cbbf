/**
 * Flood loads on a floodgate: drag on its bare wires and on the debris mat caught against it.
 */
import { checkNumber } from '../wire/check-number';
import { dragForceN } from './drag';

/** The flood at the floodgate and the wires in it. SI. */
export interface FloodgateLoadsInput {
  /** Width of water across the floodgate, metres, > 0. */
  readonly wettedWidthM: number;
  /** Mean water depth at the floodgate, metres, > 0. */
  readonly meanDepthM: number;
  /** Mean flow speed, m/s, ≥ 0. */
  readonly velocityMs: number;
  /** Share of the wetted width × depth blocked by debris, 0 to 1 (default 0.5, an assumption). */
  readonly blockageFraction?: number;
  /** C_d of the debris mat, > 0 (default 2.0, flat plate / wide obstruction, FEMA P-55). */
  readonly debrisDragCoefficient?: number;
  /** Wires in the water, a whole number ≥ 0. */
  readonly wireCount: number;
  /** Diameter of one wire, metres (2.5 mm is 0.0025), > 0 and at most 0.02. */
  readonly wireDiameterM: number;
  /** C_d of a bare wire, > 0 (default 1.2, a round cylinder). */
  readonly wireDragCoefficient?: number;
  /** Water density, kg/m³ (default 1000). */
  readonly densityKgM3?: number;
}

/** Flood loads on a floodgate. Forces in kN except the per-metre wire drag. */
export interface FloodgateLoads {
  /** Drag on one bare wire per metre of wire, N/m. */
  readonly bareWireDragNPerM: number;
  /** Drag on all bare wires over the whole wetted width, kN. */
  readonly bareWiresKn: number;
  /** Area of the debris mat projected across the flow, m². */
  readonly debrisMatAreaM2: number;
  /** Drag on the debris mat, kN. */
  readonly debrisMatKn: number;
  /** Bare wires + debris mat, kN. */
  readonly totalKn: number;
  /** Downstream load taken at each end strainer, kN (half the total each). */
  readonly eachEndStrainerKn: number;
  /** The working in plain words. */
  readonly reasons: readonly string[];
  readonly caution: string;
  /** The inputs as used, defaults filled in. */
  readonly inputs: Required<FloodgateLoadsInput>;
  readonly method: string;
}

const METHOD =
  'Drag F = ½ ρ C_d A V² (FEMA P-55 Coastal Construction Manual, 4th ed., Eq. 8.8); C_d 2.0 for the debris mat as a flat plate or wide obstruction (FEMA P-55), ' +
  '1.2 for a bare wire as a round cylinder (FEMA P-55\'s round-pile value; applying it to wire is from memory). ' +
  'Blockage default 0.5 is an assumption, no published source (ARR 2019 Book 6 Chapter 6 treats debris blockage of structures).';

const CAUTION =
  'A screening estimate, not a structural certificate: have strainers and posts in deep or fast flow checked by a qualified person, ' +
  'and follow local codes and permits for works in watercourses. Never enter floodwater.';

/**
 * Drag of a flood on a floodgate's wires and on the debris mat caught against them.
 *
 * Each wire is a cylinder of projected area d × 1 m per metre; the debris mat is a plate of area
 * blockage × wetted width × mean depth. Both use F = ½ ρ C_d A V² (FEMA P-55, Eq. 8.8) with the
 * mean speed. Bare-wire drag is counted over the whole wetted width, also behind the mat: a small
 * overcount, on the safe side. The downstream load is split half to each end strainer, a
 * simplification: the pull along the wire at the strainers is larger, H = w l² / (8 f) for a sag f
 * (Beer & Johnston, *Vector Mechanics for Engineers: Statics*, cables).
 *
 * @param input - see {@link FloodgateLoadsInput}; not modified
 * @returns loads in kN (per-metre wire drag in N/m), reasons, caution and method
 * @throws RangeError naming any input that is missing, out of range or not finite
 */
export function floodgateLoads(input: FloodgateLoadsInput): FloodgateLoads {
  if (typeof input !== 'object' || input === null) {
    throw new TypeError('expected an object with wettedWidthM, meanDepthM, velocityMs, wireCount and wireDiameterM.');
  }
  const used: Required<FloodgateLoadsInput> = {
    wettedWidthM: checkNumber(input.wettedWidthM, { name: 'wettedWidthM', what: 'the wetted width', unit: 'm', min: 0, minExclusive: true }),
    meanDepthM: checkNumber(input.meanDepthM, { name: 'meanDepthM', what: 'the mean depth', unit: 'm', min: 0, minExclusive: true }),
    velocityMs: checkNumber(input.velocityMs, { name: 'velocityMs', what: 'the mean flow speed', unit: 'm/s', min: 0 }),
    blockageFraction: checkNumber(input.blockageFraction ?? 0.5, {
      name: 'blockageFraction', what: 'the blocked share of the flow area', min: 0, max: 1,
      hint: 'Give a fraction, e.g. 0.5 for half blocked, not a percentage.',
    }),
    debrisDragCoefficient: checkNumber(input.debrisDragCoefficient ?? 2.0, {
      name: 'debrisDragCoefficient', what: 'the drag coefficient of the debris mat', min: 0, minExclusive: true,
    }),
    wireCount: checkNumber(input.wireCount, { name: 'wireCount', what: 'the number of wires in the water', min: 0, integer: true }),
    wireDiameterM: checkNumber(input.wireDiameterM, {
      name: 'wireDiameterM', what: 'the wire diameter', unit: 'm', min: 0, minExclusive: true, max: 0.02,
      hint: 'Give metres: a 2.5 mm wire is 0.0025.',
    }),
    wireDragCoefficient: checkNumber(input.wireDragCoefficient ?? 1.2, {
      name: 'wireDragCoefficient', what: 'the drag coefficient of a wire', min: 0, minExclusive: true,
    }),
    densityKgM3: checkNumber(input.densityKgM3 ?? 1000, {
      name: 'densityKgM3', what: 'the water density', unit: 'kg/m³', min: 0, minExclusive: true,
    }),
  };
  const flow = { velocityMs: used.velocityMs, densityKgM3: used.densityKgM3 };
  const bareWireDragNPerM = dragForceN({ ...flow, dragCoefficient: used.wireDragCoefficient, areaM2: used.wireDiameterM });
  const bareWiresN = bareWireDragNPerM * used.wireCount * used.wettedWidthM;
  const debrisMatAreaM2 = used.blockageFraction * used.wettedWidthM * used.meanDepthM;
  const debrisMatN = dragForceN({ ...flow, dragCoefficient: used.debrisDragCoefficient, areaM2: debrisMatAreaM2 });
  const totalN = bareWiresN + debrisMatN;
  const kN = (n: number): string => `${(n / 1000).toFixed(2)} kN`;
  const reasons = [
    `Each bare wire (${(used.wireDiameterM * 1000).toFixed(2)} mm) takes ${bareWireDragNPerM.toFixed(1)} N per metre at ${used.velocityMs.toFixed(2)} m/s; ${used.wireCount} wire${used.wireCount === 1 ? '' : 's'} across ${used.wettedWidthM.toFixed(1)} m of water take ${kN(bareWiresN)}.`,
    `A debris mat blocking ${(100 * used.blockageFraction).toFixed(0)} % of the ${used.wettedWidthM.toFixed(1)} m × ${used.meanDepthM.toFixed(2)} m flow area (${debrisMatAreaM2.toFixed(2)} m²) takes ${kN(debrisMatN)}: the debris, not the wire, carries most of the load.`,
    `Together ${kN(totalN)} downstream, taken as half (${kN(totalN / 2)}) at each end strainer — a simplification; the pull along the wire at the strainers is larger and depends on how far the wire sags.`,
  ];
  return {
    bareWireDragNPerM,
    bareWiresKn: bareWiresN / 1000,
    debrisMatAreaM2,
    debrisMatKn: debrisMatN / 1000,
    totalKn: totalN / 1000,
    eachEndStrainerKn: totalN / 2000,
    reasons,
    caution: CAUTION,
    inputs: used,
    method: METHOD,
  };
}
