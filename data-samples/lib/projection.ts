/**
 * Between EPSG:7854 (GDA2020 / MGA zone 54) and WGS84 longitude/latitude, with proj4. GDA2020 is
 * treated as equal to WGS84 (a difference of well under 2 m, far below what the demo needs).
 */
import proj4 from 'proj4';
import { CRS_PROJ4, type ProjectedPoint } from './scenario-constants';

const converter = proj4(CRS_PROJ4, 'WGS84');

/** `[lon, lat]` in degrees, WGS84, of `[x, y]` in EPSG:7854 metres. */
export function toLonLat(point: ProjectedPoint): [number, number] {
  const [lon, lat] = converter.forward([point[0], point[1]]);
  return [lon!, lat!];
}

/** `[x, y]` in EPSG:7854 metres of `[lon, lat]` in degrees, WGS84. */
export function toProjected(lonLat: readonly [number, number]): [number, number] {
  const [x, y] = converter.inverse([lonLat[0], lonLat[1]]);
  return [x!, y!];
}
