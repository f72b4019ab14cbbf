import { DOMParser, type Element } from '@xmldom/xmldom';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { KML_NAMESPACE, planToKml } from '../../../src/lib/geo/plan-kml';
import { ogrFeatures, ogrLayers } from '../../helpers/gdal';
import { samplePlan, TRICKY_NAME } from '../../helpers/plan-fixture';

/** Parses strictly: any parser error or warning fails the test. */
function parse(text: string) {
  const problems: string[] = [];
  const doc = new DOMParser({ onError: (level, message) => problems.push(`${level}: ${message}`) }).parseFromString(text, 'text/xml');
  expect(problems).toEqual([]);
  return doc;
}
const childText = (element: Element, name: string) => Array.from(element.childNodes).find((n) => n.nodeName === name)?.textContent ?? null;

function writeTemp(text: string): string {
  const file = path.join(mkdtempSync(path.join(tmpdir(), 'plan-kml-')), 'plan.kml');
  writeFileSync(file, text);
  return file;
}

describe('planToKml', () => {
  it('is well-formed XML in the KML 2.2 namespace, with a folder per kind', () => {
    // OGC KML 2.2 standard (OGC 07-147r2, 2008): its XML namespace is http://www.opengis.net/kml/2.2.
    const doc = parse(planToKml(samplePlan()));
    expect(doc.documentElement!.localName).toBe('kml');
    expect(doc.documentElement!.namespaceURI).toBe('http://www.opengis.net/kml/2.2');
    expect(KML_NAMESPACE).toBe('http://www.opengis.net/kml/2.2');
    const document = doc.getElementsByTagNameNS(KML_NAMESPACE, 'Document')[0]!;
    const topFolders = Array.from(document.childNodes).filter((n) => n.nodeName === 'Folder') as Element[];
    expect(topFolders.map((f) => childText(f, 'name'))).toEqual(['Fence lines', 'Paddocks', 'Crossings', 'Crossing layouts']);
    const placemarks = Array.from(doc.getElementsByTagNameNS(KML_NAMESPACE, 'Placemark'));
    expect(placemarks).toHaveLength(2 + 1 + 2 + 8);
    // Every Placemark says what it is in its ExtendedData, and points at one of our styles.
    const styleIds = new Set(Array.from(doc.getElementsByTagNameNS(KML_NAMESPACE, 'Style')).map((s) => `#${s.getAttribute('id')}`));
    for (const placemark of placemarks) {
      const types = Array.from(placemark.getElementsByTagNameNS(KML_NAMESPACE, 'Data')).filter((d) => d.getAttribute('name') === 'featureType');
      expect(types.map((d) => d.textContent)).toHaveLength(1);
      expect(styleIds.has(childText(placemark, 'styleUrl')!)).toBe(true);
    }
  });

  it('escapes markup in names and descriptions, which parse back to the same text', () => {
    const text = planToKml(samplePlan());
    expect(text).not.toContain('<script>');
    expect(text).toContain('North &lt;fence&gt; &amp; "gate" &lt;script&gt;alert(1)&lt;/script&gt;');
    const doc = parse(text);
    const names = Array.from(doc.getElementsByTagNameNS(KML_NAMESPACE, 'Placemark')).map((p) => childText(p, 'name'));
    expect(names[0]).toBe(TRICKY_NAME);
    expect(childText(doc.getElementsByTagNameNS(KML_NAMESPACE, 'Document')[0]!, 'name')).toBe('Saltbush & <Rise> — fence plan');
    // Names a person can read: a crossing by its tag and fence, a layout point by its waypoint name and what stands there.
    expect(names).toContain(`F1 X1 — ${TRICKY_NAME}`);
    expect(names).toContain('F1 X1 P2S: Floodgate post 2, stayed');
  });

  it('drops characters XML 1.0 cannot carry, so strict readers still open the file', () => {
    const plan = samplePlan();
    plan.fenceLines[1]!.name = 'Bell\u0007 fence\u0000';
    const text = planToKml(plan);
    expect(text).not.toMatch(/[\u0000\u0007]/);
    // GDAL 3.6's KML reader (Debian gdal-bin), an independent XML parser, refuses malformed XML.
    const fences = ogrFeatures(writeTemp(text), 'Fence lines');
    expect(fences.map((f) => f.properties.Name)).toEqual([TRICKY_NAME, 'Bell fence']);
  });

  it('reads in GDAL with its folders as layers, the same names, coordinates and fields', () => {
    // GDAL 3.6 (Debian gdal-bin) as an independent KML reader.
    const plan = samplePlan();
    const file = writeTemp(planToKml(plan));
    expect(ogrLayers(file).slice(0, 4)).toEqual(['Fence lines', 'Paddocks', 'Crossings', 'Crossing layouts']);
    const fences = ogrFeatures(file, 'Fence lines');
    expect(fences.map((f) => f.properties.Name)).toEqual(plan.fenceLines.map((f) => f.name));
    expect(fences.map((f) => f.properties.status)).toEqual(['approved', 'planned']);
    fences.forEach((feature, i) => {
      const coordinates = feature.geometry!.coordinates as number[][];
      plan.fenceLines[i]!.coordinates.forEach(([lon, lat], j) => {
        expect(Math.abs(coordinates[j]![0]! - lon)).toBeLessThan(1e-9);
        expect(Math.abs(coordinates[j]![1]! - lat)).toBeLessThan(1e-9);
      });
    });
    const [paddock] = ogrFeatures(file, 'Paddocks');
    expect(paddock!.geometry!.type).toBe('Polygon');
    expect((paddock!.geometry!.coordinates as unknown[]).length).toBe(2);
    const crossings = ogrFeatures(file, 'Crossings');
    expect(crossings.map((f) => [f.properties.featureType, f.properties.angleClass ?? null])).toEqual([['crossing', 'good'], ['crossing', null]]);
  });

  it('does not change its input', () => {
    const plan = samplePlan();
    planToKml(plan);
    expect(plan).toEqual(samplePlan());
  });
});
