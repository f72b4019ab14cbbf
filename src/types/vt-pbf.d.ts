// vt-pbf ships no types: the part Gullyline uses, written from its README and index.js (3.1.3).
declare module 'vt-pbf' {
  import type { LegacyTile } from 'geojson-vt';

  /** Encodes geojson-vt tiles, one per named layer, as a Mapbox Vector Tile (protobuf). */
  export function fromGeojsonVt(layers: Record<string, LegacyTile>, options?: { version?: number; extent?: number }): Uint8Array;

  const vtpbf: { fromGeojsonVt: typeof fromGeojsonVt };
  export default vtpbf;
}
