import { HydraulicsInputError } from './input-error';

/**
 * A ground profile across a channel, looking downstream or upstream (either, used consistently),
 * as the hydraulics core takes it.
 *
 * - `stationsM`: distance across the flow from the profile's first point, metres, strictly increasing.
 * - `elevationsM`: ground height at each station, metres, in any fixed datum (stages use the same datum).
 *
 * The ground between two points is the straight line joining them.
 */
export interface CrossSection {
  readonly stationsM: readonly number[];
  readonly elevationsM: readonly number[];
}

/** Heights that bound what a {@link CrossSection} can say about water. */
export interface SectionLimits {
  /** The lowest ground of the profile (the channel bed), metres. */
  readonly bedM: number;
  /** Station of the lowest ground (the first one if several points tie), metres. */
  readonly bedStationM: number;
  /**
   * The lower of the two end heights, metres: above this stage the water spills past the end of
   * the profile onto ground the profile does not describe.
   */
  readonly lowerEndM: number;
  /** The highest ground of the profile, metres. */
  readonly highestM: number;
}

/**
 * Checks a cross-section at the entry of every hydraulics function and returns its height limits.
 *
 * @param section - the profile; not modified
 * @param field - the caller's name for it, used in error messages (default `section`)
 * @returns bed, lower end and highest ground, metres
 * @throws HydraulicsInputError when the arrays are missing, of different lengths, shorter than two
 *   points, hold non-finite numbers, or the stations do not strictly increase
 */
export function checkCrossSection(section: CrossSection, field = 'section'): SectionLimits {
  if (section === null || typeof section !== 'object') {
    throw new HydraulicsInputError(field, 'A cross-section needs `stationsM` and `elevationsM` arrays.');
  }
  const { stationsM, elevationsM } = section;
  if (!Array.isArray(stationsM) || !Array.isArray(elevationsM)) {
    throw new HydraulicsInputError(field, 'A cross-section needs `stationsM` and `elevationsM` arrays of numbers.');
  }
  if (stationsM.length !== elevationsM.length) {
    throw new HydraulicsInputError(
      field,
      `The cross-section has ${stationsM.length} stations but ${elevationsM.length} elevations; give one elevation per station.`,
    );
  }
  if (stationsM.length < 2) {
    throw new HydraulicsInputError(field, 'A cross-section needs at least two points across the channel.');
  }
  let bedM = Infinity;
  let bedStationM = Number.NaN;
  let highestM = -Infinity;
  for (let i = 0; i < stationsM.length; i++) {
    const x = stationsM[i]!;
    const z = elevationsM[i]!;
    if (typeof x !== 'number' || !Number.isFinite(x) || typeof z !== 'number' || !Number.isFinite(z)) {
      throw new HydraulicsInputError(field, `Point ${i + 1} of the cross-section is not a pair of finite numbers (metres).`);
    }
    if (i > 0 && !(x > stationsM[i - 1]!)) {
      throw new HydraulicsInputError(
        field,
        `Stations must increase strictly across the channel: point ${i + 1} (${x} m) does not lie beyond point ${i} (${stationsM[i - 1]} m).`,
      );
    }
    if (z < bedM) {
      bedM = z;
      bedStationM = x;
    }
    if (z > highestM) highestM = z;
  }
  const lowerEndM = Math.min(elevationsM[0]!, elevationsM[elevationsM.length - 1]!);
  return { bedM, bedStationM, lowerEndM, highestM };
}

/**
 * A copy of a cross-section, so that results never share arrays with the caller.
 *
 * @param section - the profile; not modified
 * @returns new arrays with the same stations and elevations, metres
 */
export function copySection(section: CrossSection): CrossSection {
  return { stationsM: [...section.stationsM], elevationsM: [...section.elevationsM] };
}
