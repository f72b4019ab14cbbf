import type { ExpressionSpecification } from '@maplibre/maplibre-gl-style-spec';
import { MAP_COLOURS, MAP_FONTS } from './theme';
import { CROSSINGS_SOURCE_ID, PLAN_COLOURS, byZoom, type CircleLayer, type Filter, type SymbolLayer } from './plan-style';

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

/**
 * Crossings flagged for redesign (failed in two inspection rounds): a broad ring well outside the
 * dot and its dark ring, so the flag reads by shape as well as by colour.
 */
export const crossingRedesignLayer: CircleLayer = {
  id: 'plan-crossing-redesign',
  type: 'circle',
  source: CROSSINGS_SOURCE_ID,
  filter: ['==', ['get', 'redesign'], true] as Filter,
  paint: {
    'circle-radius': byZoom(11, 11, 14, 15, 16, 16, 18, 13),
    'circle-opacity': 0,
    'circle-stroke-color': PLAN_COLOURS.redesign,
    'circle-stroke-width': 3.5,
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
