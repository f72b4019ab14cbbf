import type { CrossSection, IfdTable } from '../../../../src/lib/crossings/hydraulics/index';

/**
 * A trapezoidal channel drawn as a ground profile: bed width `bottomM` at elevation 0, side
 * slopes `side` horizontal to 1 vertical, banks `heightM` high. A side of 0 (vertical wall) is
 * drawn with a 1 nm run so the stations still increase strictly; that changes A and P by less
 * than 1e-8. A bed width of 0 draws a V.
 */
export function trapezoid(bottomM: number, side: number, heightM: number): CrossSection {
  const run = Math.max(side * heightM, 1e-9);
  if (bottomM === 0) return { stationsM: [0, run, 2 * run], elevationsM: [heightM, 0, heightM] };
  return { stationsM: [0, run, run + bottomM, 2 * run + bottomM], elevationsM: [heightM, 0, 0, heightM] };
}

/** Freezes a section (and its arrays) so a mutation throws in strict mode. */
export function frozen<T extends object>(value: T): T {
  for (const inner of Object.values(value)) {
    if (inner !== null && typeof inner === 'object' && !Object.isFrozen(inner)) frozen(inner as object);
  }
  return Object.freeze(value);
}

/** US customary to SI, exact by definition of the international foot (1959). */
export const FOOT_M = 0.3048;
export const CFS_M3S = FOOT_M ** 3;

/**
 * A creek with a deep main channel and wide flat floodplains (invented for the tests): banks at
 * 2 m, bed at 0, floodplains 100 m wide on each side at 2 m, rising to 4 m at the profile ends.
 * Bank stations 105 and 113 m.
 */
export const COMPOUND: CrossSection = {
  stationsM: [0, 5, 105, 107, 111, 113, 213, 218],
  elevationsM: [4, 2, 2, 0, 0, 2, 2, 4],
};

/** An invented IFD table shaped like a Bureau of Meteorology one (not real data for any place). */
export const INVENTED_IFD: IfdTable = {
  aepPercent: [63.2, 50, 20, 10, 5, 2, 1],
  durationsMin: [5, 10, 30, 60, 180, 360, 1440],
  intensitiesMmH: [
    [72, 54, 28, 17, 8, 4.8, 1.6],
    [80, 60, 31, 19, 9, 5.4, 1.8],
    [110, 82, 43, 27, 12.5, 7.5, 2.5],
    [130, 97, 51, 32, 15, 9, 3],
    [150, 112, 60, 38, 18, 11, 3.6],
    [180, 135, 72, 46, 22, 13, 4.4],
    [200, 150, 80, 52, 25, 15, 5],
  ],
};
