import { checkCrossSection, type CrossSection } from './cross-section';
import { checkManningOptions, type ManningOptions } from './manning-options';
import { wettedGeometry } from './section-geometry';
import { HYDRAULICS_SOURCES } from './sources';

/** One conveyance subdivision of the section. */
export interface ConveyancePart {
  readonly part: 'left overbank' | 'main channel' | 'right overbank';
  readonly fromStationM: number;
  readonly toStationM: number;
  readonly manningN: number;
  readonly areaM2: number;
  readonly wettedPerimeterM: number;
  readonly topWidthM: number;
  /** R = A / P, metres (0 when dry). */
  readonly hydraulicRadiusM: number;
  /** K = (1/n) A R^(2/3), m³/s. */
  readonly conveyanceM3s: number;
  readonly dischargeM3s: number;
  readonly meanVelocityMs: number;
}

/** Discharge of a section at one water level, with its parts and how it was computed. */
export interface ManningDischarge {
  readonly stageM: number;
  readonly slope: number;
  /** Q = K S^(1/2), m³/s. */
  readonly dischargeM3s: number;
  readonly conveyanceM3s: number;
  readonly areaM2: number;
  readonly wettedPerimeterM: number;
  readonly topWidthM: number;
  /** Q / A, m/s (0 when dry). */
  readonly meanVelocityMs: number;
  /** Water depth over the lowest ground of the profile, metres (0 when dry). */
  readonly maxDepthM: number;
  readonly parts: readonly ConveyancePart[];
  readonly method: string;
}

/**
 * Discharge of an irregular cross-section at a water level by Manning's equation (SI),
 * V = (1/n) R^(2/3) S^(1/2). The main channel is one element; where bank stations are given,
 * the section is split there (vertical dividers, not wetted perimeter) into left overbank, main
 * channel and right overbank, each part's conveyance K = (1/n) A R^(2/3) is computed, and
 * Q = ΣK · S^(1/2) (Chow 1959, Open-Channel Hydraulics, compound sections; USACE HEC-RAS
 * Hydraulic Reference Manual, conveyance subdivision). The section is never sliced at every
 * profile point: that overstates conveyance and so understates the flood level.
 *
 * @param section - ground profile, metres; not modified
 * @param stageM - water level, metres in the section's datum
 * @param options - slope (m/m) and roughness
 * @returns discharge (m³/s), geometry and per-part conveyance
 * @throws HydraulicsInputError for a malformed section, a slope or n out of range, or bank stations off the profile or out of order
 */
export function manningDischarge(section: CrossSection, stageM: number, options: ManningOptions): ManningDischarge {
  const { bedM } = checkCrossSection(section);
  const slope = checkManningOptions(section, options);
  const { roughness } = options;
  const first = section.stationsM[0]!;
  const last = section.stationsM[section.stationsM.length - 1]!;
  const left = roughness.leftBankStationM ?? first;
  const right = roughness.rightBankStationM ?? last;
  const split: [ConveyancePart['part'], number, number, number][] = [];
  if (left > first) split.push(['left overbank', first, left, roughness.leftOverbankN ?? roughness.channelN]);
  split.push(['main channel', left, right, roughness.channelN]);
  if (right < last) split.push(['right overbank', right, last, roughness.rightOverbankN ?? roughness.channelN]);

  const rootS = Math.sqrt(slope);
  const parts = split.map(([part, from, to, manningN]): ConveyancePart => {
    const g = wettedGeometry(section, stageM, from, to);
    const hydraulicRadiusM = g.wettedPerimeterM > 0 ? g.areaM2 / g.wettedPerimeterM : 0;
    const conveyanceM3s = (g.areaM2 * Math.cbrt(hydraulicRadiusM * hydraulicRadiusM)) / manningN;
    const dischargeM3s = conveyanceM3s * rootS;
    return {
      part,
      fromStationM: from,
      toStationM: to,
      manningN,
      areaM2: g.areaM2,
      wettedPerimeterM: g.wettedPerimeterM,
      topWidthM: g.topWidthM,
      hydraulicRadiusM,
      conveyanceM3s,
      dischargeM3s,
      meanVelocityMs: g.areaM2 > 0 ? dischargeM3s / g.areaM2 : 0,
    };
  });
  const sum = (key: 'areaM2' | 'wettedPerimeterM' | 'topWidthM' | 'conveyanceM3s' | 'dischargeM3s'): number =>
    parts.reduce((total, part) => total + part[key], 0);
  const areaM2 = sum('areaM2');
  const dischargeM3s = sum('dischargeM3s');
  return {
    stageM,
    slope,
    dischargeM3s,
    conveyanceM3s: sum('conveyanceM3s'),
    areaM2,
    wettedPerimeterM: sum('wettedPerimeterM'),
    topWidthM: sum('topWidthM'),
    meanVelocityMs: areaM2 > 0 ? dischargeM3s / areaM2 : 0,
    maxDepthM: Math.max(0, stageM - bedM),
    parts,
    method:
      parts.length === 1
        ? `Manning's equation, the section as one element (${HYDRAULICS_SOURCES.chow1959})`
        : `Manning's equation with conveyance subdivided at the bank stations into ${parts.map((p) => p.part).join(', ')} (${HYDRAULICS_SOURCES.chow1959}, compound sections; ${HYDRAULICS_SOURCES.hecRas})`,
  };
}
