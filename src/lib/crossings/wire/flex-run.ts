/**
 * The flex run a floodgate needs either side, by wire stretch and by the fencers' rule of thumb.
 */
import { checkNumber } from './check-number';
import { checkFloodgateWire, type FloodgateWireInput } from './floodgate-wire-input';
import { WIRE_TENSION_METHOD, wireTensionAfterDeflection } from './wire-tension';

/** The floodgate, its wire and the flood deflection to design for. */
export interface FlexRunInput extends FloodgateWireInput {
  /**
   * Shortest flex run each side whatever the stretch says, metres, ≥ 0. Default
   * max(50, 2.5 × span): a ~20 m floodgate wants at least ~50 m each side, longer ones
   * proportionally more (common practice, no published source).
   */
  readonly ruleOfThumbMinimumM?: number;
}

/** The flex run each side and the working behind it. Lengths in metres, forces in newtons. */
export interface FlexRun {
  /** The larger of the wire-stretch and rule-of-thumb runs. */
  readonly flexRunEachSideM: number;
  readonly governedBy: 'rule of thumb' | 'wire stretch';
  /** Shortest run keeping the wire within its allowed tension (0 when the span alone suffices). */
  readonly wireStretchFlexRunM: number;
  readonly ruleOfThumbMinimumM: number;
  /** Wire the deflected span needs beyond its straight length. */
  readonly extraLengthM: number;
  /** Tension rise with the returned flex run. */
  readonly tensionIncreaseN: number;
  /** Pretension + rise with the returned flex run; ≤ allowedTensionN. */
  readonly totalTensionN: number;
  readonly allowedTensionN: number;
  /** The working in plain words. */
  readonly reasons: readonly string[];
  /** The inputs as used (wire by id, the rule-of-thumb minimum resolved). */
  readonly inputs: {
    readonly floodgateSpanM: number;
    readonly deflectionM: number;
    readonly wireId: string;
    readonly pretensionN: number;
    readonly safeFractionOfBreaking: number;
    readonly ruleOfThumbMinimumM: number;
  };
  readonly method: string;
}

/**
 * The shortest flex run each side of a floodgate that lets the flood push its wire `deflectionM`
 * downstream at mid-span without the wire passing its allowed tension, and not shorter than the
 * rule of thumb.
 *
 * The deflected span needs Δ = L(l, f) − l more wire (exact parabola arc length, Beer & Johnston,
 * *Vector Mechanics for Engineers: Statics*, cables). The span and both flex runs stretch to supply
 * it, ΔT = E·A·Δ / (l + 2·flex) (Hooke's law), so T0 + ΔT ≤ allowed when
 * flex ≥ (E·A·Δ / (allowed − T0) − l) / 2. The result is the larger of that (at least 0) and the
 * rule-of-thumb minimum (default max(50 m, 2.5 × span), common practice, no published source).
 *
 * At a fixed deflection a longer span needs less extra wire (Δ ≈ 8f²/3l), so the wire-stretch run
 * can shorten as the span grows; at a fixed deflection-to-span ratio it never does.
 *
 * @param input - see {@link FlexRunInput}; not modified
 * @returns the flex run each side and its working, see {@link FlexRun}
 * @throws RangeError for a non-positive span, a deflection outside [0, span), an unknown wire id,
 *   a negative pretension or minimum, a safe fraction outside (0, 1], or a pretension already at
 *   or above the allowed tension
 */
export function requiredFlexRun(input: FlexRunInput): FlexRun {
  const w = checkFloodgateWire(input);
  const ruleOfThumbMinimumM =
    input.ruleOfThumbMinimumM === undefined
      ? Math.max(50, 2.5 * w.spanM)
      : checkNumber(input.ruleOfThumbMinimumM, {
          name: 'ruleOfThumbMinimumM', what: 'the shortest flex run to accept', unit: 'm', min: 0,
        });
  const kN = (n: number): string => `${(n / 1000).toFixed(2)} kN`;
  const marginN = w.allowedTensionN - w.pretensionN;
  if (!(marginN > 0)) {
    throw new RangeError(
      `pretensionN: the wire is strained to ${kN(w.pretensionN)}, already at or above the ${kN(w.allowedTensionN)} allowed ` +
        `(${w.safeFraction} × its ${kN(w.wire.breakingLoadN)} breaking load), so no flex run is long enough. ` +
        'Strain the wire less, choose a stronger wire, or allow a larger share of the breaking load.',
    );
  }
  const wireStretchFlexRunM = Math.max(0, ((w.axialStiffnessN * w.extraLengthM) / marginN - w.spanM) / 2);
  const governedBy = wireStretchFlexRunM > ruleOfThumbMinimumM ? 'wire stretch' : 'rule of thumb';
  const flexRunEachSideM = Math.max(wireStretchFlexRunM, ruleOfThumbMinimumM);
  const check = wireTensionAfterDeflection({ ...input, wire: w.wire, flexRunEachSideM });

  const stretchReason =
    wireStretchFlexRunM === 0
      ? `The floodgate span alone stretches enough to supply it, so wire stretch asks for no flex run.`
      : `To keep the wire within ${kN(w.allowedTensionN)} (${w.safeFraction} × its ${kN(w.wire.breakingLoadN)} breaking load), strained to ${kN(w.pretensionN)}, the stretch must be shared by at least ${wireStretchFlexRunM.toFixed(1)} m of flex run each side.`;
  const reasons = [
    check.reasons[0]!,
    stretchReason,
    `Rule of thumb (common practice, no published source): at least ${ruleOfThumbMinimumM.toFixed(1)} m of flex run each side${
      input.ruleOfThumbMinimumM === undefined ? ' (50 m, or 2.5 × the span for longer floodgates)' : ''
    }.`,
    governedBy === 'wire stretch'
      ? `Wire stretch governs: build ${flexRunEachSideM.toFixed(1)} m of flex run each side.`
      : `The rule of thumb governs: build ${flexRunEachSideM.toFixed(1)} m of flex run each side.`,
    `With that, the wire reaches ${kN(check.totalTensionN)} when pushed ${w.deflectionM.toFixed(2)} m downstream.`,
  ];
  return {
    flexRunEachSideM,
    governedBy,
    wireStretchFlexRunM,
    ruleOfThumbMinimumM,
    extraLengthM: w.extraLengthM,
    tensionIncreaseN: check.tensionIncreaseN,
    totalTensionN: check.totalTensionN,
    allowedTensionN: w.allowedTensionN,
    reasons,
    inputs: {
      floodgateSpanM: w.spanM,
      deflectionM: w.deflectionM,
      wireId: w.wire.id,
      pretensionN: w.pretensionN,
      safeFractionOfBreaking: w.safeFraction,
      ruleOfThumbMinimumM,
    },
    method: `${WIRE_TENSION_METHOD} Minimum flex run: max(50 m, 2.5 × span) unless set by the user, common practice, no published source.`,
  };
}
