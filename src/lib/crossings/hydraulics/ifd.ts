import { HydraulicsInputError } from './input-error';

/**
 * An intensity–frequency–duration table for a property, as a person enters it from the Bureau of
 * Meteorology's design rainfall data: `intensitiesMmH[a][d]` is the intensity (mm/h) of the storm
 * of annual exceedance probability `aepPercent[a]` (per cent) lasting `durationsMin[d]` (minutes).
 */
export interface IfdTable {
  readonly aepPercent: readonly number[];
  readonly durationsMin: readonly number[];
  readonly intensitiesMmH: readonly (readonly number[])[];
}

// The table may come from anywhere (a form, a file): a value that is not a number is shown as typed.
const fmt = (value: number): string => (typeof value === 'number' ? String(Number(value.toPrecision(6))) : JSON.stringify(value) ?? String(value));

/**
 * The problems of an IFD table, in words a person can act on; empty when it can be used.
 * Checks: at least one AEP and two durations; AEPs above 0 and below 100 % without repeats;
 * durations above 0 and strictly increasing; one row of intensities per AEP and one value per
 * duration, each a number above 0; intensity falling as duration grows, and rising as the AEP
 * gets rarer (both hold for every real IFD table; a breach is a typing slip).
 *
 * @param table - the table; not modified
 * @returns the problems, each a sentence
 */
export function validateIfdTable(table: IfdTable): string[] {
  const problems: string[] = [];
  const { aepPercent, durationsMin, intensitiesMmH } = (table ?? {}) as Partial<IfdTable>;
  if (!Array.isArray(aepPercent) || !Array.isArray(durationsMin) || !Array.isArray(intensitiesMmH)) {
    return ['The IFD table needs `aepPercent`, `durationsMin` and `intensitiesMmH` lists.'];
  }
  if (aepPercent.length === 0) problems.push('The IFD table has no AEPs; enter at least one (e.g. 1 %).');
  if (durationsMin.length < 2) problems.push('The IFD table needs at least two durations to interpolate between.');
  aepPercent.forEach((aep, a) => {
    if (!Number.isFinite(aep) || aep <= 0 || aep >= 100)
      problems.push(`AEP ${a + 1} (${aep}) must be a per cent above 0 and below 100.`);
    else if (aepPercent.indexOf(aep) !== a) problems.push(`AEP ${fmt(aep)} % appears more than once.`);
  });
  durationsMin.forEach((duration, d) => {
    if (!Number.isFinite(duration) || duration <= 0)
      problems.push(`Duration ${d + 1} (${duration}) must be a number of minutes above 0.`);
    else if (d > 0 && !(duration > durationsMin[d - 1]!)) {
      problems.push(`Durations must increase: ${fmt(duration)} min comes after ${durationsMin[d - 1]} min.`);
    }
  });
  if (intensitiesMmH.length !== aepPercent.length) {
    problems.push(`There are ${aepPercent.length} AEPs but ${intensitiesMmH.length} rows of intensities; give one row per AEP.`);
    return problems;
  }
  intensitiesMmH.forEach((row, a) => {
    const label = `AEP ${fmt(aepPercent[a]!)} %`;
    if (!Array.isArray(row) || row.length !== durationsMin.length) {
      problems.push(`The row for ${label} must hold ${durationsMin.length} intensities, one per duration.`);
      return;
    }
    row.forEach((value, d) => {
      if (!Number.isFinite(value) || value <= 0)
        problems.push(`${label}, ${durationsMin[d]} min: the intensity must be a number of mm/h above 0.`);
      else if (d > 0 && Number.isFinite(row[d - 1]!) && !(value < row[d - 1]!)) {
        problems.push(
          `${label}: the intensity should fall as the duration grows, but ${durationsMin[d]} min (${value} mm/h) is not below ${durationsMin[d - 1]} min (${row[d - 1]} mm/h).`,
        );
      }
    });
  });
  if (problems.length === 0) {
    // A rarer storm (smaller AEP) is more intense at every duration.
    const order = aepPercent.map((aep, a) => [aep, a] as const).sort((p, q) => q[0] - p[0]);
    for (let k = 1; k < order.length; k++) {
      const [commoner, c] = order[k - 1]!;
      const [rarer, r] = order[k]!;
      durationsMin.forEach((duration, d) => {
        if (!(intensitiesMmH[r]![d]! > intensitiesMmH[c]![d]!)) {
          problems.push(
            `At ${duration} min the ${fmt(rarer)} % AEP intensity should exceed the ${fmt(commoner)} % AEP intensity.`,
          );
        }
      });
    }
  }
  return problems;
}

/**
 * Rainfall intensity (mm/h) for a duration and AEP from a property's IFD table. Between tabulated
 * durations the intensity is interpolated linearly in log(intensity) against log(duration): IFD
 * curves are close to straight lines on log–log axes, as Australian Rainfall and Runoff 1987,
 * Book II, draws them (from memory). No interpolation between AEPs: the AEP must be one of the
 * table's, since no cited method for it is applied here. Durations outside the table are refused
 * rather than extrapolated.
 *
 * @param table - the property's IFD table; not modified
 * @param durationMin - storm duration, minutes (for the Rational method, the time of concentration)
 * @param aepPercent - annual exceedance probability, per cent (1 means 1 % AEP)
 * @returns intensity, mm/h
 * @throws HydraulicsInputError when the table has problems ({@link validateIfdTable}), the AEP is
 *   not in it, or the duration lies outside its range
 */
export function rainfallIntensity(table: IfdTable, durationMin: number, aepPercent: number): number {
  const problems = validateIfdTable(table);
  if (problems.length > 0) throw new HydraulicsInputError('ifd', `The IFD table cannot be used: ${problems.join(' ')}`);
  const a = table.aepPercent.findIndex((aep) => Math.abs(aep - aepPercent) <= 1e-9 * Math.max(1, aep));
  if (a < 0) {
    throw new HydraulicsInputError(
      'aepPercent',
      `AEP ${fmt(aepPercent)} % is not in the property's IFD table (it has ${[...table.aepPercent]
        .sort((p, q) => q - p)
        .map(fmt)
        .join(', ')} %).`,
    );
  }
  const durations = table.durationsMin;
  const first = durations[0]!;
  const last = durations[durations.length - 1]!;
  if (!Number.isFinite(durationMin) || durationMin < first || durationMin > last) {
    throw new HydraulicsInputError(
      'durationMin',
      `A duration of ${fmt(durationMin)} min is outside the property's IFD table (${fmt(first)}–${fmt(last)} min); add durations that cover it.`,
    );
  }
  const row = table.intensitiesMmH[a]!;
  let d = 0;
  while (d + 2 < durations.length && durationMin > durations[d + 1]!) d++;
  const t0 = durations[d]!;
  const t1 = durations[d + 1]!;
  if (durationMin === t0) return row[d]!;
  if (durationMin === t1) return row[d + 1]!;
  const f = Math.log(durationMin / t0) / Math.log(t1 / t0);
  return Math.exp(Math.log(row[d]!) + f * Math.log(row[d + 1]! / row[d]!));
}
