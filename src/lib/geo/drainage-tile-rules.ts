// What the drainage tiles hold at each zoom, shared by the tile cutter (server) and the map's layers
// (browser) without pulling the cutter into the browser's bundle.

/** The layer name inside every drainage tile (a map layer's `source-layer`). */
export const DRAINAGE_TILE_LAYER = 'drainage';
/** Tiles are cut to this zoom; the map draws closer zooms from them (overzoom). */
export const DRAINAGE_TILE_MAX_ZOOM = 14;
/** Tile coordinates are checked up to this zoom (the deepest a slippy-map client asks for). */
export const TILE_ZOOM_LIMIT = 24;

/**
 * The smallest stream order shown from each zoom on: order 3 and up always, order 2 from zoom 12,
 * all from 13. A whole station's headwaters at once are a blur, and drawing them is most of a
 * first load. The map's layer filter and the tiles share these steps, so a tile carries nothing
 * its zoom hides.
 */
export const DRAINAGE_ORDER_STEPS: readonly { fromZoom: number; minOrder: number }[] = [
  { fromZoom: 0, minOrder: 3 },
  { fromZoom: 12, minOrder: 2 },
  { fromZoom: 13, minOrder: 1 },
];

/** The smallest stream order shown at a zoom (integer zoom of a tile, or a map zoom). */
export function minStreamOrderAt(zoom: number): number {
  let minOrder = DRAINAGE_ORDER_STEPS[0]!.minOrder;
  for (const step of DRAINAGE_ORDER_STEPS) if (zoom >= step.fromZoom) minOrder = step.minOrder;
  return minOrder;
}
