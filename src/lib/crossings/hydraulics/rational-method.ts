import { HydraulicsInputError } from './input-error';

/** Inputs of {@link rationalPeakDischarge}: the catchment area in km² or in hectares (one of them). */
export type RationalInputs = {
  /** Runoff coefficient C, dimensionless, in (0, 1]. */
  readonly runoffCoefficient: number;
  /** Average rainfall intensity over the time of concentration, mm/h. */
  readonly intensityMmH: number;
} & ({ readonly areaKm2: number; readonly areaHa?: undefined } | { readonly areaHa: number; readonly areaKm2?: undefined });

/**
 * Peak discharge by the Rational method, Q = C·I·A / 3.6 with Q in m³/s, I in mm/h and A in km²
 * (equivalently C·I·A / 360 with A in hectares): 1 mm/h falling on 1 km² is 1000 m³ per hour,
 * 0.2778 m³/s. The SI convention as in V. M. Ponce, Engineering Hydrology (SDSU), and Australian
 * Rainfall and Runoff 1987, Book IV. For ungauged rural catchments ARR 2016/2019 replaced it with
 * regional flood frequency estimation, so the answer is a screening estimate.
 *
 * @param inputs - C (0–1], I (mm/h), and A (km² or ha, above 0)
 * @returns peak discharge, m³/s
 * @throws HydraulicsInputError when C is not in (0, 1], or I or A is not a number above 0, or
 *   both or neither of `areaKm2` and `areaHa` are given
 */
export function rationalPeakDischarge(inputs: RationalInputs): number {
  const { runoffCoefficient: c, intensityMmH } = inputs;
  if (typeof c !== 'number' || !Number.isFinite(c)) {
    throw new HydraulicsInputError('runoffCoefficient', 'The runoff coefficient must be a number from 0 to 1.');
  }
  if (c > 1) {
    throw new HydraulicsInputError(
      'runoffCoefficient',
      `A runoff coefficient above 1 (${c}) means more water runs off than falls; use 0–1 (rural land is usually 0.1–0.6).`,
    );
  }
  if (c <= 0) {
    throw new HydraulicsInputError(
      'runoffCoefficient',
      `A runoff coefficient of ${c} means no water runs off; use a value above 0 and at most 1 (rural land is usually 0.1–0.6).`,
    );
  }
  if (typeof intensityMmH !== 'number' || !Number.isFinite(intensityMmH) || intensityMmH <= 0) {
    throw new HydraulicsInputError(
      'intensityMmH',
      `The rainfall intensity must be a number of mm/h above 0, got ${intensityMmH}; read it from the property's IFD table.`,
    );
  }
  const hasKm2 = inputs.areaKm2 !== undefined;
  const hasHa = inputs.areaHa !== undefined;
  if (hasKm2 === hasHa) {
    throw new HydraulicsInputError(
      'areaKm2',
      'Give the catchment area once: either in km² (`areaKm2`) or in hectares (`areaHa`).',
    );
  }
  const field = hasKm2 ? 'areaKm2' : 'areaHa';
  const area = hasKm2 ? inputs.areaKm2 : inputs.areaHa;
  if (typeof area !== 'number' || !Number.isFinite(area) || area <= 0) {
    throw new HydraulicsInputError(
      field,
      `The catchment area must be a number above 0 (${hasKm2 ? 'km²' : 'hectares'}), got ${area}.`,
    );
  }
  const areaKm2 = hasKm2 ? area : area / 100;
  return (c * intensityMmH * areaKm2) / 3.6;
}
