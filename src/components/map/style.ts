import type { LayerSpecification, StyleSpecification } from 'maplibre-gl';
import { AUSTRALIA_BBOX_WGS84, createGraticule, type BboxWgs84, type GraticuleRank } from './graticule';
import { GLYPHS_URL, MAP_COLOURS, MAP_FONTS } from './theme';

/** Source id of the generated graticule in the base style. */
export const GRATICULE_SOURCE_ID = 'graticule';

/**
 * The lowest label layer of the base style. Pass it as `beforeId` to put lines and fills under
 * the base map's labels, so a boundary never strikes through a coordinate label.
 */
export const BASE_FIRST_LABEL_LAYER_ID = 'graticule-label-hundredth';

export type BaseStyleOptions = {
  /** Where to draw the graticule; defaults to Australia. Keep it small: lines are every 0.01°. */
  graticuleBboxWgs84?: BboxWgs84;
};

type RankLook = { colour: string; width: number; lineMinZoom: number; labelMinZoom: number; textSize: number };

// Coarse ranks appear first; each finer rank comes in once its lines are tens of pixels apart
// (0.01° of longitude is about 1 km: 16 px apart at zoom 11.5, 60 px at zoom 13, at 31° S).
const RANK_LOOKS: Record<GraticuleRank, RankLook> = {
  five: { colour: MAP_COLOURS.gridMajor, width: 1.2, lineMinZoom: 0, labelMinZoom: 2, textSize: 12 },
  degree: { colour: MAP_COLOURS.gridMajor, width: 1, lineMinZoom: 5, labelMinZoom: 6.5, textSize: 12 },
  tenth: { colour: MAP_COLOURS.gridMedium, width: 0.8, lineMinZoom: 8.5, labelMinZoom: 10, textSize: 11 },
  hundredth: { colour: MAP_COLOURS.gridMinor, width: 0.6, lineMinZoom: 11.5, labelMinZoom: 13, textSize: 11 },
};

function rankFilter(rank: GraticuleRank): ['==', ['get', 'rank'], GraticuleRank] {
  return ['==', ['get', 'rank'], rank];
}

function graticuleLineLayer(rank: GraticuleRank): LayerSpecification {
  const look = RANK_LOOKS[rank];
  return {
    id: `graticule-line-${rank}`,
    type: 'line',
    source: GRATICULE_SOURCE_ID,
    minzoom: look.lineMinZoom,
    filter: rankFilter(rank),
    paint: { 'line-color': look.colour, 'line-width': look.width, 'line-opacity': 0.7 },
  };
}

function graticuleLabelLayer(rank: GraticuleRank): LayerSpecification {
  const look = RANK_LOOKS[rank];
  return {
    id: `graticule-label-${rank}`,
    type: 'symbol',
    source: GRATICULE_SOURCE_ID,
    minzoom: look.labelMinZoom,
    filter: rankFilter(rank),
    layout: {
      'symbol-placement': 'line',
      'symbol-spacing': 400,
      'text-field': ['get', 'label'],
      'text-font': [...MAP_FONTS.regular],
      'text-size': look.textSize,
      'text-max-angle': 30,
    },
    paint: { 'text-color': MAP_COLOURS.gridText, 'text-halo-color': MAP_COLOURS.ground, 'text-halo-width': 1.5 },
  };
}

/**
 * Gullyline's offline base map: a pale-clay ground and a 0.01° graticule with coordinate
 * labels, generated in code. It loads nothing from outside the app: no tiles, no sprite, and
 * glyphs from `/glyphs/{fontstack}/{range}.pbf` (built by scripts/build-glyphs.mjs).
 * Returns a new object on every call; callers that re-render should memoize it.
 *
 * @throws {RangeError} when `graticuleBboxWgs84` is not a valid [west, south, east, north].
 */
export function createBaseStyle(options: BaseStyleOptions = {}): StyleSpecification {
  // Finest first, so coarser lines draw on top and their labels win placement.
  const finestFirst: GraticuleRank[] = ['hundredth', 'tenth', 'degree', 'five'];
  return {
    version: 8,
    name: 'Gullyline offline base',
    glyphs: GLYPHS_URL,
    sources: {
      [GRATICULE_SOURCE_ID]: {
        type: 'geojson',
        data: createGraticule(options.graticuleBboxWgs84 ?? AUSTRALIA_BBOX_WGS84),
        // Straight two-point lines: no simplification needed, and a coarser tile pyramid is plenty.
        tolerance: 0,
        maxzoom: 14,
      },
    },
    layers: [
      { id: 'background', type: 'background', paint: { 'background-color': MAP_COLOURS.ground } },
      ...finestFirst.map(graticuleLineLayer),
      ...finestFirst.map(graticuleLabelLayer),
    ],
  };
}
