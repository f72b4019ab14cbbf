import type { ExpressionSpecification } from '@maplibre/maplibre-gl-style-spec';
import type { LayoutPointKind } from '../../lib/schemas/crossing-view';
import { MAP_COLOURS, MAP_FONTS } from './theme';
import {
  FLOODGATE_SOURCE_ID,
  LAYOUT_MIN_ZOOM,
  LAYOUT_POINTS_SOURCE_ID,
  PLAN_COLOURS,
  byZoom,
  type CircleLayer,
  type Filter,
  type LineLayer,
  type SymbolLayer,
} from './plan-style';

// The selected crossing's layout: floodgate band, posts, strainers and ties.

/** Icons the layout's symbol layer uses; `PlanOverlay` draws them into the map's sprite. */
export const LAYOUT_ICONS = {
  endStrainer: 'plan-icon-end-strainer',
  flexRunStrainer: 'plan-icon-flex-strainer',
  breakawayTie: 'plan-icon-breakaway-tie',
} as const;

/**
 * The icons' colours (`PlanOverlay` paints them): each stands on a pale rim; the tie's diamond has
 * a dark outline, which carries its contrast with the ground where its own colour is too light.
 */
export const LAYOUT_ICON_COLOURS = {
  endStrainer: { fill: PLAN_COLOURS.ink, rim: MAP_COLOURS.casing },
  flexRunStrainer: { outline: PLAN_COLOURS.ink, rim: MAP_COLOURS.casing },
  breakawayTie: { fill: PLAN_COLOURS.tie, outline: PLAN_COLOURS.ink, rim: MAP_COLOURS.casing },
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
    'circle-color': ['case', ['==', ['get', 'kind'], 'line-post'], PLAN_COLOURS.linePost, PLAN_COLOURS.ink],
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
