import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ImportError, importLines } from '../../../src/lib/geo/import-lines';

// Samples follow the GPX 1.1 schema (topografix.com/GPX/1/1) and OGC KML 2.2.
const GPX = `<?xml version="1.0"?>
<gpx version="1.1" creator="test" xmlns="http://www.topografix.com/GPX/1/1">
  <wpt lat="-31.43" lon="141.64"><name>Gate</name></wpt>
  <trk><name>Old fence</name>
    <trkseg><trkpt lat="-31.430" lon="141.640"><ele>150</ele></trkpt><trkpt lat="-31.431" lon="141.641"/></trkseg>
    <trkseg><trkpt lat="-31.432" lon="141.642"/><trkpt lat="-31.433" lon="141.643"/><trkpt lat="-31.434" lon="141.644"/></trkseg>
  </trk>
  <rte><name>Creek walk</name><rtept lat="-31.44" lon="141.65"/><rtept lat="-31.45" lon="141.66"/></rte>
</gpx>`;

const KML = `<?xml version="1.0" encoding="UTF-8"?>
<kml xmlns="http://www.opengis.net/kml/2.2"><Document>
  <Folder><name>Plan</name>
    <Folder><name>Inner</name>
      <Placemark><name>Cross fence</name><description><![CDATA[<b>new</b> <script>alert(1)</script>fence]]></description>
        <LineString><coordinates>141.64,-31.43,0 141.65,-31.44,0</coordinates></LineString></Placemark>
    </Folder>
    <Placemark><name>Two legs</name><MultiGeometry>
      <LineString><coordinates>141.60,-31.40 141.61,-31.41</coordinates></LineString>
      <LineString><coordinates>141.62,-31.42 141.63,-31.43</coordinates></LineString>
    </MultiGeometry></Placemark>
    <Placemark><name>Paddock</name><Polygon><outerBoundaryIs><LinearRing>
      <coordinates>141.6,-31.4 141.7,-31.4 141.7,-31.5 141.6,-31.4</coordinates></LinearRing></outerBoundaryIs></Polygon></Placemark>
    <Placemark><name>Trough</name><Point><coordinates>141.6,-31.4</coordinates></Point></Placemark>
  </Folder>
</Document></kml>`;

describe('importLines', () => {
  it('reads GPX track segments as separate lines and routes as routes, skipping waypoints', () => {
    const result = importLines(GPX);
    expect(result.format).toBe('gpx');
    expect(result.lines.map((l) => [l.name, l.kind, l.coordinates.length])).toEqual([
      ['Old fence (part 1)', 'track', 2],
      ['Old fence (part 2)', 'track', 3],
      ['Creek walk', 'route', 2],
    ]);
    // Heights are dropped; RFC 7946 order [lon, lat].
    expect(result.lines[0]!.coordinates[0]).toEqual([141.64, -31.43]);
  });

  it('reads KML lines in nested folders and MultiGeometry, polygons, and strips markup from descriptions', () => {
    const result = importLines(KML);
    expect(result.lines.map((l) => l.name)).toEqual(['Cross fence', 'Two legs (part 1)', 'Two legs (part 2)']);
    expect(result.lines[0]!.description).toBe('new fence');
    expect(result.lines[0]!.description).not.toMatch(/[<>]/);
    expect(result.polygons.map((p) => p.name)).toEqual(['Paddock']);
    expect(result.skipped.join()).toMatch(/"Trough" is a Point/);
  });

  it('reads the demo scenario files', () => {
    const subdivision = importLines(readFileSync('data-samples/saltbush-rise-subdivision.kml', 'utf8'));
    expect(subdivision.lines.map((l) => l.name)).toEqual(['North cross fence', 'East paddock fence', 'South cross fence']);
    expect(subdivision.polygons).toHaveLength(2);
    expect(importLines(readFileSync('data-samples/saltbush-rise-old-boundary.gpx', 'utf8')).lines[0]!.coordinates.length).toBeGreaterThan(300);
  });

  it.each([
    ['an empty GPX', '<gpx version="1.1" xmlns="http://www.topografix.com/GPX/1/1"></gpx>', /no lines or polygons/],
    ['a KML with only points', '<kml><Placemark><name>P</name><Point><coordinates>141,-31</coordinates></Point></Placemark></kml>', /no lines or polygons/],
    ['broken XML', '<gpx><trk>', /not well-formed XML/],
    ['text that is not XML', 'lat,lon\n-31,141', /not well-formed XML/],
    ['another XML format', '<svg xmlns="http://www.w3.org/2000/svg"/>', /not GPX or KML/],
  ])('refuses %s with a message saying what is wrong', (_label, text, message) => {
    expect(() => importLines(text)).toThrow(ImportError);
    expect(() => importLines(text)).toThrow(message);
  });
});
