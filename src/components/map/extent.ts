import type { FeatureCollection, Point, Polygon } from 'geojson';
import type { BboxWgs84 } from './graticule';

export type ExtentFeatureProperties = { name: string };

/**
 * The extent if it can be drawn and fitted, else null: four finite numbers with
 * west ≤ east and south ≤ north, longitudes in −180…180 and latitudes in −85…85
 * (a box crossing the antimeridian is not supported).
 */
export function toUsableExtent(extentWgs84: BboxWgs84 | null | undefined): BboxWgs84 | null {
  if (!extentWgs84 || extentWgs84.length !== 4) return null;
  const [west, south, east, north] = extentWgs84;
  if (![west, south, east, north].every(Number.isFinite)) return null;
  if (west > east || south > north) return null;
  if (west < -180 || east > 180 || south < -85 || north > 85) return null;
  return [west, south, east, north];
}

/**
 * The extent [west, south, east, north] as GeoJSON for the `property-extent` source: the box as
 * a Polygon (counter-clockwise outer ring, RFC 7946) and its centre as a Point for the label.
 */
export function createExtentFeatures(
  extentWgs84: BboxWgs84,
  name: string,
): FeatureCollection<Polygon | Point, ExtentFeatureProperties> {
  const [west, south, east, north] = extentWgs84;
  return {
    type: 'FeatureCollection',
    features: [
      {
        type: 'Feature',
        properties: { name },
        geometry: {
          type: 'Polygon',
          coordinates: [[[west, south], [east, south], [east, north], [west, north], [west, south]]],
        },
      },
      {
        type: 'Feature',
        properties: { name },
        geometry: { type: 'Point', coordinates: [(west + east) / 2, (south + north) / 2] },
      },
    ],
  };
}
