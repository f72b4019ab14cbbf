import type { ExpressionSpecification } from '@maplibre/maplibre-gl-style-spec';
import type { LayerSpecification } from 'maplibre-gl';
import type { FenceStatus } from '../../lib/schemas/plan';
import type { AngleClass, LayoutPointKind } from '../../lib/schemas/crossing-view';
import { MAP_COLOURS, MAP_FONTS } from './theme';

type CircleLayer = Extract<LayerSpecification, { type: 'circle' }>;
type LineLayer = Extract<LayerSpecification, { type: 'line' }>;
type SymbolLayer = Extract<LayerSpecification, { type: 'symbol' }>;
type Filter = NonNullable<LineLayer['filter']>;

/**
 * The plan's colours. Crossing classes take three of Okabe & Ito's colour-blind-safe colours
 * (Okabe, M. and Ito, K. (2008) "Color Universal Design"), and every class also differs in its
 * outline (good: white, fair: dark ring, poor: dark ring and a "!"), so no meaning rests on hue.
 */
export const PLAN_COLOURS = {
  angle: { good: '#0072B2', fair: '#E69F00', poor: '#D55E00' } satisfies Record<AngleClass, string>,
  /** Crossings without an angle (a fence running along a channel). */
  angleNone: '#6b5443',
  /** Dark outline of fair and poor crossings, and of the layout's posts. */
  ink: '#2b211a',
  casing: MAP_COLOURS.casing,
  /** The dashed preview of a realigned fence (Okabe–Ito bluish green, apart from every status). */
  realign: '#009E73',
  /** The floodgate's stretch across the wet zone. */
  floodgate: '#1f5f99',
  /** Breakaway ties (Okabe–Ito reddish purple). */
  tie: '#CC79A7',
} as const;

/** How each fence status is drawn: colour, width and dash pattern (in line widths; empty is solid). */
export const FENCE_STATUS_STYLES: Record<FenceStatus, { label: string; colour: string; widthPx: number; dash: number[] }> = {
  planned: { label: 'Planned', colour: '#b8692a', widthPx: 3.5, dash: [2, 1.2] },
  approved: { label: 'Approved', colour: '#7a4219', widthPx: 3.5, dash: [4, 1.2] },
  building: { label: 'Being built', colour: '#4a3a2e', widthPx: 4, dash: [4, 1, 1, 1] },
  built: { label: 'Built', colour: '#2b211a', widthPx: 4, dash: [] },
  retired: { label: 'Retired', colour: '#7d776d', widthPx: 2.5, dash: [0.6, 1.6] },
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

const byZoom = (...stops: (number | ExpressionSpecification)[]): ExpressionSpecification => ['interpolate', ['linear'], ['zoom'], ...stops];

// ---- fence lines -------------------------------------------------------------------------

/** Pale casing under every fence line so dashes keep their edge over hillshade and in glare. */
export const fenceCasingLayer: LineLayer = {
  id: 'plan-fence-casing',
  type: 'line',
  source: FENCE_LINES_SOURCE_ID,
  layout: { 'line-join': 'round', 'line-cap': 'round' },
  paint: { 'line-color': MAP_COLOURS.casing, 'line-width': byZoom(10, 4, 16, 8), 'line-opacity': 0.9 },
};

/** One line layer per status: a dash pattern each, so status reads without colour. */
export const fenceStatusLayers: LineLayer[] = (Object.keys(FENCE_STATUS_STYLES) as FenceStatus[]).map((status) => {
  const style = FENCE_STATUS_STYLES[status];
  return {
    id: `plan-fence-${status}`,
    type: 'line',
    source: FENCE_LINES_SOURCE_ID,
    filter: ['==', ['get', 'status'], status] as Filter,
    layout: { 'line-join': 'round', 'line-cap': style.dash.length ? 'butt' : 'round' },
    paint: {
      'line-color': style.colour,
      'line-width': byZoom(10, style.widthPx * 0.6, 16, style.widthPx * 1.3),
      ...(style.dash.length ? { 'line-dasharray': style.dash } : {}),
    },
  };
});

/** Fence names along the lines at close zoom. */
export const fenceLabelLayer: SymbolLayer = {
  id: 'plan-fence-labels',
  type: 'symbol',
  source: FENCE_LINES_SOURCE_ID,
  minzoom: 13,
  layout: {
    'symbol-placement': 'line',
    'text-field': ['get', 'name'],
    'text-font': [...MAP_FONTS.bold],
    'text-size': 12,
    'text-offset': [0, -1.1],
    'symbol-spacing': 400,
  },
  paint: { 'text-color': MAP_COLOURS.text, 'text-halo-color': MAP_COLOURS.casing, 'text-halo-width': 2 },
};

// ---- crossings ---------------------------------------------------------------------------

const angleClass: ExpressionSpecification = ['coalesce', ['get', 'angleClass'], 'none'];
const isDesigned: ExpressionSpecification = ['==', ['get', 'designStatus'], 'designed'];
const classColour: ExpressionSpecification = [
  'match',
  angleClass,
  'good',
  PLAN_COLOURS.angle.good,
  'fair',
  PLAN_COLOURS.angle.fair,
  'poor',
  PLAN_COLOURS.angle.poor,
  PLAN_COLOURS.angleNone,
];
/** Radius of a crossing's dot in pixels: largest at mid zoom, smaller close up so the layout shows around it. */
const crossingRadius: ExpressionSpecification = byZoom(11, 5, 14, 8, 16, 9, 18, 6);

/** The dark ring outside fair and poor crossings. */
export const crossingRingLayer: CircleLayer = {
  id: 'plan-crossing-ring',
  type: 'circle',
  source: CROSSINGS_SOURCE_ID,
  filter: ['in', angleClass, ['literal', ['fair', 'poor']]] as Filter,
  paint: {
    'circle-radius': byZoom(11, 8, 14, 11.5, 16, 12.5, 18, 9.5),
    'circle-opacity': 0,
    'circle-stroke-color': PLAN_COLOURS.ink,
    'circle-stroke-width': 2,
  },
};

/** Designed crossings are filled in their class colour; the rest are a hollow ring in it. */
export const crossingDotLayer: CircleLayer = {
  id: 'plan-crossing-dots',
  type: 'circle',
  source: CROSSINGS_SOURCE_ID,
  paint: {
    'circle-radius': crossingRadius,
    'circle-color': ['case', isDesigned, classColour, MAP_COLOURS.casing],
    'circle-stroke-color': ['case', isDesigned, MAP_COLOURS.casing, classColour],
    'circle-stroke-width': ['case', isDesigned, 2, 4],
  },
};

/** A "!" on poor crossings. */
export const crossingMarkLayer: SymbolLayer = {
  id: 'plan-crossing-marks',
  type: 'symbol',
  source: CROSSINGS_SOURCE_ID,
  filter: ['==', angleClass, 'poor'] as Filter,
  layout: {
    'text-field': '!',
    'text-font': [...MAP_FONTS.bold],
    'text-size': byZoom(11, 9, 14, 13, 16, 14, 18, 11),
    'text-allow-overlap': true,
    'text-ignore-placement': true,
  },
  paint: {
    'text-color': ['case', isDesigned, '#ffffff', PLAN_COLOURS.ink],
    'text-halo-color': ['case', isDesigned, PLAN_COLOURS.ink, MAP_COLOURS.casing],
    'text-halo-width': 1,
  },
};

/** The selected crossing: a wide dark ring with a pale casing. */
export function selectedCrossingLayers(crossingId: number | null): [CircleLayer, CircleLayer] {
  const filter = ['==', ['get', 'id'], crossingId ?? -1] as Filter;
  const radius = byZoom(11, 13, 14, 17, 16, 18, 18, 14);
  return [
    {
      id: 'plan-crossing-selected-casing',
      type: 'circle',
      source: CROSSINGS_SOURCE_ID,
      filter,
      paint: { 'circle-radius': radius, 'circle-opacity': 0, 'circle-stroke-color': MAP_COLOURS.casing, 'circle-stroke-width': 7 },
    },
    {
      id: 'plan-crossing-selected',
      type: 'circle',
      source: CROSSINGS_SOURCE_ID,
      filter,
      paint: { 'circle-radius': radius, 'circle-opacity': 0, 'circle-stroke-color': PLAN_COLOURS.ink, 'circle-stroke-width': 3 },
    },
  ];
}

/**
 * An invisible disc, 44 px across, over each crossing: the one layer the map hit-tests, so a
 * finger finds a crossing without landing on its small dot.
 */
export const crossingHitLayer: CircleLayer = {
  id: 'plan-crossing-hit',
  type: 'circle',
  source: CROSSINGS_SOURCE_ID,
  paint: { 'circle-radius': 22, 'circle-color': '#000000', 'circle-opacity': 0, 'circle-stroke-width': 0 },
};

/** The map layers a click or tap selects a crossing from (for `interactiveLayerIds`). */
export const CROSSING_INTERACTIVE_LAYER_IDS: readonly string[] = [crossingHitLayer.id];

// ---- the selected crossing's layout -----------------------------------------------------

/** Icons the layout's symbol layer uses; `PlanOverlay` draws them into the map's sprite. */
export const LAYOUT_ICONS = {
  endStrainer: 'plan-icon-end-strainer',
  flexRunStrainer: 'plan-icon-flex-strainer',
  breakawayTie: 'plan-icon-breakaway-tie',
} as const;

const kindIs = (...kinds: LayoutPointKind[]): Filter => ['in', ['get', 'kind'], ['literal', kinds]] as Filter;

/** The floodgate's stretch (floodgate post to floodgate post), a broad translucent band under the posts. */
export const floodgateBandLayer: LineLayer = {
  id: 'plan-floodgate-band',
  type: 'line',
  source: FLOODGATE_SOURCE_ID,
  minzoom: LAYOUT_MIN_ZOOM,
  layout: { 'line-cap': 'round', 'line-join': 'round' },
  paint: { 'line-color': PLAN_COLOURS.floodgate, 'line-opacity': 0.35, 'line-width': byZoom(15, 10, 18, 22) },
};

const postRadius = (linePx: number, stayedPx: number, floodgatePx: number): ExpressionSpecification => [
  'case',
  ['==', ['get', 'kind'], 'line-post'],
  linePx,
  ['==', ['get', 'braced'], true],
  stayedPx,
  floodgatePx,
];

/** Posts: floodgate posts dark and larger when stayed; line posts small and bark-brown. */
export const layoutPostLayer: CircleLayer = {
  id: 'plan-layout-posts',
  type: 'circle',
  source: LAYOUT_POINTS_SOURCE_ID,
  minzoom: LAYOUT_MIN_ZOOM,
  filter: kindIs('floodgate-post', 'line-post'),
  paint: {
    // Zoom must lead the expression, so the kind is chosen at each zoom stop.
    'circle-radius': byZoom(15, postRadius(2.5, 4.5, 3.5), 18, postRadius(4, 7, 5.5)),
    'circle-color': ['case', ['==', ['get', 'kind'], 'line-post'], '#6b5443', PLAN_COLOURS.ink],
    'circle-stroke-color': MAP_COLOURS.casing,
    'circle-stroke-width': ['case', ['==', ['get', 'braced'], true], 2.5, 1.5],
  },
};

/** End strainers as filled squares, flex-run strainers as open squares, breakaway ties as diamonds. */
export const layoutMarkerLayer: SymbolLayer = {
  id: 'plan-layout-markers',
  type: 'symbol',
  source: LAYOUT_POINTS_SOURCE_ID,
  minzoom: LAYOUT_MIN_ZOOM,
  filter: kindIs('end-strainer', 'flex-run-strainer', 'breakaway-tie'),
  layout: {
    'icon-image': [
      'match',
      ['get', 'kind'],
      'end-strainer',
      LAYOUT_ICONS.endStrainer,
      'flex-run-strainer',
      LAYOUT_ICONS.flexRunStrainer,
      LAYOUT_ICONS.breakawayTie,
    ],
    'icon-size': byZoom(15, 0.8, 18, 1.2),
    'icon-allow-overlap': true,
    'icon-ignore-placement': true,
    'symbol-sort-key': ['match', ['get', 'kind'], 'breakaway-tie', 2, 1],
  },
};

/** Names of the strainers and ties at the closest zooms. */
export const layoutLabelLayer: SymbolLayer = {
  id: 'plan-layout-labels',
  type: 'symbol',
  source: LAYOUT_POINTS_SOURCE_ID,
  minzoom: 16.5,
  filter: kindIs('end-strainer', 'flex-run-strainer', 'breakaway-tie'),
  layout: {
    'text-field': ['get', 'label'],
    'text-font': [...MAP_FONTS.bold],
    'text-size': 12,
    'text-anchor': 'left',
    'text-offset': [1.2, 0],
    'text-max-width': 10,
    'text-optional': true,
  },
  paint: { 'text-color': MAP_COLOURS.text, 'text-halo-color': MAP_COLOURS.casing, 'text-halo-width': 2 },
};

// ---- realignment preview ----------------------------------------------------------------

export const realignCasingLayer: LineLayer = {
  id: 'plan-realign-casing',
  type: 'line',
  source: REALIGN_SOURCE_ID,
  layout: { 'line-join': 'round', 'line-cap': 'round' },
  paint: { 'line-color': MAP_COLOURS.casing, 'line-width': byZoom(10, 5, 16, 10) },
};

export const realignLineLayer: LineLayer = {
  id: 'plan-realign-preview',
  type: 'line',
  source: REALIGN_SOURCE_ID,
  layout: { 'line-join': 'round' },
  paint: { 'line-color': PLAN_COLOURS.realign, 'line-width': byZoom(10, 3, 16, 5), 'line-dasharray': [1.5, 1] },
};
