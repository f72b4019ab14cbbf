/**
 * Entry checks for the numeric inputs of the wire and load calculations, with messages a person
 * can act on: which input, what it is, what was expected, what was given.
 */

/** The values a numeric input may take, for {@link checkNumber}. */
export interface NumberRule {
  /** The input's name as the caller wrote it, e.g. `floodgateSpanM`. */
  readonly name: string;
  /** What it is in plain words, e.g. `the floodgate span`. */
  readonly what: string;
  /** Unit written after the bounds, e.g. `m`; omit for a plain ratio. */
  readonly unit?: string;
  readonly min?: number;
  /** True when `min` itself is not allowed (the value must be more than `min`). */
  readonly minExclusive?: boolean;
  readonly max?: number;
  /** True when `max` itself is not allowed (the value must be less than `max`). */
  readonly maxExclusive?: boolean;
  /** True for a count (a whole number). */
  readonly integer?: boolean;
  /** A sentence added to the message, e.g. how to convert a common mistake. */
  readonly hint?: string;
}

/**
 * Checks that `value` is a finite number within the rule's bounds and returns it.
 *
 * @param value - the input as given; not modified
 * @param rule - its name, plain-words description, unit and bounds
 * @returns the value, typed as a number
 * @throws RangeError naming the input, the allowed range and the value given
 */
export function checkNumber(value: unknown, rule: NumberRule): number {
  const ok =
    typeof value === 'number' &&
    Number.isFinite(value) &&
    (!rule.integer || Number.isInteger(value)) &&
    (rule.min === undefined || (rule.minExclusive ? value > rule.min : value >= rule.min)) &&
    (rule.max === undefined || (rule.maxExclusive ? value < rule.max : value <= rule.max));
  if (ok) return value;
  const unit = rule.unit ? ` ${rule.unit}` : '';
  const bounds: string[] = [];
  if (rule.min !== undefined) bounds.push(`${rule.minExclusive ? 'more than' : 'at least'} ${rule.min}${unit}`);
  if (rule.max !== undefined) bounds.push(`${rule.maxExclusive ? 'less than' : 'at most'} ${rule.max}${unit}`);
  const kind = rule.integer ? 'a whole number' : 'a number';
  const range = bounds.length > 0 ? `${kind} ${bounds.join(' and ')}` : `a finite number${unit ? ` of${unit}` : ''}`;
  const given = typeof value === 'string' ? `"${value}"` : String(value);
  const hint = rule.hint ? ` ${rule.hint}` : '';
  throw new RangeError(`${rule.name}: ${rule.what} must be ${range}, got ${given}.${hint}`);
}
