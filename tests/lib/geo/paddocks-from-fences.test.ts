/**
 * paddocksFromFences on invented fence layouts near the demo property's latitude (31.44° S).
 * Outside sources: GeographicLib (geographiclib-geodesic, Karney 2013) builds the squares by its
 * direct solution and gives the reference areas through its own polygon area; the analytic
 * figures are plain geometry (1 km × 1 km = 100 ha).
 */
import fc from 'fast-check';
import geographiclib from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';
import { DEFAULT_SNAP_M, paddocksFromFences } from '../../../src/lib/geo/paddocks-from-fences';
import { deepFreeze, destination } from '../crossings/geometry/helpers';

type P = [number, number];
const WGS84 = geographiclib.Geodesic.WGS84;

/** GeographicLib's area of a ring of corners (edges as geodesics), hectares, unsigned. */
function geographicLibAreaHa(corners: readonly P[]): number {
  const polygon = WGS84.Polygon(false);
  for (const [lon, lat] of corners) polygon.AddPoint(lat, lon);
  return Math.abs(polygon.Compute(false, false).area!) / 10_000;
}

const SW: P = [141.64, -31.44];
/** A square `sideM` a side from `sw`: corners by GeographicLib's direct solution (east, then north). */
function square(sw: P, sideM: number) {
  const se = destination(sw, 90, sideM);
  const nw = destination(sw, 0, sideM);
  const ne = destination(nw, 90, sideM);
  return { sw, se, ne, nw };
}
const { sw, se, ne, nw } = square(SW, 1000);
const SOUTH: P[] = [sw, se];
const EAST: P[] = [se, ne];
const NORTH: P[] = [ne, nw];
const WEST: P[] = [nw, sw];
const mid = (a: P, b: P): P => [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];

describe('paddocksFromFences', () => {
  it('finds one paddock of 100 ha inside four fences making a 1 km square', () => {
    const areas = paddocksFromFences([SOUTH, EAST, NORTH, WEST]);
    expect(areas).toHaveLength(1);
    // Analytic: 1000 m × 1000 m = 100 ha; the corners' geodesic polygon (GeographicLib) within 1e-6.
    expect(areas[0]!.areaHa).toBeCloseTo(100, 1);
    expect(areas[0]!.areaHa / geographicLibAreaHa([sw, se, ne, nw]) - 1).toBeLessThan(1e-6);
    expect(areas[0]!.rings).toHaveLength(1);
    expect(areas[0]!.rings[0]).toHaveLength(5);
    expect(areas[0]!.rings[0]![0]).toEqual(areas[0]!.rings[0]![4]);
  });

  it('gives the outer ring counterclockwise (RFC 7946), however the fences run', () => {
    const [area] = paddocksFromFences([[sw, nw], [nw, ne], [ne, se], [se, sw]]);
    const ring = area!.rings[0]!;
    let twice = 0;
    for (let k = 1; k < ring.length; k++) twice += ring[k - 1]![0] * ring[k]![1] - ring[k]![0] * ring[k - 1]![1];
    expect(twice).toBeGreaterThan(0);
  });

  it('splits a square in two along a middle fence', () => {
    const middle: P[] = [mid(sw, se), mid(nw, ne)];
    const areas = paddocksFromFences([SOUTH, EAST, NORTH, WEST, middle]);
    expect(areas).toHaveLength(2);
    // Analytic: two halves of 50 ha; together the whole square (GeographicLib).
    for (const area of areas) expect(area.areaHa).toBeCloseTo(50, 1);
    expect(areas[0]!.areaHa + areas[1]!.areaHa).toBeCloseTo(geographicLibAreaHa([sw, se, ne, nw]), 6);
  });

  it('finds nothing in open lines: three sides, a lone line, two lines crossing', () => {
    expect(paddocksFromFences([SOUTH, EAST, NORTH])).toEqual([]);
    expect(paddocksFromFences([SOUTH])).toEqual([]);
    expect(paddocksFromFences([[sw, ne], [se, nw]])).toEqual([]);
    expect(paddocksFromFences([])).toEqual([]);
  });

  it('closes a corner whose ends are 3 m apart, but not one 8 m apart unless told to', () => {
    const short = (to: P, gapM: number): P[] => [se, destination(to, 180, gapM)]; // east fence stops short of the NE corner
    expect(paddocksFromFences([SOUTH, short(ne, 3), NORTH, WEST])).toHaveLength(1);
    expect(paddocksFromFences([SOUTH, short(ne, 3), NORTH, WEST])[0]!.areaHa).toBeCloseTo(100, 0);
    expect(paddocksFromFences([SOUTH, short(ne, 8), NORTH, WEST])).toEqual([]);
    expect(paddocksFromFences([SOUTH, short(ne, 8), NORTH, WEST], { snapM: 10 })).toHaveLength(1);
    expect(DEFAULT_SNAP_M).toBe(5);
  });

  it('joins a fence that stops 3 m short of another, and drops one that runs 3 m past it', () => {
    const short: P[] = [mid(sw, se), destination(mid(nw, ne), 180, 3)];
    const long: P[] = [mid(sw, se), destination(mid(nw, ne), 0, 3)];
    for (const middle of [short, long]) {
      const areas = paddocksFromFences([SOUTH, EAST, NORTH, WEST, middle]);
      expect(areas).toHaveLength(2);
      expect(areas[0]!.areaHa + areas[1]!.areaHa).toBeCloseTo(100, 1);
    }
  });

  it('closes one fence drawn round to its start, within the snapping distance', () => {
    expect(paddocksFromFences([[sw, se, ne, nw, sw]])).toHaveLength(1);
    expect(paddocksFromFences([[sw, se, ne, nw, destination(sw, 0, 2)]])[0]!.areaHa).toBeCloseTo(100, 0);
  });

  it('gives a free-standing fenced square inside another as a hole of the outer paddock', () => {
    const inner = square(destination(destination(SW, 90, 400), 0, 400), 200);
    const areas = paddocksFromFences([SOUTH, EAST, NORTH, WEST, [inner.sw, inner.se, inner.ne, inner.nw, inner.sw]]);
    expect(areas).toHaveLength(2);
    // Analytic: 100 − 4 ha around, 4 ha inside.
    expect(areas[0]!.rings).toHaveLength(2);
    expect(areas[0]!.areaHa).toBeCloseTo(96, 1);
    expect(areas[1]!.areaHa).toBeCloseTo(4, 2);
  });

  it('gives each paddock a point inside it, also for an L-shaped one whose centroid lies outside', () => {
    // Two 100 m wide arms along the south and west fences. Analytic centroid: (286 m, 286 m) from
    // the SW corner, in the cut-away block.
    const elbow = destination(destination(SW, 90, 100), 0, 100);
    const lShape: P[] = [sw, se, destination(se, 0, 100), elbow, destination(nw, 90, 100), nw, sw];
    const [area] = paddocksFromFences([lShape]);
    // Analytic: 100 − 0.9 km × 0.9 km = 19 ha.
    expect(area!.areaHa).toBeCloseTo(19, 1);
    const [lon, lat] = area!.insidePoint;
    expect(lon > sw[0] && lat > sw[1] && lon < se[0] && lat < nw[1]).toBe(true);
    expect(lon < elbow[0] || lat < elbow[1]).toBe(true);
  });

  it('does not modify its input', () => {
    const lines = deepFreeze([SOUTH, EAST, NORTH, WEST].map((line) => line.map((p) => [...p])));
    expect(() => paddocksFromFences(lines)).not.toThrow();
  });

  it('refuses a position that is not [lon, lat] degrees, and a bad snapping distance', () => {
    expect(() => paddocksFromFences([[sw, [141.6, -95]]])).toThrow(/fence line 0, vertex 1: latitude -95 is outside/);
    expect(() => paddocksFromFences([SOUTH], { snapM: -1 })).toThrow(/snapM must be between 0 and 100 metres/);
  });

  it('finds rows × columns paddocks in a grid of fences whose ends miss by up to 3 m either way', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 4 }),
        fc.integer({ min: 1, max: 4 }),
        fc.array(fc.tuple(fc.double({ min: 0, max: 360, noNaN: true }), fc.double({ min: 0, max: 3, noNaN: true })), { minLength: 20, maxLength: 20 }),
        (rows, columns, jitter) => {
          let j = 0;
          const nudge = (p: P): P => {
            const [bearing, distanceM] = jitter[j++ % jitter.length]!;
            return destination(p, bearing, distanceM);
          };
          // Grid lines run from border to border, their inner ends nudged; the border is exact.
          const lines: P[][] = [SOUTH, EAST, NORTH, WEST];
          for (let c = 1; c < columns; c++) lines.push([nudge(destination(sw, 90, (1000 * c) / columns)), nudge(destination(nw, 90, (1000 * c) / columns))]);
          for (let r = 1; r < rows; r++) lines.push([nudge(destination(sw, 0, (1000 * r) / rows)), nudge(destination(se, 0, (1000 * r) / rows))]);
          const areas = paddocksFromFences(lines);
          expect(areas).toHaveLength(rows * columns);
          // The cells tile the square: the nudged ends all end up on the border (GeographicLib's area
          // of the square). Not exactly: an end snapped onto a border fence sits on its straight-in-degrees
          // line, which bows about 1 cm from the geodesic over 1 km here, a few m² per split.
          expect(Math.abs(areas.reduce((sum, area) => sum + area.areaHa, 0) - geographicLibAreaHa([sw, se, ne, nw]))).toBeLessThan(0.005);
          // Each of a cell's sides moves at most 3 m: within 4 × 3 m × 1 km = 1.2 ha of its share (analytic bound).
          for (const area of areas) expect(Math.abs(area.areaHa - 100 / (rows * columns))).toBeLessThan(1.2);
        },
      ),
      { numRuns: 60 },
    );
  });
});
