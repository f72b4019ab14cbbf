import type { CrossSection } from './cross-section';
import { HydraulicsInputError } from './input-error';

/**
 * Roughness of a section. Without bank stations the whole section is one element with
 * `channelN`. A bank station splits the section there: left overbank | main channel | right
 * overbank, each with its own n (an overbank n defaults to the channel's).
 */
export interface SectionRoughness {
  /** Manning's n of the main channel, s/m^(1/3) (natural channels about 0.025–0.15). */
  readonly channelN: number;
  readonly leftOverbankN?: number;
  readonly rightOverbankN?: number;
  /** Stations of the top of the left and right banks, metres along the section. */
  readonly leftBankStationM?: number;
  readonly rightBankStationM?: number;
}

/** Energy slope and roughness for Manning's equation. */
export interface ManningOptions {
  /** Slope of the energy line, m/m; for uniform flow the channel bed slope along the flow. */
  readonly slope: number;
  readonly roughness: SectionRoughness;
}

/**
 * Checks the Manning inputs against a section at the entry of the functions that use them.
 *
 * @param section - the (already checked) ground profile the bank stations refer to
 * @param options - slope (m/m) and roughness
 * @returns the slope, m/m
 * @throws HydraulicsInputError when the slope is not in (0, 1) m/m, an n is not in (0, 1], an
 *   overbank n has no bank station, or a bank station is off the profile or out of order
 */
export function checkManningOptions(section: CrossSection, options: ManningOptions): number {
  if (options === null || typeof options !== 'object' || options.roughness === null || typeof options.roughness !== 'object') {
    throw new HydraulicsInputError('roughness', "Give the slope and the roughness (Manning's n) of the section.");
  }
  const { slope, roughness } = options;
  if (!Number.isFinite(slope) || slope <= 0) {
    throw new HydraulicsInputError(
      'slope',
      slope === 0
        ? 'A slope of 0 carries no flow by Manning’s equation; enter the fall of the channel bed along the flow in m/m (e.g. 0.005 for 5 m per km).'
        : `The slope must be a positive number in m/m (the fall of the channel along the flow), got ${slope}; a negative slope would run uphill.`,
    );
  }
  if (slope >= 1) {
    throw new HydraulicsInputError(
      'slope',
      `A slope of ${slope} m/m is 45° or steeper; enter the slope in m/m (2 % is 0.02), not in per cent.`,
    );
  }
  for (const key of ['channelN', 'leftOverbankN', 'rightOverbankN'] as const) {
    const n = roughness[key];
    if (n === undefined && key !== 'channelN') continue;
    if (typeof n !== 'number' || !Number.isFinite(n) || n <= 0 || n > 1) {
      throw new HydraulicsInputError(
        `roughness.${key}`,
        `Manning's n must be a number above 0 and at most 1, got ${n}; natural channels and floodplains are about 0.025–0.16 (Chow 1959, Table 5-6).`,
      );
    }
  }
  const first = section.stationsM[0]!;
  const last = section.stationsM[section.stationsM.length - 1]!;
  for (const side of ['left', 'right'] as const) {
    const station = roughness[`${side}BankStationM`];
    if (station === undefined) {
      if (roughness[`${side}OverbankN`] !== undefined) {
        throw new HydraulicsInputError(
          `roughness.${side}BankStationM`,
          `A ${side} overbank n needs the station of the ${side} bank, in metres along the section.`,
        );
      }
      continue;
    }
    if (!Number.isFinite(station) || station < first || station > last) {
      throw new HydraulicsInputError(
        `roughness.${side}BankStationM`,
        `The ${side} bank station must lie on the profile, between ${first} and ${last} m; got ${station}.`,
      );
    }
  }
  const { leftBankStationM, rightBankStationM } = roughness;
  if (leftBankStationM !== undefined && rightBankStationM !== undefined && !(leftBankStationM < rightBankStationM)) {
    throw new HydraulicsInputError(
      'roughness.rightBankStationM',
      `The left bank (${leftBankStationM} m) must come before the right bank (${rightBankStationM} m) along the section.`,
    );
  }
  return slope;
}
