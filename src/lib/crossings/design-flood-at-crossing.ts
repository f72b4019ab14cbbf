import type { ChannelCrossSection } from './design/cross-section';
import { designFloodFromRainfall, type DesignFlood, type TcMethod } from './hydraulics/design-flood';
import { floodLevelForDischarge, type FloodLevel } from './hydraulics/flood-level';
import { floodLevelFromMark, type FloodLevelFromMark } from './hydraulics/flood-level-from-mark';
import type { IfdTable } from './hydraulics/ifd';
import type { SectionRoughness } from './hydraulics/manning-options';

/** The catchment figures the rainfall method needs (from the terrain run). */
export interface CatchmentFigures {
  readonly areaKm2: number;
  readonly mainStreamLengthKm: number;
  readonly equalAreaSlopeMPerKm: number;
}

/** Both design floods of a crossing, kept and shown, and the one the layout uses. */
export interface CrossingFloods {
  readonly fromMark: FloodLevelFromMark | null;
  readonly fromRainfall: { readonly flood: DesignFlood; readonly level: FloodLevel } | null;
  /** The level of a discharge given directly (the command line's `--discharge`), when there was one. */
  readonly fromDischarge: FloodLevel | null;
  /** Why the rainfall flood could not be worked out, in words; null when it was. */
  readonly rainfallUnavailable: string | null;
  /** Which flood the layout uses: an observed mark is the better guide when there is one, then a given discharge. */
  readonly chosen: 'mark' | 'discharge' | 'rainfall' | null;
  /** The chosen flood's level (m), mean velocity (m/s), deepest water (m) and wetted width (m). */
  readonly levelM: number | null;
  readonly meanVelocityMs: number | null;
  readonly maxDepthM: number | null;
  readonly wettedWidthM: number | null;
  readonly overtopped: boolean;
  readonly warnings: string[];
}

/**
 * The design flood at a crossing, two ways: from an observed flood mark (the debris line's
 * height above the bed) and from rainfall (Rational method with the property's IFD table, level
 * by Manning's equation in the crossing's section). The mark wins when there is one.
 */
export function floodsAtCrossing(input: {
  section: ChannelCrossSection;
  energySlope: number;
  roughness: SectionRoughness;
  floodMarkM: number | null;
  catchment: CatchmentFigures | null;
  ifd: IfdTable | null;
  aepPercent: number;
  runoffCoefficient: number;
  tcMethod: TcMethod;
  dischargeM3s?: number | null;
}): CrossingFloods {
  const section = { stationsM: input.section.stationsM, elevationsM: input.section.elevationsM };
  const options = { slope: input.energySlope, roughness: input.roughness };
  const warnings: string[] = [];
  const fromMark = input.floodMarkM ? floodLevelFromMark(section, input.floodMarkM, options) : null;
  const fromDischarge = input.dischargeM3s ? floodLevelForDischarge(section, input.dischargeM3s, options) : null;

  let fromRainfall: CrossingFloods['fromRainfall'] = null;
  let rainfallUnavailable: string | null = null;
  if (!input.ifd) rainfallUnavailable = "The property has no rainfall (IFD) table yet: enter one to work out a flood from rainfall.";
  else if (!input.catchment) rainfallUnavailable = 'No catchment could be traced for this crossing from the elevation model.';
  else {
    try {
      const flood = designFloodFromRainfall({
        catchment: input.catchment,
        ifd: input.ifd,
        aepPercent: input.aepPercent,
        runoffCoefficient: input.runoffCoefficient,
        tcMethod: input.tcMethod,
      });
      fromRainfall = { flood, level: floodLevelForDischarge(section, flood.dischargeM3s, options) };
    } catch (error) {
      rainfallUnavailable = (error as Error).message;
    }
  }

  if (fromMark) {
    warnings.push(...fromMark.warnings);
    return {
      fromMark,
      fromRainfall,
      fromDischarge,
      rainfallUnavailable,
      chosen: 'mark',
      levelM: fromMark.stageM,
      meanVelocityMs: fromMark.meanVelocityMs ?? (fromRainfall?.level.meanVelocityMs ?? null),
      maxDepthM: fromMark.maxDepthM,
      wettedWidthM: fromMark.wettedWidthM,
      overtopped: fromMark.overtopped,
      warnings,
    };
  }
  const chosenLevel = fromDischarge ?? fromRainfall?.level;
  if (chosenLevel) {
    const chosen = fromDischarge ? 'discharge' : 'rainfall';
    const level = chosenLevel;
    warnings.push(...(fromDischarge ? [] : fromRainfall!.flood.warnings), ...level.warnings);
    if (level.overtopped) {
      warnings.push(
        `The ${level.inputs.dischargeM3s.toFixed(1)} m³/s flood spreads past the ends of the ground profile (it carries ${level.capacityM3s.toFixed(1)} m³/s brim-full): widen the profile or treat the layout as provisional.`,
      );
      return { fromMark, fromRainfall, fromDischarge, rainfallUnavailable, chosen, levelM: level.lowerEndM, meanVelocityMs: null, maxDepthM: level.lowerEndM - level.bedM, wettedWidthM: null, overtopped: true, warnings };
    }
    return {
      fromMark,
      fromRainfall,
      fromDischarge,
      rainfallUnavailable,
      chosen,
      levelM: level.stageM,
      meanVelocityMs: level.meanVelocityMs,
      maxDepthM: level.maxDepthM,
      wettedWidthM: level.wettedWidthM,
      overtopped: false,
      warnings,
    };
  }
  return { fromMark, fromRainfall, fromDischarge, rainfallUnavailable, chosen: null, levelM: null, meanVelocityMs: null, maxDepthM: null, wettedWidthM: null, overtopped: false, warnings };
}
