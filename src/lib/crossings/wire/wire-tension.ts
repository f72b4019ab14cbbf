/**
 * The tension in a floodgate wire pushed downstream, for a given flex run either side.
 */
import { checkNumber } from './check-number';
import { checkFloodgateWire, type FloodgateWireInput } from './floodgate-wire-input';

/** A floodgate wire pushed downstream, with the flex run built either side. */
export interface WireTensionInput extends FloodgateWireInput {
  /** Strained wire from each end strainer to the next strainer away from the crossing, metres, ≥ 0. */
  readonly flexRunEachSideM: number;
}

/** The tension check for the crossing panel. Lengths in metres, forces in newtons. */
export interface WireTensionCheck {
  /** Wire the deflected span needs beyond its straight length. */
  readonly extraLengthM: number;
  /** Wire that stretches to supply it: span + 2 × flex run. */
  readonly strainedLengthM: number;
  /** E·A of the wire. */
  readonly axialStiffnessN: number;
  readonly tensionIncreaseN: number;
  /** Pretension + increase. */
  readonly totalTensionN: number;
  readonly allowedTensionN: number;
  readonly breakingLoadN: number;
  /** totalTensionN ÷ breakingLoadN. */
  readonly fractionOfBreaking: number;
  readonly withinAllowed: boolean;
  /** The working in plain words. */
  readonly reasons: readonly string[];
  readonly method: string;
}

/** Sources of the method, shown with the result. */
export const WIRE_TENSION_METHOD =
  'Extra length: exact arc length of a parabola (Beer & Johnston, Vector Mechanics for Engineers: Statics, cables). ' +
  'Stretch: Hooke\'s law ΔT = E·A·Δ / L over the whole strained length, E = 200 GPa for steel (from memory). ' +
  'Assumes the wire runs free through the posts and droppers of the flex runs, the end strainers do not move, and the wire stays below its yield point.';

/**
 * Tension in a floodgate wire when the flood pushes it `deflectionM` downstream at mid-span.
 *
 * The deflected span needs Δ = L(l, f) − l more wire (exact parabola arc length). The wire is
 * continuous through the end strainers, so the span and both flex runs stretch together to supply
 * it: ΔT = E·A·Δ / (l + 2·flex) (Hooke's law). Total tension T = T0 + ΔT, compared with the
 * allowed tension (safe fraction × breaking load).
 *
 * @param input - see {@link WireTensionInput}; not modified
 * @returns the check, see {@link WireTensionCheck}
 * @throws RangeError for a non-positive span, a deflection outside [0, span), an unknown wire id,
 *   a negative pretension or flex run, or a safe fraction outside (0, 1]
 */
export function wireTensionAfterDeflection(input: WireTensionInput): WireTensionCheck {
  const w = checkFloodgateWire(input);
  const flexM = checkNumber(input.flexRunEachSideM, {
    name: 'flexRunEachSideM', what: 'the flex run each side of the floodgate', unit: 'm', min: 0,
  });
  const strainedLengthM = w.spanM + 2 * flexM;
  const tensionIncreaseN = (w.axialStiffnessN * w.extraLengthM) / strainedLengthM;
  const totalTensionN = w.pretensionN + tensionIncreaseN;
  const withinAllowed = totalTensionN <= w.allowedTensionN;
  const kN = (n: number): string => `${(n / 1000).toFixed(2)} kN`;
  const reasons = [
    `Pushed ${w.deflectionM.toFixed(2)} m downstream at mid-span, the ${w.spanM.toFixed(1)} m floodgate wire needs ${w.extraLengthM.toFixed(3)} m more wire.`,
    `That wire comes from stretching ${strainedLengthM.toFixed(1)} m of strained ${w.wire.name} (the floodgate plus ${flexM.toFixed(1)} m of flex run each side), which raises its tension by ${kN(tensionIncreaseN)}.`,
    `Strained to ${kN(w.pretensionN)}, the wire then carries ${kN(totalTensionN)}, ${(100 * (totalTensionN / w.wire.breakingLoadN)).toFixed(0)} % of its ${kN(w.wire.breakingLoadN)} breaking load.`,
    withinAllowed
      ? `That is within the ${kN(w.allowedTensionN)} allowed (${(100 * w.safeFraction).toFixed(0)} % of the breaking load).`
      : `That is more than the ${kN(w.allowedTensionN)} allowed (${(100 * w.safeFraction).toFixed(0)} % of the breaking load): lengthen the flex runs, strain the wire less, or let the floodgate release sooner.`,
  ];
  return {
    extraLengthM: w.extraLengthM,
    strainedLengthM,
    axialStiffnessN: w.axialStiffnessN,
    tensionIncreaseN,
    totalTensionN,
    allowedTensionN: w.allowedTensionN,
    breakingLoadN: w.wire.breakingLoadN,
    fractionOfBreaking: totalTensionN / w.wire.breakingLoadN,
    withinAllowed,
    reasons,
    method: WIRE_TENSION_METHOD,
  };
}
