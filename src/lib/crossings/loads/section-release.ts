/**
 * When a drop-down section lets go, and whether its end assemblies hold until it does.
 */
import { checkNumber } from '../wire/check-number';
import type { WireType } from '../wire/wire-types';
import type { FloodgateLoads } from './floodgate-loads';

/** Share of a plain wire's strength left at its weakest usual knot, the double loop (The Press, Christchurch, 18 April 1980). */
export const WEAKEST_KNOT_SHARE = 0.44;

export interface SectionReleaseInput {
  /** Drag of the design flood on the section (its bare wires and debris mat), from `floodgateLoads`. */
  readonly loads: FloodgateLoads;
  /** Load at which the light tie at each end assembly lets go, kN, > 0. */
  readonly releaseEachEndKn: number;
  /** The plain wire of the section and the fence. */
  readonly wire: Pick<WireType, 'name' | 'breakingLoadN'>;
  /** Wires held by each end assembly (the fence's wires), a whole number ≥ 1. */
  readonly wireCount: number;
  /** Strain in each fence wire, newtons, ≥ 0. */
  readonly pretensionN: number;
  /** Share of the breaking load a wire may work at, in (0, 1]. */
  readonly safeFractionOfBreaking: number;
}

export interface SectionRelease {
  readonly releaseEachEndKn: number;
  /** Both ends together: the flood load at which the section drops, kN. */
  readonly releaseTotalKn: number;
  /** Mean flow speed at which the drag reaches the release load, m/s (same debris and depth); null when the flood has no drag to scale. */
  readonly releaseVelocityMs: number | null;
  /** The design flood's drag on the section reaches the release load. */
  readonly releasesInDesignFlood: boolean;
  /** The fence's strain on a terminating end assembly: wires × pretension, kN. */
  readonly fenceStrainKn: number;
  /** What an end assembly is built to hold: wires × safe share × breaking load, kN. */
  readonly endAssemblyCapacityKn: number;
  /** Fence strain + release load ≤ what the end assembly holds. */
  readonly endAssemblyHolds: boolean;
  /** The section's wires at their weakest knot, all together, kN: the tie must go before them. */
  readonly sectionWiresAtKnotKn: number;
  /** The tie lets go before the section's knotted wires break: the section gives way where it is meant to. */
  readonly tieGoesFirst: boolean;
  readonly reasons: string[];
  readonly method: string;
}

const METHOD =
  'Drag F = ½ ρ C_d A V² (FEMA P-55 Coastal Construction Manual, 4th ed., Eq. 8.8), so the speed at which the drag reaches the release load is V × √(release ÷ drag at V). ' +
  'Wire breaking loads from the wire table (2.50 mm high-tensile 6650 N: The Press, Christchurch, 18 April 1980); double-loop knot 44 % of wire strength (same report). ' +
  'An end assembly taken as built to hold its wires at the safe share of their breaking load is a judgement, no published source; the release load per end is a design setting (judgement).';

/**
 * Checks a drop-down section's release against the drag formula and the wire data: the speed at
 * which the flood's drag (bare wires + debris mat, as `floodgateLoads` found it at the design
 * speed) reaches the release load of both end ties, whether the design flood gets there, whether
 * each end assembly holds its fence's strain plus the release pull, and whether the ties let go
 * before the section's own wires break at a knot.
 *
 * @param input - see {@link SectionReleaseInput}; not modified
 * @throws RangeError naming any figure out of range
 */
export function checkSectionRelease(input: SectionReleaseInput): SectionRelease {
  if (typeof input !== 'object' || input === null || typeof input.loads !== 'object' || input.loads === null) {
    throw new RangeError('checkSectionRelease needs { loads, releaseEachEndKn, wire, wireCount, pretensionN, safeFractionOfBreaking }');
  }
  const releaseEachEndKn = checkNumber(input.releaseEachEndKn, { name: 'releaseEachEndKn', what: 'the release load at each end', unit: 'kN', min: 0, minExclusive: true });
  const wireCount = checkNumber(input.wireCount, { name: 'wireCount', what: 'the number of wires', min: 1, integer: true });
  const pretensionN = checkNumber(input.pretensionN, { name: 'pretensionN', what: 'the wire strain', unit: 'N', min: 0 });
  const safe = checkNumber(input.safeFractionOfBreaking, { name: 'safeFractionOfBreaking', what: 'the safe share of the breaking load', min: 0, minExclusive: true, max: 1 });
  const breakingN = checkNumber(input.wire?.breakingLoadN, { name: 'wire.breakingLoadN', what: 'the wire breaking load', unit: 'N', min: 0, minExclusive: true });
  const designKn = checkNumber(input.loads.totalKn, { name: 'loads.totalKn', what: 'the drag on the section', unit: 'kN', min: 0 });
  const velocityMs = checkNumber(input.loads.inputs?.velocityMs, { name: 'loads.inputs.velocityMs', what: 'the design speed', unit: 'm/s', min: 0 });

  const releaseTotalKn = 2 * releaseEachEndKn;
  const releaseVelocityMs = designKn > 0 && velocityMs > 0 ? velocityMs * Math.sqrt(releaseTotalKn / designKn) : null;
  const releasesInDesignFlood = designKn >= releaseTotalKn;
  const fenceStrainKn = (wireCount * pretensionN) / 1000;
  const endAssemblyCapacityKn = (wireCount * safe * breakingN) / 1000;
  const endAssemblyHolds = fenceStrainKn + releaseEachEndKn <= endAssemblyCapacityKn;
  const sectionWiresAtKnotKn = (wireCount * WEAKEST_KNOT_SHARE * breakingN) / 1000;
  const tieGoesFirst = releaseEachEndKn < sectionWiresAtKnotKn;
  const kn = (x: number) => `${x.toFixed(2)} kN`;
  const reasons = [
    releasesInDesignFlood
      ? `The design flood drags ${kn(designKn)} on the section, more than the ${kn(releaseTotalKn)} at which its two end ties let go: it drops once the flow passes about ${(releaseVelocityMs ?? 0).toFixed(2)} m/s.`
      : `The design flood drags ${kn(designKn)} on the section, less than the ${kn(releaseTotalKn)} at which its end ties let go${releaseVelocityMs === null ? '' : ` (reached at about ${releaseVelocityMs.toFixed(2)} m/s)`}: it may hang on through the design flood, holding its end assemblies at up to the release load.`,
    endAssemblyHolds
      ? `Each end assembly holds the fence's ${wireCount} wires at ${pretensionN} N (${kn(fenceStrainKn)}) plus the section's pull until release (${kn(releaseEachEndKn)}), within the ${kn(endAssemblyCapacityKn)} it is built for (${wireCount} × ${Math.round(100 * safe)} % of ${input.wire.name}'s ${breakingN} N).`
      : `Each end assembly would carry the fence's strain (${kn(fenceStrainKn)}) plus the section's pull (${kn(releaseEachEndKn)}), more than the ${kn(endAssemblyCapacityKn)} it is built for: lighten the ties or strengthen the end assemblies.`,
    tieGoesFirst
      ? `The ties let go at ${kn(releaseEachEndKn)}, well before the section's wires break at a knot (${wireCount} × 44 % × ${breakingN} N = ${kn(sectionWiresAtKnotKn)}): it gives way where it is meant to.`
      : `The ties are stronger than the section's knotted wires (${kn(sectionWiresAtKnotKn)}): the wire would break somewhere else first. Use lighter ties.`,
  ];
  return { releaseEachEndKn, releaseTotalKn, releaseVelocityMs, releasesInDesignFlood, fenceStrainKn, endAssemblyCapacityKn, endAssemblyHolds, sectionWiresAtKnotKn, tieGoesFirst, reasons, method: METHOD };
}
