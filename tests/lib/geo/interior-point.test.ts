/**
 * interiorPoint on hand-made polygons, checked with Turf's booleanPointInPolygon (Turf 7.4,
 * @turf/boolean-point-in-polygon), a general-purpose library.
 */
import { booleanPointInPolygon, polygon } from '@turf/turf';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { interiorPoint } from '../../../src/lib/geo/interior-point';
import { deepFreeze } from '../crossings/geometry/helpers';

type Ring = [number, number][];
const inside = (rings: Ring[], p: [number, number]) => booleanPointInPolygon(p, polygon(rings), { ignoreBoundary: true });

describe('interiorPoint', () => {
  it('gives the middle of a square', () => {
    expect(interiorPoint([[[0, 0], [2, 0], [2, 2], [0, 2], [0, 0]]])).toEqual([1, 1]);
  });

  it('lands inside a U whose centroid lies in the gap, and outside a hole', () => {
    const u: Ring = [[0, 0], [3, 0], [3, 3], [2, 3], [2, 1], [1, 1], [1, 3], [0, 3], [0, 0]];
    expect(inside([u], interiorPoint([u]))).toBe(true);
    const holed: Ring[] = [[[0, 0], [10, 0], [10, 10], [0, 10], [0, 0]], [[2, 2], [2, 8], [8, 8], [8, 2], [2, 2]]];
    expect(inside(holed, interiorPoint(holed))).toBe(true);
  });

  it('lands inside random star-shaped polygons (Turf)', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0.1, max: 1, noNaN: true }), { minLength: 3, maxLength: 30 }), (radii) => {
        const ring: Ring = radii.map((r, k) => [r * Math.cos((2 * Math.PI * k) / radii.length), r * Math.sin((2 * Math.PI * k) / radii.length)]);
        ring.push(ring[0]!);
        expect(inside([ring], interiorPoint([ring]))).toBe(true);
      }),
    );
  });

  it('does not modify its input, and refuses a ring of two corners', () => {
    expect(() => interiorPoint(deepFreeze([[[0, 0], [1, 0], [1, 1], [0, 0]]] as Ring[]))).not.toThrow();
    expect(() => interiorPoint([[[0, 0], [1, 0], [0, 0]]])).toThrow(/at least three corners/);
  });
});
