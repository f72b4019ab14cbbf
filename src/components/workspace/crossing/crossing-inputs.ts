import { crossingInputsSchema, type DebrisLevel } from '../../../lib/schemas/crossing';
import type { CrossingDetailView, CrossingInputsChange, CrossingStyle } from '../../../lib/schemas/crossing-view';
import { isDesigned } from './is-designed';

/** The crossing inputs typed as numbers; the floodgate style is chosen from a list. */
export type NumberField = 'floodMarkM' | 'channelN' | 'overbankN' | 'runoffCoefficient' | 'aepPercent' | 'freeboardM';

export const NUMBER_FIELDS: { key: NumberField; label: string; hint: string; example: string }[] = [
  { key: 'floodMarkM', label: 'Flood mark (m above the bed)', hint: 'Height of the debris line above the channel bed. An observed mark beats the rainfall estimate.', example: '0.8' },
  { key: 'channelN', label: "Channel roughness (Manning's n)", hint: 'About 0.03 for a clean sandy bed, up to 0.1 or more with heavy scrub.', example: '0.04' },
  { key: 'overbankN', label: "Overbank roughness (Manning's n)", hint: 'The banks and flats beside the channel.', example: '0.035' },
  { key: 'runoffCoefficient', label: 'Runoff coefficient C (0–1)', hint: 'The share of the rain that runs off.', example: '0.3' },
  { key: 'aepPercent', label: 'Design flood chance each year (AEP %)', hint: 'Must be one of the rainfall table’s.', example: '5' },
  { key: 'freeboardM', label: 'Freeboard (m)', hint: 'Extra height above the flood level for the wet zone.', example: '0.3' },
];

/** The form's fields as typed: text for the numbers, so a half-typed value is kept as it is; debris '' is the property's setting. */
export type InputsFormValues = Record<NumberField, string> & { style: CrossingStyle; debris: DebrisLevel | '' };

/** A message for each field that is wrong. */
export type InputsFormErrors = Partial<Record<NumberField | 'style' | 'debris', string>>;

/** The crossing's own inputs as the form shows them, blank where the crossing has none. */
export function formValuesOf(crossing: CrossingDetailView): InputsFormValues {
  const text = (value: number | null | undefined) => (value === null || value === undefined ? '' : String(value));
  return {
    floodMarkM: text(crossing.inputs.floodMarkM),
    channelN: text(crossing.inputs.channelN),
    overbankN: text(crossing.inputs.overbankN),
    runoffCoefficient: text(crossing.inputs.runoffCoefficient),
    aepPercent: text(crossing.inputs.aepPercent),
    freeboardM: text(crossing.inputs.freeboardM),
    style: crossing.inputs.style ?? (isDesigned(crossing.design) ? crossing.design.used?.style : undefined) ?? 'continuous-floodgate',
    debris: crossing.inputs.debris ?? '',
  };
}

/** What the design used where the crossing's own input is blank (the property's settings). */
export function propertyDefaultsOf(crossing: CrossingDetailView): Partial<Record<NumberField | 'debris', string>> & { aepChoices?: number[] } {
  const design = crossing.design;
  const used = isDesigned(design) ? design.used : undefined;
  const floods = design && 'floods' in design ? design.floods : undefined;
  const flood = floods?.fromRainfall?.flood;
  return {
    channelN: used?.channelN?.toString(),
    overbankN: used?.overbankN?.toString(),
    freeboardM: used?.freeboardM?.toString(),
    // With the crossing's own level blank, the design used the property's.
    debris: crossing.inputs.debris ? undefined : used?.debris?.toString(),
    runoffCoefficient: flood?.inputs?.runoffCoefficient?.toString(),
    aepPercent: flood?.aepPercent.toString(),
    aepChoices: flood?.inputs?.ifd?.aepPercent,
  };
}

/**
 * The changes from the values the form started with: a number sets an input, a blank clears it.
 * Fields that are not numbers, or fail the server's checks, come back as errors instead.
 */
export function collectInputChanges(values: InputsFormValues, initial: InputsFormValues): { changes: CrossingInputsChange; errors: InputsFormErrors } {
  const changes: CrossingInputsChange = {};
  const errors: InputsFormErrors = {};
  const numbers: Record<string, number> = {};
  for (const field of NUMBER_FIELDS) {
    const text = values[field.key].trim().replace(',', '.');
    if (text === initial[field.key].trim()) continue;
    if (text === '') {
      changes[field.key] = null;
      continue;
    }
    const value = Number(text);
    if (!Number.isFinite(value)) {
      errors[field.key] = `Enter a number, for example ${field.example}.`;
      continue;
    }
    changes[field.key] = value;
    numbers[field.key] = value;
  }
  if (values.style !== initial.style) changes.style = values.style;
  if (values.debris !== initial.debris) changes.debris = values.debris === '' ? null : values.debris;
  // The same checks as the server, for an answer before the round trip.
  const checked = crossingInputsSchema.safeParse(numbers);
  if (!checked.success) {
    for (const issue of checked.error.issues) {
      const key = String(issue.path[0]) as NumberField;
      errors[key] ??= issue.message;
    }
  }
  return { changes, errors };
}
