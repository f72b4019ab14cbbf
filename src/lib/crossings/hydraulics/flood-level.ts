import { copySection, type CrossSection } from './cross-section';
import { manningDischarge } from './manning-discharge';
import type { ManningOptions } from './manning-options';
import { wettedGeometry, type WetStretch } from './section-geometry';
import { solveStageForDischarge } from './solve-stage';
import { HYDRAULICS_SOURCES } from './sources';

interface LevelBase {
  /** Lowest ground of the profile and the lower of its end heights, metres. */
  readonly bedM: number;
  readonly lowerEndM: number;
  readonly warnings: readonly string[];
  readonly method: string;
  readonly sources: readonly string[];
}

/** The flood level found for a discharge: it stays within the profile. */
export interface FloodLevelWithin extends LevelBase {
  readonly overtopped: false;
  /** Water level, metres in the profile's datum. */
  readonly stageM: number;
  /** Depth over the lowest ground, metres. */
  readonly maxDepthM: number;
  /** Q / A, m/s. */
  readonly meanVelocityMs: number;
  /** Total width of water surface (top width), metres. */
  readonly wettedWidthM: number;
  /** The stretches of the profile under water, left to right. */
  readonly wetStretches: readonly WetStretch[];
  /** Discharge at the level (≥ the one asked for, by the solver's tolerance), m³/s. */
  readonly dischargeM3s: number;
}

/** The discharge overtops the profile: the level is not known, only that it is above the lower end. */
export interface FloodLevelOvertopped extends LevelBase {
  readonly overtopped: true;
  readonly stageM: null;
  readonly maxDepthM: null;
  readonly meanVelocityMs: null;
  readonly wettedWidthM: null;
  /** What the whole profile carries with water at its lower end, m³/s. */
  readonly capacityM3s: number;
}

/** Flood level at a crossing for a design discharge, with its inputs. */
export type FloodLevel = (FloodLevelWithin | FloodLevelOvertopped) & {
  readonly inputs: { readonly section: CrossSection; readonly dischargeM3s: number; readonly options: ManningOptions };
};

const fmt = (value: number, digits: number): string => value.toFixed(digits);

/**
 * The flood level at a crossing for a discharge: normal depth by Manning's equation on the
 * crossing's ground profile ({@link solveStageForDischarge}, main channel one element, overbanks
 * split at the bank stations — Chow 1959; HEC-RAS conveyance subdivision), taking the highest
 * level where several carry the discharge (safe side for a fence).
 *
 * A profile that holds no water (flat, or with no ground lower than both ends) has no level:
 * the answer is `overtopped: true` with capacity 0 and a warning to draw the profile across the
 * channel, not an error, so the crossing can still be shown as needing attention.
 *
 * @param section - ground profile, metres; not modified
 * @param dischargeM3s - design discharge, m³/s, above 0
 * @param options - slope (m/m) and roughness
 * @returns level, depth, mean velocity, wetted width and wet stretches, or the overtopped capacity; with warnings, method, sources and inputs
 * @throws HydraulicsInputError for a malformed section, a discharge not above 0, or bad slope or n
 */
export function floodLevelForDischarge(section: CrossSection, dischargeM3s: number, options: ManningOptions): FloodLevel {
  const solution = solveStageForDischarge(section, dischargeM3s, options);
  const inputs = {
    section: copySection(section),
    dischargeM3s,
    options: { slope: options.slope, roughness: { ...options.roughness } },
  };
  const sources = [HYDRAULICS_SOURCES.chow1959, HYDRAULICS_SOURCES.hecRas];
  const { bedM, lowerEndM } = solution;
  if (solution.overtopped) {
    const warnings = solution.noChannel
      ? [
          'The profile holds no water: it has no ground lower than both of its ends. Draw it across the channel, with both ends on higher ground.',
        ]
      : [
          `The profile carries only ${fmt(solution.capacityM3s, 2)} m³/s with water at its lower end (${fmt(lowerEndM, 2)} m); the flood of ${fmt(dischargeM3s, 2)} m³/s spills past it. Extend the profile onto higher ground on both sides.`,
        ];
    return {
      overtopped: true,
      stageM: null,
      maxDepthM: null,
      meanVelocityMs: null,
      wettedWidthM: null,
      capacityM3s: solution.capacityM3s,
      bedM,
      lowerEndM,
      warnings,
      method: solution.method,
      sources,
      inputs,
    };
  }
  const flow = manningDischarge(section, solution.stageM, options);
  const geometry = wettedGeometry(section, solution.stageM);
  const warnings = solution.multipleSolutions
    ? [
        'Lower water levels also carry this discharge in this section (the overbank floods with little gain in flow); the highest was taken. Setting bank stations splits the section and gives a steadier answer.',
      ]
    : [];
  return {
    overtopped: false,
    stageM: solution.stageM,
    maxDepthM: flow.maxDepthM,
    meanVelocityMs: flow.meanVelocityMs,
    wettedWidthM: flow.topWidthM,
    wetStretches: geometry.wetStretches,
    dischargeM3s: flow.dischargeM3s,
    bedM,
    lowerEndM,
    warnings,
    method: `${solution.method}; ${flow.method}`,
    sources,
    inputs,
  };
}
