/**
 * Which way to build a crossing by default: a continuous swinging floodgate or a separate
 * drop-down section, from the design flood and the debris it is expected to carry.
 */
import type { FloodgateStyle } from './floodgate-input';

/** How much timber and grass a flood is expected to bring down to the crossing. */
export type DebrisLevel = 'light' | 'moderate' | 'heavy';

/** The thresholds of the rule; past any one of them the drop-down section is the default. */
export interface StyleThresholds {
  /** Wet zone wider than this, metres. */
  readonly dropDownWidthM: number;
  /** Flood deeper than this at the deepest point, metres. */
  readonly dropDownDepthM: number;
  /** Mean flood velocity faster than this, m/s. */
  readonly dropDownVelocityMs: number;
  /** Expected debris at or above this level. */
  readonly dropDownDebris: 'moderate' | 'heavy';
}

export interface ChooseStyleInput {
  /** Width of the wet zone along the fence (flood level + freeboard), metres, ≥ 0. */
  readonly wetZoneWidthM: number;
  /** Design flood depth at the deepest point, metres, ≥ 0. */
  readonly maxDepthM: number;
  /** Mean velocity of the design flood, m/s, ≥ 0. */
  readonly velocityMs: number;
  readonly debris: DebrisLevel;
  /** The style the planner chose for this crossing, if any: it wins over the rule. */
  readonly plannerStyle?: FloodgateStyle | undefined;
  readonly thresholds: StyleThresholds;
}

export interface StyleChoice {
  /** The style the crossing is designed in. */
  readonly style: FloodgateStyle;
  /** The planner named the style, or the rule chose it. */
  readonly chosenBy: 'planner' | 'rule';
  /** What the rule recommends, whoever chose. */
  readonly recommended: FloodgateStyle;
  /** Why the rule recommends it, in plain words (and a line when the planner chose otherwise). */
  readonly reasons: string[];
  readonly thresholds: StyleThresholds;
  readonly basis: string;
}

/** Figures within this of a threshold count as at it: rounding in the flood figures must not flip the style. */
const TOLERANCE = 1e-6;

const DEBRIS_RANK: Record<DebrisLevel, number> = { light: 0, moderate: 1, heavy: 2 };
const LABEL: Record<FloodgateStyle, string> = { 'continuous-floodgate': 'continuous floodgate', 'drop-down-section': 'drop-down section' };

const BASIS =
  'The thresholds are common practice and judgement, no published source; each is a design setting. The drop-down section on its own end assemblies is the approach of NSW DPI Primefact 681 "Building a floodgate" (2009) and WA Water and Rivers Commission Water Note WN19 (2000).';

/**
 * Chooses the default style by a stated rule: a **drop-down section** when the flood is wide,
 * deep, fast or heavy with debris — any one threshold passed — and a **continuous floodgate**
 * otherwise. Why: a continuous floodgate's wires run through to its end strainers, so a wide
 * floodgate needs long flex runs (about 2.5 times its length each side) and a deep or fast,
 * debris-laden flood loads the strainers heavily; a separate section lets go instead and only it
 * is lost (NSW DPI Primefact 681, 2009). Below all thresholds the continuous floodgate wins: after
 * most floods only its breakaway tie needs re-setting. The rule is monotonic: raising the width,
 * depth, velocity or debris never moves the choice from drop-down back to continuous.
 * When the planner named a style, that style is used and recorded as chosen by the planner.
 *
 * @param input - see {@link ChooseStyleInput}; not modified
 * @throws RangeError when a figure is negative or not finite, or the debris level is unknown
 */
export function chooseStyle(input: ChooseStyleInput): StyleChoice {
  const check = (value: number, name: string, unit: string) => {
    if (!(Number.isFinite(value) && value >= 0)) throw new RangeError(`${name} must be a number of ${unit} at least 0, got ${String(value)}`);
    return value;
  };
  const width = check(input.wetZoneWidthM, 'wetZoneWidthM', 'metres');
  const depth = check(input.maxDepthM, 'maxDepthM', 'metres');
  const velocity = check(input.velocityMs, 'velocityMs', 'm/s');
  if (!(input.debris in DEBRIS_RANK)) throw new RangeError(`debris must be 'light', 'moderate' or 'heavy', got ${String(input.debris)}`);
  const t = input.thresholds;
  check(t.dropDownWidthM, 'thresholds.dropDownWidthM', 'metres');
  check(t.dropDownDepthM, 'thresholds.dropDownDepthM', 'metres');
  check(t.dropDownVelocityMs, 'thresholds.dropDownVelocityMs', 'm/s');
  if (!(t.dropDownDebris in DEBRIS_RANK)) throw new RangeError(`thresholds.dropDownDebris must be 'moderate' or 'heavy', got ${String(t.dropDownDebris)}`);

  const passed: string[] = [];
  if (width > t.dropDownWidthM + TOLERANCE) passed.push(`the wet zone is ${width.toFixed(1)} m wide, more than ${t.dropDownWidthM} m: a continuous floodgate that long needs flex runs of about ${Math.round(2.5 * width)} m each side and heavy end strainers`);
  if (depth > t.dropDownDepthM + TOLERANCE) passed.push(`the flood is ${depth.toFixed(2)} m deep, more than ${t.dropDownDepthM} m: deep water floats a big debris mat against the wires`);
  if (velocity > t.dropDownVelocityMs + TOLERANCE) passed.push(`the flood runs at ${velocity.toFixed(2)} m/s, faster than ${t.dropDownVelocityMs} m/s: drag grows with the square of the speed`);
  if (DEBRIS_RANK[input.debris] >= DEBRIS_RANK[t.dropDownDebris]) passed.push(`${input.debris} debris is expected (the rule switches at ${t.dropDownDebris}): a debris mat, not the wire, carries most of the load`);

  const recommended: FloodgateStyle = passed.length > 0 ? 'drop-down-section' : 'continuous-floodgate';
  const reasons =
    recommended === 'drop-down-section'
      ? [
          `A drop-down section is recommended because ${passed.join('; and ')}.`,
          'With a separate section the fence ends on its own end assemblies each side, so the flood never loads the main fence: only the light section drops and is re-hung afterwards.',
        ]
      : [
          `A continuous floodgate is recommended: the wet zone (${width.toFixed(1)} m), depth (${depth.toFixed(2)} m), velocity (${velocity.toFixed(2)} m/s) and ${input.debris} debris are all within the rule's limits (${t.dropDownWidthM} m, ${t.dropDownDepthM} m, ${t.dropDownVelocityMs} m/s, below ${t.dropDownDebris} debris).`,
          'After most floods only its breakaway tie needs re-setting, and stock stay held meanwhile.',
        ];
  const planner = input.plannerStyle;
  if (planner !== undefined && planner !== 'continuous-floodgate' && planner !== 'drop-down-section') {
    throw new RangeError(`plannerStyle must be 'continuous-floodgate' or 'drop-down-section', got ${String(planner)}`);
  }
  if (planner !== undefined) {
    reasons.push(planner === recommended ? `The planner chose the ${LABEL[planner]} too.` : `Chosen by the planner: the ${LABEL[planner]}, over the rule's ${LABEL[recommended]}.`);
  }
  return { style: planner ?? recommended, chosenBy: planner ? 'planner' : 'rule', recommended, reasons, thresholds: { ...t }, basis: BASIS };
}
