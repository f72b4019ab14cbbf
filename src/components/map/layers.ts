import type { LayerSpecification } from 'maplibre-gl';
import { MAP_COLOURS, MAP_FONTS } from './theme';

type FillLayer = Extract<LayerSpecification, { type: 'fill' }>;
type LineLayer = Extract<LayerSpecification, { type: 'line' }>;
type SymbolLayer = Extract<LayerSpecification, { type: 'symbol' }>;

/**
 * Source id of the property extent: a FeatureCollection with the extent as a Polygon and a
 * Point at its centre that carries the label, both with a `name` property.
 */
export const PROPERTY_EXTENT_SOURCE_ID = 'property-extent';

const isPolygon: FillLayer['filter'] = ['==', ['geometry-type'], 'Polygon'];
const isPoint: SymbolLayer['filter'] = ['==', ['geometry-type'], 'Point'];

/** Ochre wash inside the property extent; light enough that the grid shows through. */
export const propertyExtentFill: FillLayer = {
  id: 'property-extent-fill',
  type: 'fill',
  source: PROPERTY_EXTENT_SOURCE_ID,
  filter: isPolygon,
  paint: { 'fill-color': MAP_COLOURS.extentFill, 'fill-opacity': 0.2 },
};

/** Pale casing under the boundary so the line keeps its edge in glare and over any ground. */
export const propertyExtentCasing: LineLayer = {
  id: 'property-extent-casing',
  type: 'line',
  source: PROPERTY_EXTENT_SOURCE_ID,
  filter: isPolygon,
  layout: { 'line-join': 'round' },
  paint: {
    'line-color': MAP_COLOURS.casing,
    'line-width': ['interpolate', ['linear'], ['zoom'], 4, 3, 14, 7],
    'line-opacity': 0.9,
  },
};

/** The property boundary: deep ochre, dashed to say "extent", not a surveyed fence. */
export const propertyExtentOutline: LineLayer = {
  id: 'property-extent-outline',
  type: 'line',
  source: PROPERTY_EXTENT_SOURCE_ID,
  filter: isPolygon,
  layout: { 'line-join': 'round' },
  paint: {
    'line-color': MAP_COLOURS.extentLine,
    'line-width': ['interpolate', ['linear'], ['zoom'], 4, 1.5, 14, 3],
    'line-dasharray': [3, 1.5],
  },
};

/** The property's name at the centre of its extent. */
export const propertyExtentLabel: SymbolLayer = {
  id: 'property-extent-label',
  type: 'symbol',
  source: PROPERTY_EXTENT_SOURCE_ID,
  filter: isPoint,
  layout: {
    'text-field': ['get', 'name'],
    'text-font': [...MAP_FONTS.bold],
    'text-size': ['interpolate', ['linear'], ['zoom'], 4, 13, 12, 17],
    'text-max-width': 12,
    'text-letter-spacing': 0.02,
    // The name is the one label that must always show; grid labels still make room for it.
    'text-allow-overlap': true,
  },
  paint: {
    'text-color': MAP_COLOURS.text,
    'text-halo-color': MAP_COLOURS.casing,
    'text-halo-width': 2,
    'text-halo-blur': 0.5,
  },
};

/** Draw order of the extent layers, bottom to top. */
export const propertyExtentLayers = [
  propertyExtentFill,
  propertyExtentCasing,
  propertyExtentOutline,
  propertyExtentLabel,
] as const;
