import { interiorPoint } from './interior-point';
import { orientRing, polygonAreaHa } from './measure';
import { nodeFenceLines } from './node-fence-lines';
import { planarFaces } from './planar-faces';

/** An area closed off by fence lines. */
export interface EnclosedArea {
  /** Outer ring counterclockwise, then holes clockwise (RFC 7946), each closed, `[lon, lat]` degrees. */
  readonly rings: [number, number][][];
  /** Geodesic area on WGS84 in hectares (GeographicLib), holes subtracted. */
  readonly areaHa: number;
  /** A point inside the area (not on its edge or in a hole), `[lon, lat]`: `interiorPoint`. */
  readonly insidePoint: [number, number];
}

export interface PaddocksFromFencesOptions {
  /**
   * How far apart, in metres, two fence ends (or an end and another fence) may be and still
   * count as meeting. Default {@link DEFAULT_SNAP_M}.
   */
  readonly snapM?: number;
}

/**
 * Default gap closed between fence ends: 5 m, about the error of a hand-held GPS track or a
 * click on the map at paddock scale (a working figure, no published source). Keep it below the
 * width of the narrowest laneway, or the two sides of the lane meet.
 */
export const DEFAULT_SNAP_M = 5;

/** Faces smaller than this (m²) are slivers of rounding, not paddocks. */
const MIN_AREA_M2 = 1;

/**
 * The areas a set of fence lines closes off, as paddock outlines with their area.
 *
 * Fence ends that nearly meet are joined and the lines split wherever they meet
 * (`nodeFenceLines`: ends within `snapM` move together or onto the fence they stop short of);
 * then the closed areas are traced (`planarFaces`: stubs and lone lines close nothing and are
 * dropped; a ring of fence standing free inside an area becomes a hole of it). Each area is one
 * face: a paddock split by a middle fence gives two areas, not three.
 *
 * Not handled: fence lines astride the antimeridian.
 *
 * @param lines - fence lines, each `[lon, lat]` WGS84 degrees with at least two points; not modified
 * @param options - `snapM`, metres (0…100)
 * @returns the enclosed areas, largest first; none when nothing is closed off
 * @throws RangeError naming a line and vertex that is not a position, or a bad `snapM`
 */
export function paddocksFromFences(lines: readonly (readonly (readonly number[])[])[], options: PaddocksFromFencesOptions = {}): EnclosedArea[] {
  const snapM = options.snapM ?? DEFAULT_SNAP_M;
  if (!(Number.isFinite(snapM) && snapM >= 0 && snapM <= 100)) throw new RangeError(`snapM must be between 0 and 100 metres, got ${snapM}`);
  const { frame, nodes, edges } = nodeFenceLines(lines, snapM);
  const toLonLat = (n: number): [number, number] => [frame.lon0 + nodes[n]![0] / frame.kx, frame.lat0 + nodes[n]![1] / frame.ky];
  return planarFaces(nodes, edges)
    .filter((face) => face.area >= MIN_AREA_M2)
    .map((face) => {
      const rings = [orientRing(face.outer.map(toLonLat), true), ...face.holes.map((hole) => orientRing(hole.map(toLonLat), false))];
      return { rings, areaHa: polygonAreaHa(rings), insidePoint: interiorPoint(rings) };
    });
}
