import type { CrossingInputs, DesignSettings } from '../schemas/crossing';
import { DEFAULT_DESIGN_SETTINGS } from '../schemas/crossing';
import { compareStyles, type StyleComparison } from './compare-styles';
import { FENCING_CAUTIONS } from './design/cautions';
import { chooseStyle, type StyleChoice } from './design/choose-style';
import type { FloodgateStyle } from './design/floodgate-input';
import { channelCrossSection, NoChannelError, type ChannelCrossSection } from './design/cross-section';
import { layoutFloodgate, type FloodgateLayout } from './design/floodgate-layout';
import type { GroundPoint } from './design/ground-profile';
import { findWetZone } from './design/wet-zone';
import { floodsAtCrossing, type CatchmentFigures, type CrossingFloods } from './design-flood-at-crossing';
import type { IfdTable } from './hydraulics/ifd';
import { manningDischarge } from './hydraulics/manning-discharge';
import { floodgateLoads, type FloodgateLoads } from './loads/floodgate-loads';
import { materialsForCrossing } from './materials/crossing-materials';
import type { MaterialsList } from './materials/material-item';
import { requiredFlexRun, type FlexRun } from './wire/flex-run';
import { findWireType } from './wire/wire-types';

/** The fence's wires and materials figures, as stored on the fence line. */
export interface CrossingFence {
  readonly wireHeightsM: readonly number[];
  readonly wireKinds: readonly ('plain' | 'barbed')[];
  readonly plainWireTypeId: string;
  readonly barbedWireTypeId: string;
  readonly postSpacingM: number;
  readonly dropperSpacingM: number;
}

export interface CrossingDesignInput {
  /** Ground along the fence through the crossing (chainage on the fence, metres), nulls for gaps. */
  readonly profile: readonly GroundPoint[];
  readonly crossingChainageM: number;
  readonly crossingAngleDeg: number;
  /** Bed slope of the drainage line there, m/m (the energy slope of a uniform flood). */
  readonly channelSlope: number;
  readonly catchment: CatchmentFigures | null;
  readonly ifd: IfdTable | null;
  /** A design discharge given directly, m³/s, used before the rainfall estimate (a flood mark still wins). */
  readonly dischargeM3s?: number | null;
  readonly fence: CrossingFence;
  readonly inputs: CrossingInputs;
  readonly settings: DesignSettings;
}

export type CrossingDesign =
  | { readonly status: 'failed'; readonly problem: string; readonly cautions: readonly string[] }
  | { readonly status: 'no-channel'; readonly problem: string; readonly cautions: readonly string[] }
  | {
      readonly status: 'needs-input';
      readonly problem: string;
      readonly section: ChannelCrossSection;
      readonly floods: CrossingFloods;
      readonly cautions: readonly string[];
    }
  | {
      readonly status: 'designed';
      /** The flood spreads past the profile or an end strainer could not be put on dry ground: check on site. */
      readonly provisional: boolean;
      readonly section: ChannelCrossSection;
      readonly floods: CrossingFloods;
      readonly layout: FloodgateLayout;
      readonly wireCheck: FlexRun | null;
      readonly loads: FloodgateLoads | null;
      readonly materials: MaterialsList;
      readonly warnings: string[];
      readonly cautions: readonly string[];
      readonly used: Record<string, number | string>;
      /** Which style and why: the planner's, or the default rule's. */
      readonly styleChoice: StyleChoice;
      /** Both styles side by side, designed from the same flood and ground. */
      readonly comparison: StyleComparison;
    };

/** Slopes flatter than this are taken as this for the flood (a flat bed carries nothing by Manning). */
const MIN_ENERGY_SLOPE = 0.0005;

/**
 * Designs one crossing from plain data: the channel section across the flow, the design floods
 * (flood mark and rainfall, both kept), the wet zone, the wire check that sets the flex runs, the
 * floodgate layout in the chosen style, the loads and the materials. Each part carries its own
 * inputs, methods and reasons; this function only joins them and chooses defaults from the
 * property's settings.
 */
export function designCrossing(input: CrossingDesignInput): CrossingDesign {
  const settings = { ...DEFAULT_DESIGN_SETTINGS, ...input.settings };
  const inputs = input.inputs;
  const channelN = inputs.channelN ?? settings.channelN;
  const overbankN = inputs.overbankN ?? settings.overbankN;
  const freeboardM = inputs.freeboardM ?? settings.freeboardM;
  const energySlope = Math.max(input.channelSlope, MIN_ENERGY_SLOPE);

  let section: ChannelCrossSection;
  try {
    section = channelCrossSection(input.profile, input.crossingChainageM, input.crossingAngleDeg, { halfWidthM: settings.profileHalfWidthM });
  } catch (error) {
    if (error instanceof NoChannelError) {
      return {
        status: 'no-channel',
        problem: `No defined channel here: the ground along the fence does not dip where the drainage line crosses it, so water runs across as a sheet rather than in a channel. An ordinary fence usually copes; check the place after rain. (${error.message})`,
        cautions: FENCING_CAUTIONS,
      };
    }
    if (error instanceof RangeError) return { status: 'failed', problem: error.message, cautions: FENCING_CAUTIONS };
    throw error;
  }
  const [leftBank, rightBank] = section.bankStationsM;
  const roughness = { channelN, leftOverbankN: overbankN, rightOverbankN: overbankN, leftBankStationM: leftBank, rightBankStationM: rightBank };
  const floods = floodsAtCrossing({
    section,
    energySlope,
    roughness,
    floodMarkM: inputs.floodMarkM ?? null,
    catchment: input.catchment,
    ifd: input.ifd,
    aepPercent: inputs.aepPercent ?? settings.aepPercent,
    runoffCoefficient: inputs.runoffCoefficient ?? settings.runoffCoefficient,
    tcMethod: inputs.tcMethod ?? settings.tcMethod,
    dischargeM3s: input.dischargeM3s ?? null,
  });
  if (floods.levelM === null) {
    return {
      status: 'needs-input',
      problem: `Enter a flood mark for this crossing${floods.rainfallUnavailable ? `, or: ${floods.rainfallUnavailable}` : ''}`,
      section,
      floods,
      cautions: FENCING_CAUTIONS,
    };
  }
  // The drainage line follows cell centres, so it may meet the fence a little off the channel's
  // lowest point: the wet zone and layout are centred on the bed the section found.
  const bedChainageM = section.bed.chainageM;
  const levelM = Math.max(floods.levelM, section.bed.elevationM);
  const meanVelocityMs =
    floods.meanVelocityMs ?? manningDischarge({ stationsM: section.stationsM, elevationsM: section.elevationsM }, levelM, { slope: energySlope, roughness }).meanVelocityMs;
  const warnings = [...section.warnings, ...floods.warnings];

  const wetZone = findWetZone(input.profile, bedChainageM, levelM, freeboardM);
  const plainWire = findWireType(input.fence.plainWireTypeId);
  const styleChoice = chooseStyle({
    wetZoneWidthM: wetZone.lengthM,
    maxDepthM: wetZone.maxDepthM,
    velocityMs: meanVelocityMs,
    debris: inputs.debris ?? settings.debris,
    plannerStyle: inputs.style,
    thresholds: { dropDownWidthM: settings.dropDownWidthM, dropDownDepthM: settings.dropDownDepthM, dropDownVelocityMs: settings.dropDownVelocityMs, dropDownDebris: settings.dropDownDebris },
  });
  // The issue's default deflection: the design flood depth at the deepest point.
  const deflectionM = Math.min(wetZone.maxDepthM, 0.45 * wetZone.lengthM);

  const materialsSpec = {
    wireHeightsM: input.fence.wireHeightsM,
    wireKinds: input.fence.wireKinds,
    rollLengthM: { plain: plainWire.rollLengthM, barbed: findWireType(input.fence.barbedWireTypeId).rollLengthM },
    postSpacingM: input.fence.postSpacingM,
    dropperSpacingM: input.fence.dropperSpacingM,
  };
  const designStyle = (style: FloodgateStyle) => {
    const styleWarnings: string[] = [];
    let wireCheck: FlexRun | null = null;
    if (style === 'continuous-floodgate') {
      wireCheck = requiredFlexRun({
        floodgateSpanM: wetZone.lengthM,
        deflectionM,
        wire: plainWire,
        pretensionN: settings.pretensionN,
        safeFractionOfBreaking: settings.safeFractionOfBreaking,
      });
      if (deflectionM < wetZone.maxDepthM) styleWarnings.push('The wire check pushes the wires by 45 % of the floodgate span, less than the flood depth, since a deeper push than that is not a wire stretching but a wire lying flat.');
    }
    const layout = layoutFloodgate({
      profile: input.profile,
      crossingChainageM: bedChainageM,
      crossingAngleDeg: input.crossingAngleDeg,
      floodLevelM: levelM,
      meanVelocityMs,
      energySlope,
      manningN: channelN,
      style,
      settings: {
        freeboardM,
        strainerSetbackM: settings.strainerSetbackM,
        postSpacingM: settings.floodgatePostSpacingM,
        braceDepthM: settings.braceDepthM,
        braceVelocityMs: settings.braceVelocityMs,
        minEmbedmentM: settings.minEmbedmentM,
        preferredEmbedmentM: settings.preferredEmbedmentM,
      },
      fence: { wireHeightsM: input.fence.wireHeightsM, wireKinds: input.fence.wireKinds },
      ...(wireCheck ? { flexRunEachSideM: wireCheck.flexRunEachSideM } : {}),
    });
    const wetWidthM = floods.wettedWidthM ?? wetZone.lengthM;
    const loads =
      meanVelocityMs > 0 && wetWidthM > 0
        ? floodgateLoads({
            wettedWidthM: wetWidthM,
            meanDepthM: Math.max(0.01, wetZone.maxDepthM / 2),
            velocityMs: meanVelocityMs,
            blockageFraction: settings.blockageFraction,
            wireCount: layout.wires.filter((wire) => wire.mustBePlain).length,
            wireDiameterM: plainWire.diameterMm / 1000,
          })
        : null;
    const materials = materialsForCrossing(layout, materialsSpec);
    return { layout, wireCheck, loads, materials, warnings: styleWarnings };
  };
  const continuous = designStyle('continuous-floodgate');
  const dropDown = designStyle('drop-down-section');
  const { layout, wireCheck, loads, materials, warnings: styleWarnings } = styleChoice.style === 'continuous-floodgate' ? continuous : dropDown;
  const comparison = compareStyles({
    continuous,
    dropDown,
    choice: styleChoice,
    fence: materialsSpec,
    plainWire,
    pretensionN: settings.pretensionN,
    safeFractionOfBreaking: settings.safeFractionOfBreaking,
    sectionReleaseKn: settings.sectionReleaseKn,
    resetTieHours: settings.resetTieHours,
    rehangSectionHours: settings.rehangSectionHours,
  });
  return {
    status: 'designed',
    provisional: floods.overtopped || layout.overtopsProfile || layout.endStrainers.some((strainer) => !strainer.onDryGround),
    section,
    floods,
    layout,
    wireCheck,
    loads,
    materials,
    warnings: [...new Set([...warnings, ...styleWarnings, ...layout.warnings, ...materials.warnings])],
    cautions: FENCING_CAUTIONS,
    styleChoice,
    comparison,
    used: { channelN, overbankN, freeboardM, style: styleChoice.style, debris: inputs.debris ?? settings.debris, energySlope, deflectionM, pretensionN: settings.pretensionN, safeFractionOfBreaking: settings.safeFractionOfBreaking },
  };
}
