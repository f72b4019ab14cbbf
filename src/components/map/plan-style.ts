import type { ExpressionSpecification } from '@maplibre/maplibre-gl-style-spec';
import type { LayerSpecification } from 'maplibre-gl';
import type { FenceStatus } from '../../lib/schemas/plan';
import type { AngleClass } from '../../lib/schemas/crossing-view';
import { MAP_COLOURS } from './theme';

// What every plan layer shares: colours, source ids, zoom limits and the layer types.

export type CircleLayer = Extract<LayerSpecification, { type: 'circle' }>;
export type LineLayer = Extract<LayerSpecification, { type: 'line' }>;
export type SymbolLayer = Extract<LayerSpecification, { type: 'symbol' }>;
export type Filter = NonNullable<LineLayer['filter']>;

/**
 * The plan's colours. Crossing classes take three of Okabe & Ito's colour-blind-safe colours
 * (Okabe, M. and Ito, K. (2008) "Color Universal Design"), and every class also differs in its
 * outline (good: white, fair: dark ring, poor: dark ring and a "!"), so no meaning rests on hue.
 */
export const PLAN_COLOURS = {
  angle: { good: '#0072B2', fair: '#E69F00', poor: '#D55E00' } satisfies Record<AngleClass, string>,
  /** Crossings without an angle (a fence running along a channel). */
  angleNone: '#6b5443',
  /** Dark outline of fair and poor crossings; floodgate posts and end strainers. */
  ink: '#2b211a',
  /** Line posts of a layout, outside the floodgate (bark brown). */
  linePost: '#6b5443',
  casing: MAP_COLOURS.casing,
  /** The dashed preview of a realigned fence (Okabe–Ito bluish green, apart from every status). */
  realign: '#009E73',
  /** The floodgate's stretch across the wet zone. */
  floodgate: '#1f5f99',
  /** Breakaway ties (Okabe–Ito reddish purple). */
  tie: '#CC79A7',
  /** The broad outer ring of a crossing flagged for redesign by its inspection history. */
  redesign: '#7a1f6a',
} as const;

/** How each fence status is drawn: colour, width and dash pattern (in line widths; empty is solid). */
export const FENCE_STATUS_STYLES: Record<FenceStatus, { label: string; colour: string; widthPx: number; dash: number[] }> = {
  planned: { label: 'Planned', colour: '#b8692a', widthPx: 3.5, dash: [2, 1.2] },
  approved: { label: 'Approved', colour: '#7a4219', widthPx: 3.5, dash: [4, 1.2] },
  building: { label: 'Being built', colour: '#4a3a2e', widthPx: 4, dash: [4, 1, 1, 1] },
  built: { label: 'Built', colour: '#2b211a', widthPx: 4, dash: [] },
  // Weathered-wire grey, a little cool: a warm grey sank into the realignment's green for
  // deuteranopes (tests/lib/map/palette.test.ts).
  retired: { label: 'Retired', colour: '#737386', widthPx: 2.5, dash: [0.6, 1.6] },
};

export const FENCE_LINES_SOURCE_ID = 'plan-fence-lines';
export const CROSSINGS_SOURCE_ID = 'plan-crossings';
export const LAYOUT_POINTS_SOURCE_ID = 'plan-layout-points';
export const FLOODGATE_SOURCE_ID = 'plan-floodgate';
export const REALIGN_SOURCE_ID = 'plan-realign-preview';

/** Layout points show from this zoom: below it a floodgate's posts merge into one blot. */
export const LAYOUT_MIN_ZOOM = 15;
/** The zoom a designed crossing is shown at: its floodgate, strainers and flex runs all in view. */
export const LAYOUT_VIEW_ZOOM = 17.3;

/** A value interpolated linearly between zoom stops: `byZoom(zoom1, value1, zoom2, value2, …)`. */
export const byZoom = (...stops: (number | ExpressionSpecification)[]): ExpressionSpecification => ['interpolate', ['linear'], ['zoom'], ...stops];
