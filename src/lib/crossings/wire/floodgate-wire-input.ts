/**
 * The entry check shared by the floodgate wire calculations (`wireTensionAfterDeflection`
 * and `requiredFlexRun`): one place for the rules and their messages.
 */
import { checkNumber } from './check-number';
import { parabolaExtraLengthM } from './parabola-extra-length';
import { findWireType, type WireType } from './wire-types';

/** A floodgate's wire pushed downstream in a flood. */
export interface FloodgateWireInput {
  /** Distance between the floodgate's end strainers, metres, > 0. */
  readonly floodgateSpanM: number;
  /** How far the wire is pushed downstream at mid-span, metres, ≥ 0 and less than the span. */
  readonly deflectionM: number;
  /** A wire type or its id in `WIRE_TYPES`. */
  readonly wire: WireType | string;
  /** Tension the wire was strained to, newtons, ≥ 0. */
  readonly pretensionN: number;
  /** Share of the breaking load the wire may reach, > 0 and ≤ 1 (e.g. 0.5). */
  readonly safeFractionOfBreaking: number;
}

/** The checked input and the quantities every floodgate wire calculation needs. */
export interface CheckedFloodgateWire {
  readonly spanM: number;
  readonly deflectionM: number;
  readonly wire: WireType;
  readonly pretensionN: number;
  readonly safeFraction: number;
  /** safeFraction × breaking load, newtons. */
  readonly allowedTensionN: number;
  /** E·A of the wire, newtons (E in Pa × A in m²). */
  readonly axialStiffnessN: number;
  /** Wire the deflected span needs beyond the span: exact parabola length − span, metres. */
  readonly extraLengthM: number;
}

/**
 * Checks a floodgate wire input and derives the allowed tension, E·A and the extra length.
 *
 * @param input - see {@link FloodgateWireInput}; not modified
 * @returns the checked values and derived quantities (SI: m, N)
 * @throws RangeError with a message naming the input, what was expected and what was given
 */
export function checkFloodgateWire(input: FloodgateWireInput): CheckedFloodgateWire {
  if (typeof input !== 'object' || input === null) {
    throw new TypeError('expected an object with floodgateSpanM, deflectionM, wire, pretensionN and safeFractionOfBreaking.');
  }
  const spanM = checkNumber(input.floodgateSpanM, {
    name: 'floodgateSpanM', what: 'the floodgate span (end strainer to end strainer)', unit: 'm', min: 0, minExclusive: true,
  });
  const deflectionM = checkNumber(input.deflectionM, {
    name: 'deflectionM', what: 'the mid-span deflection', unit: 'm', min: 0, max: spanM, maxExclusive: true,
    hint: 'A strained wire pushed downstream as far as its span is long has torn out, not deflected; check the units (metres).',
  });
  const wire = typeof input.wire === 'string' ? findWireType(input.wire) : checkWire(input.wire);
  const pretensionN = checkNumber(input.pretensionN, {
    name: 'pretensionN', what: 'the tension the wire is strained to', unit: 'N', min: 0,
    hint: 'Give newtons: 1 kN is 1000 N.',
  });
  const safeFraction = checkNumber(input.safeFractionOfBreaking, {
    name: 'safeFractionOfBreaking', what: 'the share of the breaking load the wire may reach', min: 0, minExclusive: true, max: 1,
    hint: 'Give a fraction, e.g. 0.5 for half the breaking load, not a percentage.',
  });
  return {
    spanM,
    deflectionM,
    wire,
    pretensionN,
    safeFraction,
    allowedTensionN: safeFraction * wire.breakingLoadN,
    axialStiffnessN: wire.modulusGPa * 1e9 * wire.crossSectionAreaMm2 * 1e-6,
    extraLengthM: parabolaExtraLengthM(spanM, deflectionM),
  };
}

/** A wire given as an object must carry the figures the calculation uses. */
function checkWire(wire: WireType): WireType {
  if (typeof wire !== 'object' || wire === null) {
    throw new TypeError('wire: give a wire type id (e.g. "ht-2.50-plain") or a wire type from WIRE_TYPES.');
  }
  const what = `wire "${String(wire.id)}"`;
  checkNumber(wire.breakingLoadN, { name: 'wire.breakingLoadN', what: `the breaking load of ${what}`, unit: 'N', min: 0, minExclusive: true });
  checkNumber(wire.crossSectionAreaMm2, { name: 'wire.crossSectionAreaMm2', what: `the steel area of ${what}`, unit: 'mm²', min: 0, minExclusive: true });
  checkNumber(wire.modulusGPa, { name: 'wire.modulusGPa', what: `the modulus of ${what}`, unit: 'GPa', min: 0, minExclusive: true });
  return wire;
}
