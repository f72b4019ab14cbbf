/**
 * checkPaddockRings on invented boundaries near 31.44° S, built with GeographicLib's direct
 * solution (geographiclib-geodesic); the bow-tie's crossing point checked against Turf's `kinks`
 * (Turf 7.4), a general-purpose library.
 */
import { kinks, polygon } from '@turf/turf';
import { describe, expect, it } from 'vitest';
import { checkPaddockRings } from '../../../src/lib/geo/check-paddock-rings';
import { deepFreeze, destination } from '../crossings/geometry/helpers';

type P = [number, number];
const sw: P = [141.64, -31.44];
const se = destination(sw, 90, 500);
const nw = destination(sw, 0, 500);
const ne = destination(nw, 90, 500);
const messages = (rings: P[][]) => checkPaddockRings(rings).problems.map((p) => `${p.ringIndex}: ${p.message}`);

describe('checkPaddockRings', () => {
  it('closes an open ring and keeps a closed one as it is', () => {
    expect(checkPaddockRings([[sw, se, ne, nw]])).toEqual({ rings: [[sw, se, ne, nw, sw]], problems: [] });
    expect(checkPaddockRings([[sw, se, ne, nw, sw]])).toEqual({ rings: [[sw, se, ne, nw, sw]], problems: [] });
  });

  it('drops a repeated corner (a double click) and counts distinct corners', () => {
    expect(checkPaddockRings([[sw, se, se, ne, nw]]).rings).toEqual([[sw, se, ne, nw, sw]]);
    expect(messages([[sw, se]])).toEqual(['0: a paddock boundary needs at least three distinct corners, got 2']);
    expect(messages([[sw, se, se, sw]])).toEqual(['0: a paddock boundary needs at least three distinct corners, got 2']);
  });

  it('says where a bow-tie boundary crosses itself (the same point as Turf kinks)', () => {
    const bowTie = [sw, se, nw, ne, sw];
    const [problem] = checkPaddockRings([bowTie]).problems;
    expect(problem!.message).toMatch(/^the boundary crosses or touches itself at \[141\.642\d+, -31\.437\d+\], near corner 1$/);
    const [turfLon, turfLat] = kinks(polygon([bowTie])).features[0]!.geometry.coordinates;
    const [, lon, lat] = /\[([\d.]+), (-[\d.]+)\]/.exec(problem!.message)!.map(Number);
    expect(lon).toBeCloseTo(turfLon!, 6);
    expect(lat).toBeCloseTo(turfLat!, 6);
  });

  it('refuses corners on one line (no area) and positions out of range', () => {
    const onALine = [sw, destination(sw, 90, 100), destination(sw, 90, 200)];
    expect(messages([onALine])).toEqual(['0: the boundary encloses no area: its corners lie on one line']);
    // 1 mm off the line: still on it at the 1 cm of a repeated corner.
    expect(messages([[...onALine, destination(destination(sw, 90, 50), 0, 0.001)]])).toEqual(['0: the boundary encloses no area: its corners lie on one line']);
    expect(messages([[sw, [141.6, 95], se]])).toEqual(['0: corner 1: latitude 95 is outside −90…90 degrees (is the order [lon, lat]?)']);
  });

  it('accepts a hole inside the outer ring and refuses one that crosses it or overlaps another', () => {
    const hole = (from: P, sizeM: number): P[] => [from, destination(from, 0, sizeM), destination(destination(from, 0, sizeM), 90, sizeM), destination(from, 90, sizeM), from];
    const inner = hole(destination(destination(sw, 90, 100), 0, 100), 100);
    expect(checkPaddockRings([[sw, se, ne, nw], inner]).problems).toEqual([]);
    expect(messages([[sw, se, ne, nw], hole(destination(sw, 180, 50), 100)])).toEqual(['1: a hole must lie wholly inside the outer boundary']);
    const overlapping = hole(destination(destination(sw, 90, 150), 0, 150), 100);
    expect(messages([[sw, se, ne, nw], inner, overlapping])).toEqual(['2: this hole overlaps hole 1']);
  });

  it('does not modify its input', () => {
    expect(() => checkPaddockRings(deepFreeze([[[...sw], [...se], [...ne]]]))).not.toThrow();
  });
});
