import type { ExpressionSpecification } from '@maplibre/maplibre-gl-style-spec';
import type { LayerSpecification } from 'maplibre-gl';
import { DRAINAGE_ORDER_STEPS, DRAINAGE_TILE_LAYER } from '../../lib/geo/drainage-tile-rules';
import { MAP_COLOURS, MAP_FONTS } from './theme';

type LineLayer = Extract<LayerSpecification, { type: 'line' }>;
type RasterLayer = Extract<LayerSpecification, { type: 'raster' }>;
type SymbolLayer = Extract<LayerSpecification, { type: 'symbol' }>;

/** Terrain colours: water in a deep, saturated blue that stays apart from the ochre and bark of the ground. */
export const TERRAIN_COLOURS = {
  drainage: '#1f5f99',
  drainageCasing: '#f4f8fb',
  contour: '#7a5a3a',
} as const;

export const contoursSourceId = (runId: number) => `contours-${runId}`;
export const hillshadeSourceId = (runId: number) => `hillshade-${runId}`;

/** The hillshade image of one terrain run, half transparent over the ground colour. */
export function hillshadeLayer(runId: number): RasterLayer {
  return {
    id: `hillshade-${runId}`,
    type: 'raster',
    source: hillshadeSourceId(runId),
    paint: { 'raster-opacity': 0.55, 'raster-fade-duration': 0, 'raster-resampling': 'linear' },
  };
}

/** Contours show from this zoom: further out they are a brown haze over the whole property. */
export const CONTOURS_MIN_ZOOM = 11;

/** Contour lines: thin bark-brown lines, every fifth level a little heavier. */
export function contourLineLayer(runId: number, intervalM: number): LineLayer {
  const isIndex: LineLayer['filter'] = ['==', ['%', ['round', ['/', ['get', 'elevationM'], intervalM]], 5], 0];
  return {
    id: `contours-${runId}`,
    type: 'line',
    source: contoursSourceId(runId),
    minzoom: CONTOURS_MIN_ZOOM,
    paint: {
      'line-color': TERRAIN_COLOURS.contour,
      'line-opacity': 0.55,
      'line-width': ['case', isIndex, 1.2, 0.6],
    },
  };
}

/** Heights along the contour lines, from close zoom. */
export function contourLabelLayer(runId: number): SymbolLayer {
  return {
    id: `contour-labels-${runId}`,
    type: 'symbol',
    source: contoursSourceId(runId),
    minzoom: 14,
    layout: {
      'symbol-placement': 'line',
      'text-field': ['concat', ['to-string', ['get', 'elevationM']], ' m'],
      'text-font': [...MAP_FONTS.regular],
      'text-size': 10,
      'symbol-spacing': 300,
    },
    paint: { 'text-color': TERRAIN_COLOURS.contour, 'text-halo-color': MAP_COLOURS.casing, 'text-halo-width': 1.5 },
  };
}

/** Line width by Strahler order: headwater gullies thin, the main creek heavy. */
const widthByOrder = (base: number): ExpressionSpecification => [
  'interpolate',
  ['linear'],
  ['get', 'streamOrder'],
  1,
  base,
  5,
  base + 4,
];

/**
 * Small gullies wait for closer zooms (DRAINAGE_ORDER_STEPS: order 3 and up always, order 2 from
 * zoom 12, all from 13). The tiles leave out what their zoom hides; the filter keeps a tile drawn
 * over a closer zoom (while its children load) to the same rule.
 */
const shownAtThisZoom: ExpressionSpecification = [
  '>=',
  ['get', 'streamOrder'],
  ['step', ['zoom'], DRAINAGE_ORDER_STEPS[0]!.minOrder, ...DRAINAGE_ORDER_STEPS.slice(1).flatMap((step) => [step.fromZoom, step.minOrder])],
] as ExpressionSpecification;

/** A terrain run's drainage lines: vector tiles cut by the server (layer DRAINAGE_TILE_LAYER). */
export const drainageSourceId = (runId: number) => `drainage-${runId}`;

/** The light casing under the drainage lines, from zoom 12, so they stand out over the hillshade. */
export function drainageCasingLayer(runId: number): LineLayer {
  return {
    id: `drainage-casing-${runId}`,
    type: 'line',
    source: drainageSourceId(runId),
    'source-layer': DRAINAGE_TILE_LAYER,
    minzoom: 12,
    filter: shownAtThisZoom,
    layout: { 'line-join': 'round', 'line-cap': 'round' },
    paint: { 'line-color': TERRAIN_COLOURS.drainageCasing, 'line-width': widthByOrder(3), 'line-opacity': 0.8 },
  };
}

/** Drainage lines in water blue, heavier with stream order. */
export function drainageLineLayer(runId: number): LineLayer {
  return {
    id: `drainage-lines-${runId}`,
    type: 'line',
    source: drainageSourceId(runId),
    'source-layer': DRAINAGE_TILE_LAYER,
    filter: shownAtThisZoom,
    // Mitred and butt-ended at station scale: round joins and caps are extra triangles at every
    // vertex of thousands of lines, drawn in software on many machines; round from close up.
    layout: { 'line-join': ['step', ['zoom'], 'miter', 13, 'round'], 'line-cap': ['step', ['zoom'], 'butt', 13, 'round'] },
    paint: { 'line-color': TERRAIN_COLOURS.drainage, 'line-width': widthByOrder(1.2) },
  };
}
