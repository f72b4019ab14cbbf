import { HydraulicsInputError } from './input-error';

function positive(field: string, value: number, unit: string): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
    throw new HydraulicsInputError(field, `${field} must be a number above 0 (${unit}), got ${value}.`);
  }
}

/**
 * Time of concentration by Kirpich (1940), SI form: tc = 0.0195 L^0.77 S^-0.385, tc in minutes,
 * L the length of the longest flow path in metres, S its average slope in m/m (Texas Department of
 * Transportation, Hydraulic Design Manual, chapter 4, section 11). The US form is
 * 0.0078 L^0.77 S^-0.385 with L in feet; the SI coefficient is that one rounded up (0.01947).
 * Kirpich fitted it to small, steep agricultural catchments in Tennessee.
 *
 * @param inputs - `lengthM` (m) and `slopeMPerM` (m/m), both above 0
 * @returns tc, minutes
 * @throws HydraulicsInputError when the length or slope is not above 0, or the slope is 1 or more (per cent given?)
 */
export function kirpichTcMin(inputs: { readonly lengthM: number; readonly slopeMPerM: number }): number {
  positive('lengthM', inputs.lengthM, 'metres');
  positive('slopeMPerM', inputs.slopeMPerM, 'm/m');
  if (inputs.slopeMPerM >= 1) {
    throw new HydraulicsInputError(
      'slopeMPerM',
      `A slope of ${inputs.slopeMPerM} m/m is 45° or steeper; give the slope in m/m (2 % is 0.02).`,
    );
  }
  return 0.0195 * inputs.lengthM ** 0.77 * inputs.slopeMPerM ** -0.385;
}

/**
 * Time of concentration by Bransby-Williams, in the form of Australian Rainfall and Runoff 1987,
 * Book IV: tc = 58 L / (A^0.1 Se^0.2), tc in minutes, L the main stream length in km, A the
 * catchment area in km², Se the equal-area slope of the main stream in m/km.
 *
 * @param inputs - `mainStreamLengthKm` (km), `areaKm2` (km²), `equalAreaSlopeMPerKm` (m/km), all above 0
 * @returns tc, minutes
 * @throws HydraulicsInputError when an input is not a number above 0
 */
export function bransbyWilliamsTcMin(inputs: {
  readonly mainStreamLengthKm: number;
  readonly areaKm2: number;
  readonly equalAreaSlopeMPerKm: number;
}): number {
  positive('mainStreamLengthKm', inputs.mainStreamLengthKm, 'km');
  positive('areaKm2', inputs.areaKm2, 'km²');
  positive('equalAreaSlopeMPerKm', inputs.equalAreaSlopeMPerKm, 'm/km');
  return (58 * inputs.mainStreamLengthKm) / (inputs.areaKm2 ** 0.1 * inputs.equalAreaSlopeMPerKm ** 0.2);
}

/**
 * Time of concentration by Pilgrim and McDermott, as in Australian Rainfall and Runoff 1987,
 * Book IV (where it serves the probabilistic Rational method of eastern New South Wales; the region from
 * memory): tc = 0.76 A^0.38 hours,
 * A the catchment area in km². Returned in minutes (× 60).
 *
 * @param inputs - `areaKm2` (km²), above 0
 * @returns tc, minutes
 * @throws HydraulicsInputError when the area is not a number above 0
 */
export function pilgrimMcDermottTcMin(inputs: { readonly areaKm2: number }): number {
  positive('areaKm2', inputs.areaKm2, 'km²');
  return 60 * 0.76 * inputs.areaKm2 ** 0.38;
}
