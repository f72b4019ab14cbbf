import proj4 from 'proj4';

/** Turns `[x, y]` in a CRS into `[lon, lat]` in WGS84 degrees. */
export type ToWgs84 = (xy: readonly [number, number]) => [lon: number, lat: number];

/**
 * A converter from a CRS, given by its proj4 definition (from the EPSG registry), to WGS84
 * longitude and latitude, through proj4js. GDA94 and GDA2020 are taken as WGS84 at the metre
 * level, as their EPSG definitions' zero `towgs84` says.
 *
 * @param fromProj4 - the source CRS as a proj4 string, e.g. "+proj=utm +zone=54 +south …"
 * @throws Error from proj4 when the definition cannot be parsed
 */
export function createToWgs84(fromProj4: string): ToWgs84 {
  const converter = proj4(fromProj4, 'WGS84');
  return ([x, y]) => {
    const [lon, lat] = converter.forward([x, y]);
    return [lon!, lat!];
  };
}

/** The inverse: WGS84 `[lon, lat]` into the CRS's `[x, y]`. */
export function createFromWgs84(toProj4: string): (lonLat: readonly [number, number]) => [x: number, y: number] {
  const converter = proj4('WGS84', toProj4);
  return ([lon, lat]) => {
    const [x, y] = converter.forward([lon, lat]);
    return [x!, y!];
  };
}

/** Rounds degrees to 7 decimals (about 1 cm), enough for the map and much smaller to store. */
export function roundLonLat([lon, lat]: readonly [number, number]): [number, number] {
  return [Math.round(lon * 1e7) / 1e7, Math.round(lat * 1e7) / 1e7];
}
