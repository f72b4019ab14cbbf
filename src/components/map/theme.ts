/**
 * Gullyline's map palette and fonts. Earthy and calm, but every pair that carries meaning is
 * strong enough to read on a phone in full sun: dark bark text on pale clay, a deep ochre
 * boundary with a pale casing, grid lines in saltbush grey-green that stay in the background.
 */
export const MAP_COLOURS = {
  /** Pale clay: the ground colour of the base map. */
  ground: '#ece3cf',
  /** Saltbush grey-green, darkest to lightest, for the graticule ranks. */
  gridMajor: '#5f6e58',
  gridMedium: '#7d8b74',
  gridMinor: '#9ba68f',
  /** Muted bark for small grid labels. */
  gridText: '#4a3f33',
  /** Deep ochre for the property boundary, and the ochre wash inside it. */
  extentLine: '#8a4f0f',
  extentFill: '#c98a2b',
  /** Near-white casing under lines and behind text, so both survive glare. */
  casing: '#fbf7ee',
  /** Dark bark for names. */
  text: '#2b2118',
} as const;

/**
 * Fontstacks as the style's `text-font` names them. Each must exist as
 * `public/glyphs/<name>/<start>-<end>.pbf` (built by scripts/build-glyphs.mjs from Noto Sans).
 * Noto Sans has no arrow glyphs (U+2190–21FF) in the shipped subsets: keep arrows out of labels.
 */
export const MAP_FONTS = {
  regular: ['Noto Sans Regular'],
  bold: ['Noto Sans Bold'],
} as const satisfies Record<string, readonly string[]>;

/** The glyph URL template; a path on the app itself, never a font server. */
export const GLYPHS_URL = '/glyphs/{fontstack}/{range}.pbf';
