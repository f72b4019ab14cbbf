/**
 * Outside reference: GeographicLib's geodesics (C. F. F. Karney 2013, "Algorithms for geodesics",
 * Journal of Geodesy 87:43–55), from the npm package geographiclib-geodesic. Ellipsoids: GRS80
 * a = 6378137 m, 1/f = 298.257222101, and WGS84 1/f = 298.257223563 (as in the EPSG registry,
 * ellipsoids 7019 and 7030).
 */
import fc from 'fast-check';
import geographiclib from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';
import { geographicCellSizeM, radiiOfCurvatureM } from '../../../src/lib/geo/ellipsoid-cell-size';

const GRS80 = { a: 6378137, f: 1 / 298.257222101 };
const WGS84 = { a: 6378137, f: 1 / 298.257223563 };
const ARC_SECOND = 1 / 3600;
const relative = (value: number, reference: number) => Math.abs(value - reference) / reference;

describe('radiiOfCurvatureM', () => {
  it('gives N = a and M = a(1 − e²) on the equator and a²/b at the pole (hand-checked)', () => {
    const e2 = GRS80.f * (2 - GRS80.f);
    const b = GRS80.a * (1 - GRS80.f);
    expect(radiiOfCurvatureM(0, GRS80).primeVerticalM).toBeCloseTo(6378137, 6);
    expect(radiiOfCurvatureM(0, GRS80).meridianM).toBeCloseTo(6378137 * (1 - e2), 6);
    expect(radiiOfCurvatureM(90, GRS80).meridianM).toBeCloseTo((GRS80.a * GRS80.a) / b, 6);
    expect(radiiOfCurvatureM(-90, GRS80).primeVerticalM).toBeCloseTo((GRS80.a * GRS80.a) / b, 6);
  });

  it('gives the sphere its radius everywhere', () => {
    expect(radiiOfCurvatureM(37, { a: 6371000, f: 0 })).toEqual({ meridianM: 6371000, primeVerticalM: 6371000 });
  });
});

describe('geographicCellSizeM', () => {
  it('on a sphere of 6371 km, a 1° cell at 60° is 55 597.46 m wide and 111 194.93 m high (R·Δλ·cos φ, R·Δφ)', () => {
    const size = geographicCellSizeM([60], 1, 1, { a: 6371000, f: 0 });
    expect(size.cellWidthM[0]).toBeCloseTo((6371000 * Math.PI) / 180 / 2, 6);
    expect(size.cellWidthM[0]).toBeCloseTo(55597.46, 2);
    expect(size.cellHeightM).toBeCloseTo(111194.93, 2);
  });

  it('a 1 arc-second cell on the GRS80 equator is a·π/648000 = 30.92 m wide', () => {
    const size = geographicCellSizeM([0], ARC_SECOND, ARC_SECOND, GRS80);
    expect(size.cellWidthM[0]).toBeCloseTo((6378137 * Math.PI) / 648000, 9);
    expect(size.cellWidthM[0]).toBeCloseTo(30.92, 2);
  });

  // GeographicLib (Karney 2013): the geodesic across one cell along its row, and along the meridian.
  it.each([
    ['GRS80', GRS80],
    ['WGS84', WGS84],
  ])('agrees with GeographicLib geodesics on %s for 1 arc-second cells from 80° S to 80° N', (_name, ellipsoid) => {
    const geodesic = new geographiclib.Geodesic.Geodesic(ellipsoid.a, ellipsoid.f);
    for (const latitudeDeg of [-80, -60, -31.43, -1, 0, 15, 45, 60, 80]) {
      const size = geographicCellSizeM([latitudeDeg], ARC_SECOND, ARC_SECOND, ellipsoid);
      const across = geodesic.Inverse(latitudeDeg, 141, latitudeDeg, 141 + ARC_SECOND).s12!;
      const along = geodesic.Inverse(latitudeDeg - ARC_SECOND / 2, 141, latitudeDeg + ARC_SECOND / 2, 141).s12!;
      // The issue asks for 0.1 %; the closed forms agree far closer than that.
      expect(relative(size.cellWidthM[0]!, across), `width at ${latitudeDeg}°`).toBeLessThan(1e-7);
      expect(relative(size.cellHeightM, along), `height at ${latitudeDeg}°`).toBeLessThan(1e-7);
    }
  });

  it('takes the height at the middle latitude, within 0.1 % of GeographicLib on the top and bottom rows of a 1° tile', () => {
    const geodesic = new geographiclib.Geodesic.Geodesic(GRS80.a, GRS80.f);
    const rows = 3600;
    const latitudes = Array.from({ length: rows }, (_, row) => -31 - (row + 0.5) * ARC_SECOND);
    const size = geographicCellSizeM(latitudes, ARC_SECOND, ARC_SECOND, GRS80);
    for (const row of [0, rows - 1]) {
      const lat = latitudes[row]!;
      const along = geodesic.Inverse(lat - ARC_SECOND / 2, 141, lat + ARC_SECOND / 2, 141).s12!;
      expect(relative(size.cellHeightM, along)).toBeLessThan(1e-3);
      const across = geodesic.Inverse(lat, 141, lat, 141 + ARC_SECOND).s12!;
      expect(relative(size.cellWidthM[row]!, across)).toBeLessThan(1e-7);
    }
  });

  it('narrows towards either pole and is symmetric about the equator', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 89, noNaN: true }), fc.double({ min: 0.001, max: 0.9, noNaN: true }), (latitudeDeg, stepDeg) => {
        const size = geographicCellSizeM([latitudeDeg, latitudeDeg + stepDeg, -latitudeDeg], 0.01, 0.01, GRS80);
        expect(size.cellWidthM[1]!).toBeLessThan(size.cellWidthM[0]!);
        expect(size.cellWidthM[2]!).toBeCloseTo(size.cellWidthM[0]!, 9);
        expect(size.cellWidthM[0]!).toBeLessThanOrEqual((GRS80.a * 0.01 * Math.PI) / 180 + 1e-9);
      }),
    );
  });

  it('does not modify the latitudes it is given', () => {
    const latitudes = Object.freeze([-31.4, -31.5, -31.6]);
    const size = geographicCellSizeM(latitudes, ARC_SECOND, ARC_SECOND, GRS80);
    expect(latitudes).toEqual([-31.4, -31.5, -31.6]);
    expect(size.cellWidthM).toHaveLength(3);
  });

  it('rejects latitudes, cell sizes and ellipsoids out of range with a message', () => {
    expect(() => geographicCellSizeM([], 1, 1, GRS80)).toThrow(/at least one row/);
    expect(() => geographicCellSizeM([91], 1, 1, GRS80)).toThrow(/between −90 and 90/);
    expect(() => geographicCellSizeM([Number.NaN], 1, 1, GRS80)).toThrow(/rowLatitudesDeg\[0\]/);
    expect(() => geographicCellSizeM([90], 1, 1, GRS80)).toThrow(/pole/);
    expect(() => geographicCellSizeM([0], 0, 1, GRS80)).toThrow(/cellWidthDeg/);
    expect(() => geographicCellSizeM([0], 1, -1, GRS80)).toThrow(/cellHeightDeg/);
    expect(() => geographicCellSizeM([0], 1, 1, { a: 0, f: 0 })).toThrow(/semi-major axis/);
    expect(() => geographicCellSizeM([0], 1, 1, { a: 6378137, f: 1 })).toThrow(/flattening/);
  });
});
