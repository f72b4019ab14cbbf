import { MAP_COLOURS } from './theme';

/**
 * How a shape being drawn or reshaped looks: a near-black line over a pale casing-white vertex
 * ring, unlike any saved fence status (those are dashed earth tones), so a draft never passes for
 * a saved line. Hex strings only: Terra Draw takes `#rrggbb`.
 */
export const DRAFT_COLOURS = {
  line: '#14100c',
  vertexFill: MAP_COLOURS.casing as `#${string}`,
  vertexOutline: '#14100c',
  /** The point under the pointer when it snaps to a fence end or a track. */
  snap: '#009e73',
  /** Midpoint handles that add a vertex when dragged. */
  midpoint: '#7d776d',
  paddockFill: '#c98a2b',
} as const;

/** A shape being drawn shows a ring at every point, which no saved line has. */
export const DRAFT_SHOWS_POINTS = true;
