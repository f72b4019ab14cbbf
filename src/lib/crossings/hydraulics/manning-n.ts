import { HYDRAULICS_SOURCES } from './sources';

/** One class of channel or floodplain with its range of Manning's n. */
export interface ManningNClass {
  /** Stable key, used by forms and stored designs. */
  readonly id: string;
  /** The part of the section this class describes. */
  readonly applies: 'channel' | 'floodplain';
  /** Chow's heading and description, in words. */
  readonly description: string;
  /** Manning's n, s/m^(1/3): minimum, normal and maximum as tabulated. */
  readonly minN: number;
  readonly normalN: number;
  readonly maxN: number;
  /** Where the values come from. */
  readonly source: string;
}

const TABLE_5_6 = `${HYDRAULICS_SOURCES.chowTable56}; values as listed in Gullyline's references.md`;

/**
 * Manning's n for the channels and floodplains of dry grazing country, from Chow (1959)
 * Open-Channel Hydraulics, Table 5-6: "minor natural streams" (top width at flood stage under
 * about 30 m / 100 ft — that limit from memory) on plains, and floodplains. n is in s/m^(1/3)
 * and the same number serves SI and US units (the 1.486 factor carries the unit change).
 * Arcement & Schneider (1989), USGS Water-Supply Paper 2339, gives a way to build up n from
 * channel factors where no class fits.
 */
export const MANNING_N_CLASSES: readonly ManningNClass[] = Object.freeze(
  (
    [
      {
        id: 'stream-clean-straight',
        applies: 'channel',
        description: 'Minor natural stream on a plain: clean, straight, full stage, no rifts or deep pools',
        minN: 0.025,
        normalN: 0.03,
        maxN: 0.033,
        source: TABLE_5_6,
      },
      {
        id: 'stream-clean-winding',
        applies: 'channel',
        description: 'Minor natural stream on a plain: clean, winding, some pools and shoals',
        minN: 0.033,
        normalN: 0.04,
        maxN: 0.045,
        source: TABLE_5_6,
      },
      {
        id: 'stream-weedy-timber',
        applies: 'channel',
        description:
          'Minor natural stream on a plain: very weedy reaches, deep pools, or floodways with heavy stands of timber and underbrush',
        minN: 0.075,
        normalN: 0.1,
        maxN: 0.15,
        source: TABLE_5_6,
      },
      {
        id: 'floodplain-short-grass',
        applies: 'floodplain',
        description: 'Floodplain: pasture, no brush, short grass',
        minN: 0.025,
        normalN: 0.03,
        maxN: 0.035,
        source: TABLE_5_6,
      },
      {
        id: 'floodplain-scattered-brush',
        applies: 'floodplain',
        description: 'Floodplain: scattered brush, heavy weeds',
        minN: 0.035,
        normalN: 0.05,
        maxN: 0.07,
        source: TABLE_5_6,
      },
      {
        id: 'floodplain-dense-brush-summer',
        applies: 'floodplain',
        description: 'Floodplain: medium to dense brush, in summer',
        minN: 0.07,
        normalN: 0.1,
        maxN: 0.16,
        source: TABLE_5_6,
      },
    ] satisfies ManningNClass[]
  ).map((entry) => Object.freeze(entry)),
);

/** An option of a roughness select in the UI. */
export interface RoughnessOption {
  /** The class id. */
  readonly value: string;
  /** What the person reads, with the normal n. */
  readonly label: string;
  /** The normal n the option stands for, s/m^(1/3). */
  readonly manningN: number;
  readonly applies: 'channel' | 'floodplain';
}

/**
 * Options for a roughness select: one per {@link MANNING_N_CLASSES} entry, labelled with its
 * description and normal n (Chow 1959, Table 5-6), channel classes first.
 */
export const roughnessClasses: readonly RoughnessOption[] = Object.freeze(
  MANNING_N_CLASSES.map((entry) =>
    Object.freeze({
      value: entry.id,
      label: `${entry.description} (n ≈ ${entry.normalN.toFixed(3)}, range ${entry.minN.toFixed(3)}–${entry.maxN.toFixed(3)})`,
      manningN: entry.normalN,
      applies: entry.applies,
    }),
  ),
);
