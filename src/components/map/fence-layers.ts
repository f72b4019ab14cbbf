import type { FenceStatus } from '../../lib/schemas/plan';
import { MAP_COLOURS, MAP_FONTS } from './theme';
import { FENCE_LINES_SOURCE_ID, FENCE_STATUS_STYLES, PLAN_COLOURS, REALIGN_SOURCE_ID, byZoom, type Filter, type LineLayer, type SymbolLayer } from './plan-style';

/** Pale casing under every fence line so dashes keep their edge over hillshade and in glare. */
export const fenceCasingLayer: LineLayer = {
  id: 'plan-fence-casing',
  type: 'line',
  source: FENCE_LINES_SOURCE_ID,
  // A whole station's fences at once need no casing, and each casing is a second draw of every line.
  minzoom: 12,
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

// ---- realignment preview: a fence line's suggested new shape, dashed over the plan ----------

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
