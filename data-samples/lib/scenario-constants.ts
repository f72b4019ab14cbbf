/**
 * Fixed facts of the invented "Saltbush Rise" demo scenario: where its elevation model sits in
 * GDA2020 / MGA zone 54, its grid, its seed and its file names. Saltbush Rise is not a real place.
 */

/** The fixed seed of every random choice in the demo scenario. */
export const SCENARIO_SEED = 20260314;

/** Property name (invented). */
export const PROPERTY_NAME = 'Saltbush Rise';

/** Region words for the manifest. */
export const PROPERTY_REGION = 'far west, inland — invented';

/** The note every demo file carries. */
export const INVENTED_NOTE = 'Demo data, invented for the Gullyline demo; not a real place.';

/** EPSG code of the elevation model's CRS: GDA2020 / MGA zone 54. */
export const CRS_EPSG = 7854;

/** proj4 definition of EPSG:7854 (GDA2020 / MGA zone 54; GDA2020 taken as equal to WGS84 here). */
export const CRS_PROJ4 =
  '+proj=utm +zone=54 +south +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs +type=crs';

/** Cell size of the elevation model in metres (square cells). */
export const CELL_SIZE_M = 5;

/** Columns of the elevation model (west to east). */
export const GRID_WIDTH = 600;

/** Rows of the elevation model (north to south). */
export const GRID_HEIGHT = 600;

/** Easting of the model's west edge, metres in EPSG:7854. */
export const ORIGIN_X = 560000;

/** Northing of the model's north edge, metres in EPSG:7854. */
export const ORIGIN_Y = 6523000;

/** Side of the square property in metres. */
export const EXTENT_SIZE_M = CELL_SIZE_M * GRID_WIDTH;

/** The GDAL nodata value written into the GeoTIFF. */
export const NODATA_VALUE = -9999;

/** Output file names, relative to `data-samples/`. */
export const FILE_NAMES = {
  elevationModel: 'saltbush-rise-dem.tif',
  boundaryTrack: 'saltbush-rise-old-boundary.gpx',
  creekTrack: 'saltbush-rise-creek.gpx',
  subdivision: 'saltbush-rise-subdivision.kml',
  manifest: 'saltbush-rise.json',
} as const;

/** A position `[x, y]` in metres in EPSG:7854 (easting, northing). */
export type ProjectedPoint = readonly [number, number];

/**
 * Position in EPSG:7854 of a point given in local metres from the property's south-west corner.
 *
 * @param eastM - metres east of the west edge
 * @param northM - metres north of the south edge
 */
export function localToProjected(eastM: number, northM: number): ProjectedPoint {
  return [ORIGIN_X + eastM, ORIGIN_Y - EXTENT_SIZE_M + northM];
}
