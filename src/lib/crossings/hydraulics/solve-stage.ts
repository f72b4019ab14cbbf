import { checkCrossSection, type CrossSection } from './cross-section';
import { HydraulicsInputError } from './input-error';
import { manningDischarge } from './manning-discharge';
import { checkManningOptions, type ManningOptions } from './manning-options';

/** Inputs of {@link solveStageForDischarge}. */
export interface StageSolveOptions extends ManningOptions {
  /** Width of the final bracket, metres; default 0.00001 (the answer overstates the root by less). */
  readonly toleranceM?: number;
}

interface SolutionBase {
  readonly targetDischargeM3s: number;
  /** Lowest ground of the profile and the lower of its two end heights, metres. */
  readonly bedM: number;
  readonly lowerEndM: number;
  readonly method: string;
}

/** The level found: the section carries the discharge below the lower end of the profile. */
export interface StageFound extends SolutionBase {
  readonly overtopped: false;
  /** Water level, metres in the section's datum; Q(stage) ≥ the target, by less than the tolerance. */
  readonly stageM: number;
  readonly depthM: number;
  /** Discharge at `stageM`, m³/s. */
  readonly dischargeM3s: number;
  /** True when lower stages also carry the discharge (Q not monotone); the highest was taken. */
  readonly multipleSolutions: boolean;
}

/** Not even the full profile carries the discharge: the flood spills past its lower end. */
export interface StageOvertopped extends SolutionBase {
  readonly overtopped: true;
  readonly stageM: null;
  /** What the profile carries with water at its lower end, m³/s (0 when it holds no water). */
  readonly capacityM3s: number;
  /** True when the profile holds no water at all below its lower end (flat, or no low point between the ends). */
  readonly noChannel: boolean;
}

export type StageSolution = StageFound | StageOvertopped;

const SAMPLE_INTERVALS = 256;
const METHOD =
  "Normal depth by Manning's equation: discharge sampled from the bed to the lower end of the profile (every ground height and 256 even steps), then bisection in the highest bracket, so that where discharge is not monotone in stage the highest stage carrying the discharge is taken (overstating the flood level is the safe side for a fence)";

/**
 * The water level at which a cross-section carries a discharge in uniform flow (normal depth by
 * Manning's equation, {@link manningDischarge}), to within the tolerance, by bracketing and
 * bisection.
 *
 * Safe side: discharge need not rise steadily with stage — in a section taken as one element, a
 * wide flat overbank that starts flooding adds much wetted perimeter and little area, so Q can
 * drop for a while — and then several levels carry the same discharge. A fence must clear the
 * flood, so overstating the level is the safe side: the answer is the HIGHEST level at which Q
 * reaches the target, i.e. the level above which every sampled stage carries more than the
 * target, and within the final bracket its upper end (Q(stage) ≥ target). Dips narrower than the
 * sampling (every ground height, just above each, and 1/256 of the range) can be missed.
 *
 * Beyond the profile: above the lower end of the profile the water spills onto ground the
 * profile does not describe, so when even that level cannot carry the discharge the answer is
 * `overtopped: true` with the capacity of the full profile — draw a longer profile.
 *
 * @param section - ground profile, metres; not modified
 * @param dischargeM3s - the discharge, m³/s, above 0
 * @param options - slope (m/m), roughness, optional tolerance (m)
 * @returns the level, or the overtopped capacity
 * @throws HydraulicsInputError for a malformed section, a discharge not above 0, bad slope, n or tolerance
 */
export function solveStageForDischarge(section: CrossSection, dischargeM3s: number, options: StageSolveOptions): StageSolution {
  const { bedM, lowerEndM } = checkCrossSection(section);
  checkManningOptions(section, options);
  if (!Number.isFinite(dischargeM3s) || dischargeM3s <= 0) {
    throw new HydraulicsInputError('dischargeM3s', `The discharge must be a number of m³/s above 0, got ${dischargeM3s}.`);
  }
  const toleranceM = options.toleranceM ?? 1e-5;
  if (!Number.isFinite(toleranceM) || toleranceM <= 0 || toleranceM > 0.01) {
    throw new HydraulicsInputError('toleranceM', `The tolerance must be above 0 and at most 0.01 m, got ${toleranceM}.`);
  }
  const base = { targetDischargeM3s: dischargeM3s, bedM, lowerEndM, method: METHOD };
  const q = (stageM: number): number => manningDischarge(section, stageM, options).dischargeM3s;

  const capacityM3s = lowerEndM > bedM ? q(lowerEndM) : 0;
  if (capacityM3s < dischargeM3s) {
    return { ...base, overtopped: true, stageM: null, capacityM3s, noChannel: lowerEndM <= bedM };
  }

  const stages = sampleStages(section.elevationsM, bedM, lowerEndM);
  const flows = stages.map(q);
  // The highest sample still at or below the target; the one above it carries more.
  let i = stages.length - 2;
  while (i > 0 && flows[i]! > dischargeM3s) i--;
  let lo = stages[i]!;
  let hi = stages[i + 1]!;
  while (hi - lo > toleranceM) {
    const mid = 0.5 * (lo + hi);
    if (q(mid) <= dischargeM3s) lo = mid;
    else hi = mid;
  }
  return {
    ...base,
    overtopped: false,
    stageM: hi,
    depthM: hi - bedM,
    dischargeM3s: q(hi),
    multipleSolutions: flows.slice(0, i).some((flow) => flow > dischargeM3s),
  };
}

/**
 * Stages to scan, ascending from the bed to the lower end: every ground height between them and
 * a hair above it (where a flat shelf floods at once), plus even steps of 1/256 of the range.
 */
function sampleStages(elevationsM: readonly number[], bedM: number, topM: number): number[] {
  const breaks = [...new Set(elevationsM.filter((z) => z > bedM && z < topM)), bedM, topM].sort((a, b) => a - b);
  const step = (topM - bedM) / SAMPLE_INTERVALS;
  const stages: number[] = [];
  for (let k = 0; k + 1 < breaks.length; k++) {
    const a = breaks[k]!;
    const b = breaks[k + 1]!;
    const pieces = Math.max(1, Math.ceil((b - a) / step));
    stages.push(a, a + Math.min(1e-4, (b - a) / (4 * pieces)));
    for (let j = 1; j < pieces; j++) stages.push(a + ((b - a) * j) / pieces);
  }
  stages.push(topM);
  return stages;
}
