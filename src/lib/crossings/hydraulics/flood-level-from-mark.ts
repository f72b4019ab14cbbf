import { checkCrossSection, copySection, type CrossSection } from './cross-section';
import { HydraulicsInputError } from './input-error';
import { manningDischarge } from './manning-discharge';
import type { ManningOptions } from './manning-options';
import { wettedGeometry, type WetStretch } from './section-geometry';
import { HYDRAULICS_SOURCES } from './sources';

/** The flood level an observed flood mark gives, with what the profile says about it. */
export interface FloodLevelFromMark {
  /** Water level, metres in the profile's datum: the bed plus the mark height. */
  readonly stageM: number;
  /** Lowest ground of the profile (the bed the mark is measured from) and the lower end height, metres. */
  readonly bedM: number;
  readonly lowerEndM: number;
  /** Depth over the bed, metres (the mark height). */
  readonly maxDepthM: number;
  /** True when the level is above the lower end of the profile: the flood spread past it. */
  readonly overtopped: boolean;
  /** True when the level is above every point of the profile. */
  readonly aboveWholeProfile: boolean;
  /** Width and stretches of water surface within the profile, metres (understated when overtopped). */
  readonly wettedWidthM: number;
  readonly wetStretches: readonly WetStretch[];
  /**
   * For information: the discharge (m³/s) and mean velocity (m/s) Manning's equation gives at that
   * level, when slope and roughness were given and the level stays within the profile; else null.
   */
  readonly dischargeM3s: number | null;
  readonly meanVelocityMs: number | null;
  readonly warnings: readonly string[];
  readonly method: string;
  readonly sources: readonly string[];
  readonly inputs: { readonly section: CrossSection; readonly markHeightM: number; readonly options: ManningOptions | null };
}

/**
 * The flood level at a crossing from an observed flood mark (debris line) measured in metres
 * above the channel bed: stage = lowest ground of the profile + mark height. An observed mark,
 * where there is one, is a better guide than a Rational-method flood (Gullyline references,
 * after ARR 2016/2019). With slope and roughness, the discharge that level carries by Manning's
 * equation ({@link manningDischarge}) is given for information.
 *
 * A mark above the lower end of the profile, or above the whole profile, is not an error — the
 * observation stands — but the result is `overtopped` with a warning: the profile is too short to
 * bound the wet zone, and the discharge is not given (the profile would understate it).
 *
 * @param section - ground profile, metres; not modified
 * @param markHeightM - height of the flood mark above the channel bed, metres, above 0
 * @param options - optional slope (m/m) and roughness, for the discharge
 * @returns level, depth, wet width and stretches, discharge for information, warnings, method, sources and inputs
 * @throws HydraulicsInputError for a malformed section, a mark height not above 0, or bad slope or n
 */
export function floodLevelFromMark(section: CrossSection, markHeightM: number, options?: ManningOptions): FloodLevelFromMark {
  const { bedM, lowerEndM, highestM } = checkCrossSection(section);
  if (typeof markHeightM !== 'number' || !Number.isFinite(markHeightM) || markHeightM <= 0) {
    throw new HydraulicsInputError(
      'markHeightM',
      `The flood mark height must be a number of metres above the channel bed, above 0; got ${markHeightM}.`,
    );
  }
  const stageM = bedM + markHeightM;
  const overtopped = stageM > lowerEndM;
  const aboveWholeProfile = stageM > highestM;
  const geometry = wettedGeometry(section, stageM);
  const warnings: string[] = [];
  if (aboveWholeProfile) {
    warnings.push(
      `The flood mark puts the water ${(stageM - highestM).toFixed(2)} m above the highest point of the profile: the whole profile was under water. Check the mark height (metres above the bed), or draw a longer profile that reaches higher ground on both sides.`,
    );
  } else if (overtopped) {
    warnings.push(
      `The flood mark puts the water ${(stageM - lowerEndM).toFixed(2)} m above the lower end of the profile: the flood spread past it. Extend the profile onto higher ground to find the edge of the wet zone.`,
    );
  }
  let dischargeM3s: number | null = null;
  let meanVelocityMs: number | null = null;
  let flowMethod = '';
  if (options !== undefined) {
    const flow = manningDischarge(section, stageM, options);
    flowMethod = `; discharge for information by ${flow.method}`;
    if (!overtopped) {
      dischargeM3s = flow.dischargeM3s;
      meanVelocityMs = flow.meanVelocityMs;
    } else {
      warnings.push(
        'No discharge is given for this mark: the flood spread beyond the profile, so the profile would understate it.',
      );
    }
  }
  return {
    stageM,
    bedM,
    lowerEndM,
    maxDepthM: markHeightM,
    overtopped,
    aboveWholeProfile,
    wettedWidthM: geometry.topWidthM,
    wetStretches: geometry.wetStretches,
    dischargeM3s,
    meanVelocityMs,
    warnings,
    method: `Flood level from an observed flood mark: stage = lowest ground of the profile + mark height${flowMethod}`,
    sources: options !== undefined ? [HYDRAULICS_SOURCES.chow1959, HYDRAULICS_SOURCES.hecRas] : [],
    inputs: {
      section: copySection(section),
      markHeightM,
      options: options === undefined ? null : { slope: options.slope, roughness: { ...options.roughness } },
    },
  };
}
