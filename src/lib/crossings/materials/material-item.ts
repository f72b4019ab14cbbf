/**
 * A line of a materials list, and the list itself.
 */

/** Units materials are counted in. */
export type MaterialUnit = 'each' | 'm' | 'roll' | 'kg';

/** Codes of the materials Gullyline counts; a price list prices them by code. */
export type MaterialCode =
  | 'STRAINER_ASSEMBLY'
  | 'STAY'
  | 'HEAVY_POST'
  | 'LINE_POST'
  | 'DROPPER'
  | 'HUNG_DROPPER'
  | 'LINK_OPEN'
  | 'LINK_CLOSED'
  | 'WIRE_PLAIN'
  | 'WIRE_BARBED'
  | 'CLIP'
  | 'TIE_WIRE'
  | 'BREAKAWAY_TIE';

/** One line of a materials list. */
export interface MaterialItem {
  readonly code: MaterialCode;
  readonly description: string;
  readonly unit: MaterialUnit;
  readonly quantity: number;
  /** Why it is needed and how it was counted, in plain words. */
  readonly reason: string;
  /** The same quantity in other units (wire in metres as well as rolls), for price lists that sell by those. */
  readonly alsoAs?: readonly { readonly unit: MaterialUnit; readonly quantity: number }[];
}

/** A materials list for a crossing or a whole fence line. */
export interface MaterialsList {
  readonly items: MaterialItem[];
  /** Length of fence the list builds, metres (what labour is reckoned on). */
  readonly fenceLengthM: number;
  /** Number of crossings (floodgates) in it. */
  readonly crossingCount: number;
  /** What could not be counted cleanly, in plain words. */
  readonly warnings: string[];
  /** The usual cautions (DESIGN.md, Safety). */
  readonly cautions: readonly string[];
}
