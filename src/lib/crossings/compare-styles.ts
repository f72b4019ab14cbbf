/**
 * The two ways to build a crossing side by side: layout, loads on the end assemblies, materials
 * over the same stretch of fence, the work after a flood, the drop-down section's release, and a
 * recommendation with its reasons.
 */
import type { StyleChoice } from './design/choose-style';
import type { FloodgateLayout } from './design/floodgate-layout';
import type { FloodgateStyle } from './design/floodgate-input';
import type { FloodgateLoads } from './loads/floodgate-loads';
import { checkSectionRelease, type SectionRelease } from './loads/section-release';
import { countRun, wireItems } from './materials/counting';
import { resolveFenceSpec, type MaterialsFenceSpec } from './materials/fence-spec';
import type { MaterialItem, MaterialsList } from './materials/material-item';
import type { WireType } from './wire/wire-types';

/** One style's design, as `designCrossing` makes it. */
export interface StyleDesignParts {
  readonly layout: FloodgateLayout;
  readonly loads: FloodgateLoads | null;
  readonly materials: MaterialsList;
}

export interface CompareStylesInput {
  readonly continuous: StyleDesignParts;
  readonly dropDown: StyleDesignParts;
  readonly choice: StyleChoice;
  /** The fence as built (wires, rolls, spacings), for the ordinary fence the comparison adds. */
  readonly fence: MaterialsFenceSpec;
  /** The plain wire of the fence, for the release check. */
  readonly plainWire: Pick<WireType, 'name' | 'breakingLoadN'>;
  readonly pretensionN: number;
  readonly safeFractionOfBreaking: number;
  /** Release load of each end tie of the drop-down section, kN (judgement). */
  readonly sectionReleaseKn: number;
  /** Person-hours to re-set one breakaway tie after a flood (common practice, no source). */
  readonly resetTieHours: number;
  /** Person-hours to re-hang (or rebuild) a drop-down section after a flood (common practice, no source). */
  readonly rehangSectionHours: number;
}

/** One style in the comparison. */
export interface StyleSide {
  readonly style: FloodgateStyle;
  /** This style is the crossing's design now. */
  readonly inPlan: boolean;
  readonly counts: {
    readonly endAssemblies: number;
    readonly flexRunStrainers: number;
    readonly posts: number;
    readonly stays: number;
    readonly hungDroppers: number;
    readonly droppers: number;
    readonly breakawayTies: number;
  };
  readonly wiresRunThrough: boolean;
  readonly flexRunEachSideM: number;
  /** End strainer to end strainer, metres. */
  readonly spanM: number;
  /** Downstream flood load on each end assembly, kN; null when the flood has no speed. */
  readonly endAssemblyLoadKn: number | null;
  readonly endAssemblyLoadReason: string;
  /** Materials over the compared stretch (the same length of fence for both styles). */
  readonly materials: MaterialItem[];
  readonly afterFlood: { readonly work: string; readonly hours: number; readonly reason: string };
  readonly strengths: string[];
  readonly weaknesses: string[];
}

export interface StyleComparison {
  /** Length of fence both materials lists build, metres: the continuous style's footprint. */
  readonly stretchM: number;
  readonly stretchReason: string;
  readonly sides: readonly [StyleSide, StyleSide];
  readonly release: SectionRelease | null;
  readonly inPlan: FloodgateStyle;
  readonly chosenBy: 'planner' | 'rule';
  readonly recommendation: { readonly style: FloodgateStyle; readonly reasons: string[] };
  readonly basis: string;
}

const count = (items: readonly MaterialItem[], code: MaterialItem['code']) => items.filter((it) => it.code === code).reduce((sum, it) => sum + it.quantity, 0);

/**
 * Compares the two styles of one crossing designed from the same flood and ground. Materials are
 * compared over the same length of fence: the continuous style's footprint (flex-run strainer to
 * flex-run strainer); the drop-down section's list gets the ordinary fence (line posts, droppers,
 * clips, wire) over the stretches its continuous twin uses as flex runs. After-flood work and its
 * person-hours are settings (common practice, no published source). The recommendation is the
 * style rule's ({@link StyleChoice}), with a caution added when the section's release check fails.
 *
 * @param input - see {@link CompareStylesInput}; not modified
 * @throws RangeError when the two designs are not of the two styles, or a figure is out of range
 */
export function compareStyles(input: CompareStylesInput): StyleComparison {
  const { continuous, dropDown, choice } = input;
  if (continuous?.layout?.style !== 'continuous-floodgate' || dropDown?.layout?.style !== 'drop-down-section') {
    throw new RangeError('compareStyles needs a continuous floodgate design and a drop-down section design of the same crossing');
  }
  for (const [name, value] of [['resetTieHours', input.resetTieHours], ['rehangSectionHours', input.rehangSectionHours]] as const) {
    if (!(Number.isFinite(value) && value >= 0)) throw new RangeError(`${name} must be person-hours, 0 or more, got ${String(value)}`);
  }
  const spec = resolveFenceSpec(input.fence);
  const flexM = continuous.layout.styleDetail.flexRunEachSideM;

  // The drop-down twin over the same stretch: ordinary fence where the continuous style has flex runs.
  const run = countRun(flexM, spec);
  const wireCount = spec.wireHeightsM.length;
  const metres = { plain: 0, barbed: 0 };
  dropDown.layout.wires.forEach((w, i) => {
    metres[w.kind] += dropDown.layout.styleDetail.wireRunM;
    metres[spec.wireKinds[i] ?? w.kind] += 2 * flexM;
  });
  const ordinary = (code: MaterialItem['code'], description: string, quantity: number): MaterialItem[] =>
    quantity > 0 ? [{ code, description, unit: 'each', quantity, reason: `Ordinary fence either side, over the ${Math.round(flexM)} m the continuous floodgate uses as each flex run, so both lists build the same length.` }] : [];
  const dropDownItems = [
    ...dropDown.materials.items.filter((it) => it.code !== 'WIRE_PLAIN' && it.code !== 'WIRE_BARBED'),
    ...ordinary('LINE_POST', 'Line post', 2 * run.posts),
    ...ordinary('DROPPER', 'Dropper', 2 * run.droppers),
    ...ordinary('CLIP', 'Wire clip', 2 * run.posts * wireCount),
    ...wireItems(metres, spec, 'Each wire across the drop-down section, plus the ordinary fence over the same stretch as the continuous floodgate\'s flex runs.'),
  ];

  const release =
    dropDown.loads !== null
      ? checkSectionRelease({ loads: dropDown.loads, releaseEachEndKn: input.sectionReleaseKn, wire: input.plainWire, wireCount, pretensionN: input.pretensionN, safeFractionOfBreaking: input.safeFractionOfBreaking })
      : null;

  const countsOf = (parts: StyleDesignParts): StyleSide['counts'] => ({
    endAssemblies: parts.layout.endStrainers.length,
    flexRunStrainers: parts.layout.styleDetail.flexRunStrainers.length,
    posts: count(parts.materials.items, 'HEAVY_POST') + count(parts.materials.items, 'LINE_POST'),
    stays: count(parts.materials.items, 'STAY'),
    hungDroppers: count(parts.materials.items, 'HUNG_DROPPER'),
    droppers: count(parts.materials.items, 'DROPPER'),
    breakawayTies: parts.layout.breakawayTies.length,
  });
  const ties = continuous.layout.breakawayTies.length;
  const continuousLoad = continuous.loads?.eachEndStrainerKn ?? null;
  const dropLoad = dropDown.loads ? Math.min(dropDown.loads.eachEndStrainerKn, input.sectionReleaseKn) : null;
  const sides: [StyleSide, StyleSide] = [
    {
      style: 'continuous-floodgate',
      inPlan: choice.style === 'continuous-floodgate',
      counts: countsOf(continuous),
      wiresRunThrough: true,
      flexRunEachSideM: flexM,
      spanM: continuous.layout.span.lengthM,
      endAssemblyLoadKn: continuousLoad,
      endAssemblyLoadReason:
        'The whole flood load on the wires and the debris caught on them reaches the end strainers, half each (a simplification: the pull along a sagging wire is larger), until the breakaway tie lets the floodgate swing up.',
      materials: [...continuous.materials.items],
      afterFlood: {
        work: `Re-set the breakaway tie${ties === 1 ? '' : 's'} and clear debris off the wires`,
        hours: ties * input.resetTieHours,
        reason: `${ties} tie${ties === 1 ? '' : 's'} × ${input.resetTieHours} person-hours (a setting; common practice, no published source). Stock stay held meanwhile.`,
      },
      strengths: ['Nothing to rebuild after most floods: only the tie is re-set.', 'Stock stay held while the water is down.'],
      weaknesses: [`Long strained runs: ${Math.round(flexM)} m of flex run each side and two more strainers.`, 'Heavy end assemblies, and the debris load reaches them.'],
    },
    {
      style: 'drop-down-section',
      inPlan: choice.style === 'drop-down-section',
      counts: countsOf(dropDown),
      wiresRunThrough: false,
      flexRunEachSideM: 0,
      spanM: dropDown.layout.span.lengthM,
      endAssemblyLoadKn: dropLoad,
      endAssemblyLoadReason: `At most the release load of the tie at each end (${input.sectionReleaseKn} kN, a setting): past it the section drops and the flood no longer pulls on the fence.`,
      materials: dropDownItems,
      afterFlood: {
        work: 'Re-hang the section on its end assemblies, or rebuild it if the flood carried it away',
        hours: input.rehangSectionHours,
        reason: `${input.rehangSectionHours} person-hours (a setting; common practice, no published source). Stock can get through the gap until it is back.`,
      },
      strengths: ['Short strains: the fence ends on its own end assemblies each side.', 'The flood never loads the main fence: only the light section is lost (NSW DPI Primefact 681, 2009).'],
      weaknesses: ['The section drops or is lost in a flood and must be re-hung or rebuilt.', 'Stock can get through until it is.'],
    },
  ];

  const reasons = choice.reasons.filter((reason) => !/planner/.test(reason));
  if (release && choice.recommended === 'drop-down-section' && !(release.endAssemblyHolds && release.tieGoesFirst)) {
    reasons.push('Check the section\'s ties first: as set, the release check below does not pass.');
  }
  return {
    stretchM: dropDown.materials.fenceLengthM + 2 * flexM,
    stretchReason: `Both lists build the same ${Math.round(dropDown.materials.fenceLengthM + 2 * flexM)} m of fence: the continuous floodgate's wires run that far, flex-run strainer to flex-run strainer; the drop-down section's list adds ordinary fence over the same length.`,
    sides,
    release,
    inPlan: choice.style,
    chosenBy: choice.chosenBy,
    recommendation: { style: choice.recommended, reasons },
    basis: choice.basis,
  };
}
