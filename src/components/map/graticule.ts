import type { Feature, FeatureCollection, LineString } from 'geojson';

/** How coarse a graticule line is: every 5°, 1°, 0.1° or 0.01°. Coarser ranks show from lower zooms. */
export type GraticuleRank = 'five' | 'degree' | 'tenth' | 'hundredth';

export type GraticuleProperties = {
  rank: GraticuleRank;
  /** `meridian` runs north–south (constant longitude), `parallel` east–west (constant latitude). */
  axis: 'meridian' | 'parallel';
  /** Readable coordinate, e.g. `25.43° S`, `142.1° E`. */
  label: string;
};

/** [west, south, east, north] in WGS84 degrees. */
export type BboxWgs84 = readonly [number, number, number, number];

/** Mainland Australia and Tasmania with a margin: where Gullyline's properties are. */
export const AUSTRALIA_BBOX_WGS84: BboxWgs84 = [112, -44, 154, -10];

const HUNDREDTHS_PER_DEGREE = 100;

function rankOf(hundredths: number): GraticuleRank {
  if (hundredths % 500 === 0) return 'five';
  if (hundredths % 100 === 0) return 'degree';
  if (hundredths % 10 === 0) return 'tenth';
  return 'hundredth';
}

function formatDegrees(hundredths: number, rank: GraticuleRank, positive: string, negative: string): string {
  const decimals = rank === 'hundredth' ? 2 : rank === 'tenth' ? 1 : 0;
  const hemisphere = hundredths > 0 ? ` ${positive}` : hundredths < 0 ? ` ${negative}` : '';
  return `${(Math.abs(hundredths) / HUNDREDTHS_PER_DEGREE).toFixed(decimals)}°${hemisphere}`;
}

/**
 * A graticule of straight lines every 0.01° over `bbox`, each tagged with its rank and a label.
 * Positions are [lon, lat] in WGS84 degrees (RFC 7946). Lines are counted in whole hundredths of
 * a degree so that no floating-point drift creeps into positions or labels.
 *
 * @throws {RangeError} when bbox is not finite, not west < east and south < north, or not
 *   within longitude −180…180 and latitude −85…85 (Web Mercator's useful range).
 */
export function createGraticule(bbox: BboxWgs84 = AUSTRALIA_BBOX_WGS84): FeatureCollection<LineString, GraticuleProperties> {
  const [west, south, east, north] = bbox;
  if (
    ![west, south, east, north].every(Number.isFinite) ||
    west >= east ||
    south >= north ||
    west < -180 ||
    east > 180 ||
    south < -85 ||
    north > 85
  ) {
    throw new RangeError(`Expected a graticule bbox [west, south, east, north] in degrees, got [${bbox.join(', ')}]`);
  }
  const features: Feature<LineString, GraticuleProperties>[] = [];
  const firstLon = Math.ceil(west * HUNDREDTHS_PER_DEGREE);
  const lastLon = Math.floor(east * HUNDREDTHS_PER_DEGREE);
  for (let lon = firstLon; lon <= lastLon; lon++) {
    const rank = rankOf(lon);
    features.push({
      type: 'Feature',
      properties: { rank, axis: 'meridian', label: formatDegrees(lon, rank, 'E', 'W') },
      geometry: { type: 'LineString', coordinates: [[lon / HUNDREDTHS_PER_DEGREE, south], [lon / HUNDREDTHS_PER_DEGREE, north]] },
    });
  }
  const firstLat = Math.ceil(south * HUNDREDTHS_PER_DEGREE);
  const lastLat = Math.floor(north * HUNDREDTHS_PER_DEGREE);
  for (let lat = firstLat; lat <= lastLat; lat++) {
    const rank = rankOf(lat);
    features.push({
      type: 'Feature',
      properties: { rank, axis: 'parallel', label: formatDegrees(lat, rank, 'N', 'S') },
      geometry: { type: 'LineString', coordinates: [[west, lat / HUNDREDTHS_PER_DEGREE], [east, lat / HUNDREDTHS_PER_DEGREE]] },
    });
  }
  return { type: 'FeatureCollection', features };
}

/**
 * The bbox to draw the graticule over for a property: Australia when the extent lies inside
 * it (the usual case, so the style stays the same), otherwise the extent with a 1° margin.
 */
export function graticuleBboxFor(extentWgs84: BboxWgs84 | null): BboxWgs84 {
  if (!extentWgs84) return AUSTRALIA_BBOX_WGS84;
  const [west, south, east, north] = extentWgs84;
  const [aWest, aSouth, aEast, aNorth] = AUSTRALIA_BBOX_WGS84;
  if (west >= aWest && south >= aSouth && east <= aEast && north <= aNorth) return AUSTRALIA_BBOX_WGS84;
  return [Math.max(-180, west - 1), Math.max(-85, south - 1), Math.min(180, east + 1), Math.min(85, north + 1)];
}
