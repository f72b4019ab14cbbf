import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ImportError } from '../../../src/lib/geo/import-lines';
import { importPlan } from '../../../src/lib/geo/import-plan';
import type { PlanForExport } from '../../../src/lib/geo/plan-data';
import { planToGeoJson } from '../../../src/lib/geo/plan-geojson';
import { planToKml } from '../../../src/lib/geo/plan-kml';
import { samplePlan } from '../../helpers/plan-fixture';

const exporters = { geojson: (plan: PlanForExport) => JSON.stringify(planToGeoJson(plan)), kml: planToKml } as const;

function expectSameFenceLines(plan: PlanForExport, text: string) {
  const imported = importPlan(text);
  expect(imported.fenceLines.map(({ name, status, wireSpec }) => ({ name, status, wireSpec }))).toEqual(
    plan.fenceLines.map(({ name, status, wireSpec }) => ({ name, status, wireSpec })),
  );
  imported.fenceLines.forEach((fence, i) => {
    const expected = plan.fenceLines[i]!.coordinates;
    expect(fence.coordinates).toHaveLength(expected.length);
    fence.coordinates.forEach(([lon, lat], j) => {
      expect(Math.abs(lon - expected[j]![0])).toBeLessThanOrEqual(1e-9);
      expect(Math.abs(lat - expected[j]![1])).toBeLessThanOrEqual(1e-9);
    });
  });
  return imported;
}

const refusal = (text: string) => {
  try {
    importPlan(text);
  } catch (error) {
    expect(error).toBeInstanceOf(ImportError);
    return (error as Error).message;
  }
  throw new Error('expected an ImportError');
};

const collection = (features: unknown[]) => JSON.stringify({ type: 'FeatureCollection', features });
const fenceFeature = (properties: Record<string, unknown>, coordinates: unknown = [[141.64, -31.44], [141.65, -31.44]]) => ({
  type: 'Feature', geometry: { type: 'LineString', coordinates }, properties: { featureType: 'fence-line', name: 'Cross fence', status: 'planned', ...properties },
});

describe('importPlan', () => {
  it.each(['geojson', 'kml'] as const)('reads back from %s the fence lines and paddocks that were exported', (format) => {
    const plan = samplePlan();
    const imported = expectSameFenceLines(plan, exporters[format](plan));
    expect(imported.format).toBe(format);
    // The fixture's rings run the wrong way; the export rewinds them (RFC 7946 §3.1.6), so they come back reversed.
    expect(imported.paddocks).toEqual([{ name: 'Creek paddock', rings: plan.paddocks[0]!.rings.map((ring) => [...ring].reverse()) }]);
    // 2 crossings and 8 layout points are worked out again, not read.
    expect([imported.derived, imported.unrecognised]).toEqual([10, 0]);
  });

  it.each(['geojson', 'kml'] as const)('gives back any coordinates to 1e-9 degrees through %s (property test)', (format) => {
    const lonLat = fc.tuple(fc.double({ min: -180, max: 180, noNaN: true }), fc.double({ min: -90, max: 90, noNaN: true }));
    fc.assert(
      fc.property(fc.array(lonLat, { minLength: 2, maxLength: 8 }), (coordinates) => {
        const base = samplePlan();
        const plan = { ...base, crossings: [], paddocks: [], fenceLines: [{ ...base.fenceLines[0]!, coordinates }] };
        expectSameFenceLines(plan, exporters[format](plan));
      }),
      { numRuns: 60 },
    );
  });

  it.each([
    ['an empty file', '', /file is empty/],
    ['a file of blanks', ' \n\t ', /file is empty/],
    ['binary garbage', '\u00ff\u00d8\u00ff\u00e0 JFIF', /neither GeoJSON nor KML/],
    ['broken JSON', '{"type": "FeatureCollection", "features": [', /not valid JSON/],
    ['a single Feature', JSON.stringify(fenceFeature({})), /not a GeoJSON FeatureCollection \(its type is "Feature"\)/],
    ['a FeatureCollection with no features', collection([]), /GeoJSON file has no features: there is nothing to import/],
    [
      'a FeatureCollection of only points',
      collection([{ type: 'Feature', geometry: { type: 'Point', coordinates: [141.6, -31.4] }, properties: { name: 'Trough' } }, { type: 'Feature', geometry: { type: 'Point', coordinates: [141.7, -31.4] }, properties: null }]),
      /no Gullyline fence lines or paddocks: its 2 feature\(s\) \(2 Points\) carry no Gullyline featureType.*imported as tracks/,
    ],
    ['only crossings and layout points', JSON.stringify({ ...planToGeoJson(samplePlan()), features: planToGeoJson(samplePlan()).features.filter((f) => f.geometry.type === 'Point') }), /only crossings and layout points \(10\)/],
    ['a fence line with an unknown status', collection([fenceFeature({ status: 'half-built' })]), /feature 1 \(fence line "Cross fence"\): status: Invalid enum value/],
    ['a fence line of one point', collection([fenceFeature({}, [[141.64, -31.44]])]), /fence line "Cross fence"\): coordinates: A fence line needs at least two points/],
    ['a fence line drawn as a polygon', collection([{ ...fenceFeature({}), geometry: { type: 'Polygon', coordinates: [] } }]), /type: A fence line is a LineString/],
    ['a latitude out of range', collection([fenceFeature({}, [[141.64, -95], [141.65, -31.44]])]), /coordinates.0: Longitudes lie between -180 and 180, latitudes between -90 and 90/],
    ['a fence line with no wires', collection([fenceFeature({ wireSpec: { wireHeightsM: [] } })]), /wireSpec.wireHeightsM: A fence needs at least one wire/],
    [
      'a paddock ring that does not close',
      collection([{ type: 'Feature', geometry: { type: 'Polygon', coordinates: [[[141, -31], [141.1, -31], [141.1, -31.1], [141, -31.1]]] }, properties: { featureType: 'paddock', name: 'Gap' } }]),
      /feature 1 \(paddock "Gap"\): geometry.coordinates.0: A paddock ring must end where it starts/,
    ],
    ['a plan from a newer format', JSON.stringify({ ...planToGeoJson(samplePlan()), gullylineExport: { formatVersion: 99 } }), /newer Gullyline \(format 99/],
    ['XML that is not KML', '<gpx version="1.1" xmlns="http://www.topografix.com/GPX/1/1"></gpx>', /XML but not KML \(its root element is <gpx>\)/],
    ['broken XML', '<kml><Document>', /not well-formed XML/],
    ['a KML from another program', readFileSync('data-samples/saltbush-rise-subdivision.kml', 'utf8'), /no Gullyline fence lines or paddocks.*carry no Gullyline featureType/],
    ['a KML wire spec that is not JSON', planToKml(samplePlan()).replace(/"wireHeightsM":\[0\.25/, '"wireHeightsM":[0.25,,'), /feature 1 \(fence line "North <fence>.*wireSpec: is not JSON text/],
  ])('refuses %s with a message saying what to do', (_label, text, message) => {
    expect(refusal(text)).toMatch(message);
  });

  it('imports nothing when one fence line of several is bad, naming it', () => {
    const message = refusal(collection([fenceFeature({ name: 'Good' }), fenceFeature({ name: 'Bad', status: '??' })]));
    expect(message).toMatch(/^Nothing was imported: feature 2 \(fence line "Bad"\): status/);
  });
});
