import geodesic from 'geographiclib-geodesic';

const WGS84 = geodesic.Geodesic.WGS84;

/**
 * The interior vertices of a line with their chainage (metres along the line, geodesic) and how
 * far the line turns there (degrees, −180…180, positive to the right), from the geodesic
 * azimuths of the segments either side (GeographicLib, Karney 2013).
 *
 * @param coordinates - `[lon, lat]` degrees, at least two
 */
export function fenceVertices(coordinates: readonly (readonly [number, number])[]): { chainageM: number; deflectionDeg: number }[] {
  const segments = coordinates.slice(1).map(([lon2, lat2], i) => {
    const [lon1, lat1] = coordinates[i]!;
    const { s12, azi1, azi2 } = WGS84.Inverse(lat1, lon1, lat2, lon2);
    return { lengthM: s12 ?? 0, startAzimuthDeg: azi1 ?? 0, endAzimuthDeg: azi2 ?? 0 };
  });
  const vertices: { chainageM: number; deflectionDeg: number }[] = [];
  let chainageM = 0;
  for (let i = 0; i < segments.length - 1; i++) {
    chainageM += segments[i]!.lengthM;
    const turn = (((segments[i + 1]!.startAzimuthDeg - segments[i]!.endAzimuthDeg + 540) % 360) + 360) % 360 - 180;
    vertices.push({ chainageM, deflectionDeg: turn });
  }
  return vertices;
}
