import { HYDRAULICS_SOURCES } from './sources';

/** Rational-method runoff coefficients C for one land cover on one class of slope, by soil. */
export interface RunoffCoefficientClass {
  /** Stable key, used by forms and stored designs. */
  readonly id: string;
  readonly cover: 'woodland' | 'pasture' | 'cultivated';
  /** Topography as the table names it, with its slope range in per cent. */
  readonly topography: 'flat' | 'rolling' | 'hilly';
  readonly slopePercent: readonly [number, number];
  /** C (dimensionless, 0–1) on open sandy loam, on clay and silt loam, and on tight clay. */
  readonly openSandyLoam: number;
  readonly clayAndSiltLoam: number;
  readonly tightClay: number;
  readonly source: string;
  /**
   * How the numbers were obtained: recalled, not read in the source here. Each was compared with
   * a secondary reproduction of the table on the web (agriinfo.in, "runoff coefficient"), which
   * agrees except where `note` says otherwise.
   */
  readonly basis: 'from memory';
  readonly note?: string;
}

const SOURCE = `${HYDRAULICS_SOURCES.nrcs206d}; the same table as Schwab, Frevert, Edminster & Barnes, Soil and Water Conservation Engineering (Wiley)`;

const ROWS: readonly [RunoffCoefficientClass['cover'], RunoffCoefficientClass['topography'], number, number, number][] = [
  ['woodland', 'flat', 0.1, 0.3, 0.4],
  ['woodland', 'rolling', 0.25, 0.35, 0.5],
  ['woodland', 'hilly', 0.3, 0.5, 0.6],
  ['pasture', 'flat', 0.1, 0.3, 0.4],
  ['pasture', 'rolling', 0.16, 0.36, 0.55],
  ['pasture', 'hilly', 0.22, 0.42, 0.6],
  ['cultivated', 'flat', 0.3, 0.5, 0.6],
  ['cultivated', 'rolling', 0.4, 0.6, 0.7],
  ['cultivated', 'hilly', 0.52, 0.72, 0.82],
];

const SLOPES: Record<RunoffCoefficientClass['topography'], readonly [number, number]> = {
  flat: [0, 5],
  rolling: [5, 10],
  hilly: [10, 30],
};

/**
 * Rural runoff coefficients for the Rational method, by cover (woodland, pasture, cultivated),
 * topography (flat 0–5 %, rolling 5–10 %, hilly 10–30 % slope) and soil (open sandy loam, clay and
 * silt loam, tight clay): the agricultural-areas table of the USDA NRCS Hydrology Training Series
 * Module 206D "Peak Discharge (Other Methods)" study guide, which is the classic table of Schwab
 * et al., Soil and Water Conservation Engineering. **From memory**: every value is recalled, not
 * read in the source; check it against the source before leaning on it. Such tables are usually
 * given for storms of about 5–10 year return period (from memory); rarer floods run off more.
 */
export const RUNOFF_COEFFICIENTS: readonly RunoffCoefficientClass[] = Object.freeze(
  ROWS.map(([cover, topography, openSandyLoam, clayAndSiltLoam, tightClay]) =>
    Object.freeze({
      id: `${cover}-${topography}`,
      cover,
      topography,
      slopePercent: SLOPES[topography],
      openSandyLoam,
      clayAndSiltLoam,
      tightClay,
      source: SOURCE,
      basis: 'from memory' as const,
      ...(cover === 'woodland' && topography === 'rolling'
        ? { note: 'The secondary reproduction gives 0.60 for tight clay where memory gives 0.50; check the source.' }
        : {}),
    }),
  ),
);
