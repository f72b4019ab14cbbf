import type { LayerSpecification } from 'maplibre-gl';
import { byZoom } from './plan-style';
import { MAP_COLOURS, MAP_FONTS } from './theme';

type Layer<T extends LayerSpecification['type']> = Extract<LayerSpecification, { type: T }>;

export const TRACKS_SOURCE_ID = 'plan-tracks';
export const PADDOCKS_SOURCE_ID = 'plan-paddocks';

/**
 * Tracks and paddocks: tracks a dotted raspberry (chosen to stay apart from every other line on
 * the map under colour-blind simulation; tests/lib/map/palette.test.ts), paddocks a faint
 * saltbush wash with a fine edge and their name and area inside.
 */
export const TRACK_PADDOCK_COLOURS = {
  track: '#a8005f',
  paddockFill: '#6f8466',
  paddockEdge: '#4b5d45',
} as const;

export const paddockFillLayer: Layer<'fill'> = {
  id: 'plan-paddock-fill',
  type: 'fill',
  source: PADDOCKS_SOURCE_ID,
  paint: { 'fill-color': TRACK_PADDOCK_COLOURS.paddockFill, 'fill-opacity': 0.14 },
};

export const paddockEdgeLayer: Layer<'line'> = {
  id: 'plan-paddock-edge',
  type: 'line',
  source: PADDOCKS_SOURCE_ID,
  paint: { 'line-color': TRACK_PADDOCK_COLOURS.paddockEdge, 'line-width': byZoom(10, 1, 16, 1.4) },
};

export const paddockLabelLayer: Layer<'symbol'> = {
  id: 'plan-paddock-labels',
  type: 'symbol',
  source: PADDOCKS_SOURCE_ID,
  minzoom: 12,
  layout: {
    'text-field': ['concat', ['get', 'name'], '\n', ['get', 'areaLabel']],
    'text-font': [...MAP_FONTS.regular],
    'text-size': 12,
    'text-max-width': 12,
  },
  paint: { 'text-color': TRACK_PADDOCK_COLOURS.paddockEdge, 'text-halo-color': MAP_COLOURS.casing, 'text-halo-width': 1.5 },
};

export const trackCasingLayer: Layer<'line'> = {
  id: 'plan-track-casing',
  type: 'line',
  source: TRACKS_SOURCE_ID,
  layout: { 'line-join': 'round', 'line-cap': 'round' },
  paint: { 'line-color': MAP_COLOURS.casing, 'line-width': byZoom(10, 3, 16, 5), 'line-opacity': 0.8 },
};

export const trackLineLayer: Layer<'line'> = {
  id: 'plan-track-line',
  type: 'line',
  source: TRACKS_SOURCE_ID,
  layout: { 'line-join': 'round', 'line-cap': 'round' },
  paint: { 'line-color': TRACK_PADDOCK_COLOURS.track, 'line-width': byZoom(10, 1.5, 16, 2.5), 'line-dasharray': [0.1, 2] },
};

export const trackLabelLayer: Layer<'symbol'> = {
  id: 'plan-track-labels',
  type: 'symbol',
  source: TRACKS_SOURCE_ID,
  minzoom: 14,
  layout: { 'symbol-placement': 'line', 'text-field': ['get', 'name'], 'text-font': [...MAP_FONTS.regular], 'text-size': 11, 'text-offset': [0, 0.9] },
  paint: { 'text-color': TRACK_PADDOCK_COLOURS.track, 'text-halo-color': MAP_COLOURS.casing, 'text-halo-width': 1.5 },
};
