import GeoJSONVT from 'geojson-vt';
import type { Feature, FeatureCollection, LineString } from 'geojson';
import vtpbf from 'vt-pbf';
import { DRAINAGE_TILE_LAYER, DRAINAGE_TILE_MAX_ZOOM, minStreamOrderAt, TILE_ZOOM_LIMIT } from './drainage-tile-rules';

export { DRAINAGE_TILE_LAYER, DRAINAGE_TILE_MAX_ZOOM, minStreamOrderAt, TILE_ZOOM_LIMIT };

/** One drainage line to tile: `[lon, lat]` in WGS84 degrees (RFC 7946) and its Strahler order. */
export type DrainageTileLine = { id: number; streamOrder: number; coordinates: readonly (readonly [number, number])[] };

/** Vector tiles of a set of drainage lines. */
export type DrainageTiles = {
  /**
   * The Mapbox Vector Tile (spec 2.1) at z/x/y (slippy-map tile numbers, y from the north), one
   * layer {@link DRAINAGE_TILE_LAYER} with each line's `id` as the feature id and `streamOrder`,
   * or null when no line shown at that zoom crosses the tile.
   * @throws RangeError when z is not an integer in 0–{@link TILE_ZOOM_LIMIT} or x, y not in 0…2^z − 1
   */
  tile(z: number, x: number, y: number): Uint8Array | null;
};

/**
 * Cuts drainage lines into vector tiles with geojson-vt (clipping with a buffer, Douglas–Peucker
 * simplification per zoom, 4096-unit extent) and encodes them with vt-pbf. Tiles are cut on
 * demand and kept by geojson-vt; each leaves out the stream orders its zoom hides
 * ({@link minStreamOrderAt}), so a caller that serves low zooms may pass only the bigger channels
 * and build the full set once someone zooms in. Input is not mutated.
 * @throws TypeError when a line has fewer than two points or a non-finite coordinate
 */
export function createDrainageTiles(lines: readonly DrainageTileLine[]): DrainageTiles {
  const features: Feature<LineString>[] = lines.map((line) => {
    if (line.coordinates.length < 2 || !line.coordinates.every(([lon, lat]) => Number.isFinite(lon) && Number.isFinite(lat))) {
      throw new TypeError(`Drainage line ${line.id} needs at least two points of finite [lon, lat].`);
    }
    return {
      type: 'Feature',
      id: line.id,
      properties: { streamOrder: line.streamOrder },
      geometry: { type: 'LineString', coordinates: line.coordinates.map(([lon, lat]) => [lon, lat]) },
    };
  });
  const collection: FeatureCollection<LineString> = { type: 'FeatureCollection', features };
  const index = new GeoJSONVT(collection, { maxZoom: DRAINAGE_TILE_MAX_ZOOM, indexMaxZoom: 5, tolerance: 3, extent: 4096, buffer: 64 });
  return {
    tile(z, x, y) {
      if (!Number.isInteger(z) || z < 0 || z > TILE_ZOOM_LIMIT) throw new RangeError(`Tile zoom must be a whole number from 0 to ${TILE_ZOOM_LIMIT}.`);
      const side = 2 ** z;
      if (!Number.isInteger(x) || !Number.isInteger(y) || x < 0 || y < 0 || x >= side || y >= side) {
        throw new RangeError(`At zoom ${z}, tile x and y must be whole numbers from 0 to ${side - 1}.`);
      }
      const tile = index.getTile(z, x, y);
      const minOrder = minStreamOrderAt(z);
      const shown = (tile?.features ?? []).filter((feature) => Number(feature.tags?.streamOrder) >= minOrder);
      if (shown.length === 0) return null;
      return vtpbf.fromGeojsonVt({ [DRAINAGE_TILE_LAYER]: { features: shown } }, { version: 2, extent: 4096 });
    },
  };
}
