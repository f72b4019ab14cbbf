import type { FenceStatus } from '../../lib/schemas/plan';
import { MAP_COLOURS, MAP_FONTS } from './theme';
import type { ExpressionSpecification } from '@maplibre/maplibre-gl-style-spec';
import { FENCE_LINES_SOURCE_ID, FENCE_STATUS_STYLES, PLAN_COLOURS, REALIGN_SOURCE_ID, byZoom, type LineLayer, type SymbolLayer } from './plan-style';

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

/** How one status is drawn: its colour, width by zoom and dash pattern (none for a built fence). */
export function fenceStatusPaint(status: FenceStatus) {
  const style = FENCE_STATUS_STYLES[status];
  return {
    'line-color': style.colour,
    'line-width': byZoom(10, style.widthPx * 0.6, 16, style.widthPx * 1.3),
    ...(style.dash.length ? { 'line-dasharray': style.dash } : {}),
  };
}

/** A dash with no gap: a built fence's unbroken line in the shared dashed layer. */
const SOLID = [1, 0];
const STATUSES = Object.keys(FENCE_STATUS_STYLES) as FenceStatus[];
/** `['match', status, 'planned', value, …, fallback]` over every status. */
const byStatus = (value: (status: FenceStatus) => unknown, fallback: unknown): ExpressionSpecification =>
  ['match', ['get', 'status'], ...STATUSES.flatMap((status) => [status, value(status)]), fallback] as unknown as ExpressionSpecification;
const widthAt = (factor: number): ExpressionSpecification => byStatus((status) => FENCE_STATUS_STYLES[status].widthPx * factor, 3);

/**
 * Every fence line in one layer, each status with its own colour, width and dash pattern (so status
 * reads without colour): one layer rather than one per status, a fifth of the draw calls, which
 * matters where WebGL is drawn in software. A built fence's pattern is an unbroken dash.
 */
export const fenceLineLayer: LineLayer = {
  id: 'plan-fences',
  type: 'line',
  source: FENCE_LINES_SOURCE_ID,
  layout: {
    // Mitred corners at station scale (round ones are extra triangles at every vertex), round close up.
    'line-join': ['step', ['zoom'], 'miter', 13, 'round'],
    'line-cap': byStatus((status) => (FENCE_STATUS_STYLES[status].dash.length ? 'butt' : 'round'), 'butt'),
  },
  paint: {
    'line-color': byStatus((status) => FENCE_STATUS_STYLES[status].colour, FENCE_STATUS_STYLES.planned.colour),
    'line-width': byZoom(10, widthAt(0.6), 16, widthAt(1.3)),
    'line-dasharray': byStatus((status) => ['literal', FENCE_STATUS_STYLES[status].dash.length ? FENCE_STATUS_STYLES[status].dash : SOLID], ['literal', SOLID]),
  },
};
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
