/**
 * The fence specification a materials list is counted from, with its defaults.
 */
import { checkFenceWires } from '../design/floodgate-input';
import { checkNumber } from '../design/ground-profile';
import type { WireKind } from '../design/wire-kinds';

/** A fence as built: wires, spacings and the counting allowances. Metres unless named otherwise. */
export interface MaterialsFenceSpec {
  /** Height of each wire above ground, bottom to top, metres. */
  readonly wireHeightsM: readonly number[];
  /** Kind of each wire, same order. */
  readonly wireKinds: readonly WireKind[];
  /** Length of wire in one roll (coil) of each kind, metres: e.g. 648 m for a 25 kg coil of 2.50 mm high-tensile plain, 253 m for 4.00 mm mild steel (NZ AEI test reported in The Press, 1980). */
  readonly rollLengthM: Readonly<Record<WireKind, number>>;
  /** Largest distance between ordinary line posts, metres. */
  readonly postSpacingM: number;
  /** Largest distance between droppers (and posts), metres; null for no droppers between posts. */
  readonly dropperSpacingM: number | null;
  /**
   * Largest run between strainer assemblies on a long straight, metres. Default 400 m: common
   * practice, no published source (the conservative end of what fencers use on open flat
   * country; the UK floodplain specification's 50 m is for high-risk floodplain sites only).
   */
  readonly strainerIntervalM?: number;
  /**
   * A vertex turning the fence by more than this gets a corner strainer assembly, degrees.
   * Default 10°: common practice and judgement, no published source (a line post cannot hold the
   * sideways pull of strained wire round a sharper bend).
   */
  readonly cornerDeflectionDeg?: number;
  /** Extra wire for tie-offs at strainers, joins and waste, as a fraction of the run. Default 0.05: judgement. */
  readonly wireAllowanceFraction?: number;
  /** Tie wire per tie (a hung dropper tied to a wire), metres. Default 0.5 m: judgement, for a firm double wrap. */
  readonly tieLengthM?: number;
  /** Diameter of the tie wire, mm, for its mass (steel 7850 kg/m³). Default 1.6 mm: a common galvanised tie wire (judgement). */
  readonly tieWireDiameterMm?: number;
}

/** {@link MaterialsFenceSpec} with every default filled in. */
export type ResolvedFenceSpec = Required<MaterialsFenceSpec>;

/** The defaults of the optional fields of {@link MaterialsFenceSpec}, justified on each field. */
export const FENCE_SPEC_DEFAULTS = Object.freeze({
  strainerIntervalM: 400,
  cornerDeflectionDeg: 10,
  wireAllowanceFraction: 0.05,
  tieLengthM: 0.5,
  tieWireDiameterMm: 1.6,
});

/**
 * Fills the defaults and checks every field.
 *
 * @throws RangeError naming the field and what was expected
 */
export function resolveFenceSpec(fence: MaterialsFenceSpec): ResolvedFenceSpec {
  checkFenceWires(fence);
  if (typeof fence.rollLengthM !== 'object' || fence.rollLengthM === null) {
    throw new RangeError('fence.rollLengthM must give the metres in one roll of each wire kind, e.g. { plain: 648, barbed: 402 }');
  }
  for (const kind of new Set(fence.wireKinds)) checkNumber(fence.rollLengthM[kind], `fence.rollLengthM.${kind}`, 1, 100_000, 'm');
  checkNumber(fence.postSpacingM, 'fence.postSpacingM', 0.5, 50, 'm');
  if (fence.dropperSpacingM !== null) checkNumber(fence.dropperSpacingM, 'fence.dropperSpacingM', 0.2, 50, 'm (or null for none)');
  const defined = Object.fromEntries(Object.entries(fence).filter(([, v]) => v !== undefined));
  const spec = { ...FENCE_SPEC_DEFAULTS, ...defined } as ResolvedFenceSpec;
  checkNumber(spec.strainerIntervalM, 'fence.strainerIntervalM', 10, 10_000, 'm');
  checkNumber(spec.cornerDeflectionDeg, 'fence.cornerDeflectionDeg', 0, 180, 'degrees');
  checkNumber(spec.wireAllowanceFraction, 'fence.wireAllowanceFraction', 0, 1, '');
  checkNumber(spec.tieLengthM, 'fence.tieLengthM', 0, 5, 'm');
  checkNumber(spec.tieWireDiameterMm, 'fence.tieWireDiameterMm', 0.5, 6, 'mm');
  return spec;
}
