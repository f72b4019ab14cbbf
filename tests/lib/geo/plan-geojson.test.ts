import { check } from '@placemarkio/check-geojson';
import fc from 'fast-check';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Polygon, Position } from 'geojson';
import { describe, expect, it } from 'vitest';
import { planToGeoJson } from '../../../src/lib/geo/plan-geojson';
import type { PlanForExport } from '../../../src/lib/geo/plan-data';
import { ogrFeatures } from '../../helpers/gdal';
import { samplePlan, TRICKY_NAME } from '../../helpers/plan-fixture';

/** Twice the signed shoelace area in degrees²: positive for a counter-clockwise ring (lon east, lat north). */
const signedArea = (ring: Position[]) => ring.slice(0, -1).reduce((sum, [x1, y1], i) => sum + x1! * ring[i + 1]![1]! - ring[i + 1]![0]! * y1!, 0);
const polygonsOf = (plan: PlanForExport) =>
  planToGeoJson(plan).features.filter((f) => f.properties?.featureType === 'paddock').map((f) => (f.geometry as Polygon).coordinates);

describe('planToGeoJson', () => {
  it('passes a GeoJSON validator', () => {
    // @placemarkio/check-geojson (Placemark, successor of Mapbox's geojsonhint): throws on any RFC 7946 structure error.
    expect(() => check(JSON.stringify(planToGeoJson(samplePlan())))).not.toThrow();
  });

  it('writes exterior rings counter-clockwise and holes clockwise, whatever the input winding', () => {
    // RFC 7946 §3.1.6: "A linear ring MUST follow the right-hand rule with respect to the area it
    // bounds, i.e., exterior rings are counterclockwise, and holes are clockwise." The fixture
    // gives them the other way round.
    const input = samplePlan().paddocks[0]!.rings;
    expect(signedArea(input[0]!)).toBeLessThan(0);
    const [[outer, hole]] = polygonsOf(samplePlan()) as [Position[][]];
    expect(signedArea(outer!)).toBeGreaterThan(0);
    expect(signedArea(hole!)).toBeLessThan(0);
    // The same corners, only the direction changed.
    expect([...outer!].reverse()).toEqual(input[0]);
  });

  it('rewinds any star-shaped ring to counter-clockwise (property test)', () => {
    const ring = fc
      .array(fc.double({ min: 0.001, max: 0.05, noNaN: true }), { minLength: 3, maxLength: 24 })
      .chain((radii) => fc.tuple(fc.constant(radii), fc.boolean()))
      .map(([radii, clockwise]) => {
        const corners = radii.map((r, i) => {
          const a = ((clockwise ? -1 : 1) * 2 * Math.PI * i) / radii.length;
          return [141.6 + r * Math.cos(a), -31.4 + r * Math.sin(a)] as [number, number];
        });
        return [...corners, corners[0]!];
      });
    fc.assert(
      fc.property(ring, (outer) => {
        const plan = { ...samplePlan(), paddocks: [{ id: 1, name: 'P', rings: [outer], areaHa: 1 }] };
        const [[written]] = polygonsOf(plan) as [Position[][]];
        return signedArea(written!) > 0;
      }),
    );
  });

  it('gives GDAL the same rings it writes itself under its RFC 7946 option', () => {
    // GDAL 3.6 (Debian gdal-bin), ogr2ogr -lco RFC7946=YES: "polygons are written such that
    // exterior rings follow the counter-clockwise orientation and interior rings are clockwise"
    // (GDAL GeoJSON driver documentation). Rewinding our output must change nothing.
    const dir = mkdtempSync(path.join(tmpdir(), 'plan-geojson-'));
    const file = path.join(dir, 'plan.geojson');
    writeFileSync(file, JSON.stringify(planToGeoJson(samplePlan())));
    const rewound = ogrFeatures(file, undefined, ['-lco', 'RFC7946=YES']).filter((f) => f.properties.featureType === 'paddock');
    const ours = polygonsOf(samplePlan());
    expect(rewound.map((f) => f.geometry?.coordinates)).toEqual(ours);
    // And GDAL reads every feature with its featureType.
    const all = ogrFeatures(file);
    expect(all.map((f) => f.properties.featureType)).toEqual(planToGeoJson(samplePlan()).features.map((f) => f.properties?.featureType));
  });

  it('holds fence lines, paddocks, crossings and layout points with their properties', () => {
    const plan = samplePlan();
    const collection = planToGeoJson(plan);
    expect(collection.gullylineExport).toEqual({ formatVersion: 1, property: 'Saltbush & <Rise>', exportedAt: '2026-03-01T09:30:00.000Z' });
    const count = (type: string) => collection.features.filter((f) => f.properties?.featureType === type).length;
    expect([count('fence-line'), count('paddock'), count('crossing'), count('layout-point')]).toEqual([2, 1, 2, 8]);
    const fence = collection.features[0]!;
    expect(fence.geometry).toEqual({ type: 'LineString', coordinates: plan.fenceLines[0]!.coordinates });
    expect(fence.properties).toEqual({
      featureType: 'fence-line', id: 11, fenceNo: 1, name: TRICKY_NAME, status: 'approved', lengthM: 960.12, wireSpec: plan.fenceLines[0]!.wireSpec, version: 3,
    });
    const crossing = collection.features.find((f) => f.properties?.featureType === 'crossing')!;
    expect(crossing.properties).toMatchObject({
      id: 201, tag: 'F1 X1', fenceLineId: 11, fenceName: TRICKY_NAME, drainageLineId: 7, kind: 'crossing', angleDeg: 84.3, angleClass: 'good', streamOrder: 3,
      catchmentHa: 812.35, designStatus: 'designed', style: 'continuous-floodgate', floodLevelM: 151.23, floodMaxDepthM: 1.46, floodWidthM: 18.75,
    });
    const stayed = collection.features.find((f) => f.properties?.waypoint === 'F1 X1 P2S')!;
    expect(stayed.properties).toMatchObject({ featureType: 'layout-point', kind: 'floodgate-post', braced: true, hungDropperLink: 'open', crossingId: 201, elevationM: 149.8 });
    expect(stayed.geometry).toEqual({ type: 'Point', coordinates: [141.6455, -31.44092] });
  });

  it('does not change its input', () => {
    const plan = samplePlan();
    planToGeoJson(plan);
    expect(plan).toEqual(samplePlan());
  });

  it('refuses an open paddock ring and a position out of range, saying what was expected', () => {
    const open = { ...samplePlan(), paddocks: [{ id: 9, name: 'Open', rings: [[[141, -31], [141.1, -31], [141.1, -31.1]]] as [number, number][][], areaHa: 1 }] };
    expect(() => planToGeoJson(open)).toThrow(/paddock 9 ring 0 must be closed/);
    const far = samplePlan();
    far.fenceLines[1]!.coordinates[0] = [200, -31];
    expect(() => planToGeoJson(far)).toThrow(/fence line 14 position 0 must be \[lon, lat\]/);
  });
});

describe('planToGeoJson with a scope (a work order)', () => {
  it('keeps only the scoped fence lines, crossings and their layout points, no paddocks, tagged as in the whole plan', () => {
    const plan = samplePlan();
    const scoped = planToGeoJson(plan, { fenceLineIds: new Set([11]), crossingIds: new Set([202]) });
    const of = (type: string) => scoped.features.filter((f) => f.properties?.featureType === type);
    expect(of('fence-line').map((f) => f.properties?.id)).toEqual([11]);
    expect(of('paddock')).toEqual([]);
    // 202 lies second along fence 11 by chainage, with or without 201 in the scope.
    expect(of('crossing').map((f) => [f.properties?.id, f.properties?.tag])).toEqual([[202, 'F1 X2']]);
    expect(of('layout-point')).toEqual([]);
    expect(planToGeoJson(plan, { fenceLineIds: new Set(), crossingIds: new Set([201]) }).features.filter((f) => f.properties?.featureType === 'layout-point')).toHaveLength(8);
    expect(() => check(JSON.stringify(scoped))).not.toThrow();
  });
});
