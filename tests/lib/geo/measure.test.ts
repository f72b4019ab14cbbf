/**
 * polygonAreaHa against GeographicLib (geographiclib-geodesic, Karney 2013) computing the same
 * rings itself, and against plain geometry (a 1 km square holds 100 ha).
 */
import geographiclib from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';
import { orientRing, polygonAreaHa } from '../../../src/lib/geo/measure';
import { destination } from '../crossings/geometry/helpers';

const sw: [number, number] = [141.64, -31.44];
const se = destination(sw, 90, 1000);
const nw = destination(sw, 0, 1000);
const ne = destination(nw, 90, 1000);
const counterclockwise = [sw, se, ne, nw, sw];
const clockwise = [...counterclockwise].reverse();

describe('polygonAreaHa', () => {
  it('gives a 1 km square 100 ha whichever way its ring runs (clockwise-ring-area-is-not-the-rest-of-the-earth)', () => {
    // GeographicLib's own unsigned area of the counterclockwise ring.
    const polygon = geographiclib.Geodesic.WGS84.Polygon(false);
    for (const [lon, lat] of counterclockwise.slice(0, -1)) polygon.AddPoint(lat, lon);
    const reference = polygon.Compute(false, true).area! / 10_000;
    expect(reference).toBeCloseTo(100, 2);
    expect(polygonAreaHa([counterclockwise])).toBeCloseTo(reference, 9);
    expect(polygonAreaHa([clockwise])).toBeCloseTo(reference, 9);
  });

  it('subtracts a hole, given clockwise as RFC 7946 has it', () => {
    const inner = [destination(destination(sw, 90, 400), 0, 400)];
    inner.push(destination(inner[0]!, 90, 200), destination(destination(inner[0]!, 0, 200), 90, 200), destination(inner[0]!, 0, 200), inner[0]!);
    // Analytic: 100 ha − 0.2 km × 0.2 km = 96 ha.
    expect(polygonAreaHa([counterclockwise, orientRing(inner, false)])).toBeCloseTo(96, 2);
  });
});
