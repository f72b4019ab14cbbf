import geodesic from 'geographiclib-geodesic';

const WGS84 = geodesic.Geodesic.WGS84;

/**
 * Length of a line along the WGS84 ellipsoid, metres (geodesic segments; Karney 2013,
 * "Algorithms for geodesics", J. Geodesy 87:43–55, through GeographicLib).
 *
 * @param coordinates - `[lon, lat]` degrees
 */
export function lineLengthM(coordinates: readonly (readonly [number, number])[]): number {
  let total = 0;
  for (let i = 1; i < coordinates.length; i++) {
    const [lon1, lat1] = coordinates[i - 1]!;
    const [lon2, lat2] = coordinates[i]!;
    total += WGS84.Inverse(lat1, lon1, lat2, lon2).s12 ?? 0;
  }
  return total;
}

/**
 * Area of a polygon on the WGS84 ellipsoid in hectares (GeographicLib's geodesic polygon area),
 * holes subtracted.
 *
 * @param rings - outer ring then holes, `[lon, lat]`, closed or not
 */
export function polygonAreaHa(rings: readonly (readonly (readonly [number, number])[])[]): number {
  const ringArea = (ring: readonly (readonly [number, number])[]) => {
    const polygon = WGS84.Polygon(false);
    const open = ring.length > 1 && ring[0]![0] === ring.at(-1)![0] && ring[0]![1] === ring.at(-1)![1] ? ring.slice(0, -1) : ring;
    for (const [lon, lat] of open) polygon.AddPoint(lat, lon);
    // sign = true: a clockwise ring gives minus its area (with false it would give the area of
    // the rest of the earth), so the absolute value is the ring's area whichever way it runs.
    return Math.abs(polygon.Compute(false, true).area ?? 0);
  };
  const [outer, ...holes] = rings;
  if (!outer) return 0;
  return (ringArea(outer) - holes.reduce((sum, hole) => sum + ringArea(hole), 0)) / 10_000;
}

/** `[west, south, east, north]` of a set of positions. */
export function boundsOf(positions: readonly (readonly [number, number])[]): [number, number, number, number] {
  let [w, s, e, n] = [Infinity, Infinity, -Infinity, -Infinity];
  for (const [lon, lat] of positions) {
    w = Math.min(w, lon);
    s = Math.min(s, lat);
    e = Math.max(e, lon);
    n = Math.max(n, lat);
  }
  return [w, s, e, n];
}

/**
 * A ring turned to run counterclockwise (RFC 7946 §3.1.6 for exterior rings; holes clockwise),
 * by the sign of its shoelace area in degrees, which is enough to tell the direction.
 */
export function orientRing(ring: readonly (readonly [number, number])[], counterclockwise: boolean): [number, number][] {
  let twiceArea = 0;
  for (let i = 0; i < ring.length - 1; i++) twiceArea += ring[i]![0] * ring[i + 1]![1] - ring[i + 1]![0] * ring[i]![1];
  const isCounterclockwise = twiceArea > 0;
  const copy = ring.map(([lon, lat]) => [lon, lat] as [number, number]);
  return isCounterclockwise === counterclockwise ? copy : copy.reverse();
}
