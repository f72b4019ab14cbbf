import { DOMParser, type Element } from '@xmldom/xmldom';
import fc from 'fast-check';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import type { PlanCrossing, PlanForExport, PlanLayoutPoint } from '../../../src/lib/geo/plan-data';
import { GPX_NAMESPACE, planToGpx } from '../../../src/lib/geo/plan-gpx';
import { MAX_WAYPOINT_NAME_LENGTH } from '../../../src/lib/geo/plan-numbering';
import { ogrFeatures, ogrLayers } from '../../helpers/gdal';
import { samplePlan, TRICKY_NAME } from '../../helpers/plan-fixture';

function waypoints(text: string): Element[] {
  const problems: string[] = [];
  const doc = new DOMParser({ onError: (level, message) => problems.push(`${level}: ${message}`) }).parseFromString(text, 'text/xml');
  expect(problems).toEqual([]);
  // GPX 1.1 schema (TopoGrafix, 2004): root <gpx version="1.1" creator="…"> in http://www.topografix.com/GPX/1/1.
  expect(doc.documentElement!.namespaceURI).toBe('http://www.topografix.com/GPX/1/1');
  expect(GPX_NAMESPACE).toBe('http://www.topografix.com/GPX/1/1');
  expect(doc.documentElement!.getAttribute('version')).toBe('1.1');
  expect(doc.documentElement!.getAttribute('creator')).toBeTruthy();
  return Array.from(doc.getElementsByTagNameNS(GPX_NAMESPACE, 'wpt'));
}
const childNames = (element: Element) => Array.from(element.childNodes).filter((n) => n.nodeType === n.ELEMENT_NODE).map((n) => n.nodeName);
const text = (element: Element, name: string) => element.getElementsByTagNameNS(GPX_NAMESPACE, name)[0]?.textContent ?? null;

describe('planToGpx', () => {
  it('names each layout point by fence, crossing and code, with the full description beside it', () => {
    const wpts = waypoints(planToGpx(samplePlan()));
    // By hand from the fixture: fence 1, its first crossing by chainage; end strainers near/far,
    // flex-run strainers near/far, posts 1–3 with the second stayed, one breakaway tie.
    expect(wpts.map((w) => text(w, 'name'))).toEqual(['F1 X1 ES1', 'F1 X1 ES2', 'F1 X1 FR1', 'F1 X1 FR2', 'F1 X1 P1', 'F1 X1 P2S', 'F1 X1 P3', 'F1 X1 BT']);
    expect(wpts.map((w) => text(w, 'type'))).toEqual(['end-strainer', 'end-strainer', 'flex-run-strainer', 'flex-run-strainer', 'floodgate-post', 'floodgate-post', 'floodgate-post', 'breakaway-tie']);
    const stayed = wpts[5]!;
    expect(text(stayed, 'desc')).toBe(`Floodgate post 2, stayed. Crossing F1 X1 on fence line "${TRICKY_NAME}", built as a continuous floodgate, 512.0 m along the fence. Stay: yes (braced post). Hung droppers: open link. Ground 149.8 m.`);
    expect([stayed.getAttribute('lat'), stayed.getAttribute('lon'), text(stayed, 'ele')]).toEqual(['-31.44092', '141.6455', '149.8']);
    // <ele> only where the ground is known; the schema's order ele, name, desc, type (GPX 1.1 wptType sequence).
    expect(childNames(wpts[2]!)).toEqual(['name', 'desc', 'type']);
    expect(childNames(wpts[0]!)).toEqual(['ele', 'name', 'desc', 'type']);
  });

  it('names the crossing style in each waypoint name and description: the crew finds a drop-down section, not a floodgate', () => {
    const plan = samplePlan();
    const dropDown = { ...plan, crossings: plan.crossings.map((c) => ({ ...c, style: c.style && 'drop-down-section' })) };
    const wpts = waypoints(planToGpx(dropDown));
    const descs = wpts.map((w) => text(w, 'desc'));
    expect(descs.length).toBeGreaterThan(0);
    expect(descs.every((d) => d?.includes('built as a drop-down section'))).toBe(true);
    expect(wpts.map((w) => text(w, 'name'))).toEqual(['F1 X1 DD ES1', 'F1 X1 DD ES2', 'F1 X1 DD FR1', 'F1 X1 DD FR2', 'F1 X1 DD P1', 'F1 X1 DD P2S', 'F1 X1 DD P3', 'F1 X1 DD BT']);
  });

  it('keeps every name within the handheld limit and unique, with lat/lon in GPX range (property test)', () => {
    const point = (kind: PlanLayoutPoint['kind'], chainageM: number, braced = false): PlanLayoutPoint => ({
      kind, label: kind, chainageM, position: [179.9999999999, -89.9], braced, hungDropperLink: null, beyondFence: false, elevationM: null,
    });
    const arbitraryPlan = fc.record({
      fences: fc.integer({ min: 1, max: 400 }), crossingsOnLast: fc.integer({ min: 1, max: 60 }), posts: fc.integer({ min: 1, max: 120 }), ties: fc.integer({ min: 1, max: 3 }),
      style: fc.constantFrom('continuous-floodgate', 'drop-down-section'),
    });
    fc.assert(
      fc.property(arbitraryPlan, ({ fences, crossingsOnLast, posts, ties, style }) => {
        const base = samplePlan();
        const fenceLines = Array.from({ length: fences }, (_, i) => ({ ...base.fenceLines[1]!, id: i + 1 }));
        const crossings: PlanCrossing[] = Array.from({ length: crossingsOnLast }, (_, i) => ({
          ...base.crossings[0]!,
          id: 1000 + i,
          fenceLineId: fences,
          chainageM: 100 * i,
          style,
          // Only the last crossing (the highest number) has a layout, to keep each case small.
          layoutPoints: i < crossingsOnLast - 1 ? [] : [
            point('end-strainer', 10), point('end-strainer', 90), point('flex-run-strainer', 0), point('flex-run-strainer', 100),
            ...Array.from({ length: posts }, (_, p) => point('floodgate-post', 20 + p / 10, p % 2 === 0)),
            ...Array.from({ length: ties }, () => point('breakaway-tie', 50)),
          ],
        }));
        const plan: PlanForExport = { ...base, fenceLines, crossings };
        const wpts = waypoints(planToGpx(plan));
        const names = wpts.map((w) => text(w, 'name')!);
        expect(wpts).toHaveLength(4 + posts + ties);
        expect(names[0]).toBe(`F${fences} X${crossingsOnLast}${style === 'drop-down-section' ? ' DD' : ''} ES1`);
        expect(new Set(names).size).toBe(names.length);
        for (const [i, w] of wpts.entries()) {
          expect(names[i]!.length).toBeLessThanOrEqual(MAX_WAYPOINT_NAME_LENGTH);
          // GPX 1.1 latitudeType −90…90, longitudeType −180 ≤ lon < 180, both xsd:decimal (no exponent).
          const lat = Number(w.getAttribute('lat'));
          const lon = Number(w.getAttribute('lon'));
          expect(w.getAttribute('lon')).toMatch(/^-?\d+(\.\d+)?$/);
          expect(lat >= -90 && lat <= 90 && lon >= -180 && lon < 180).toBe(true);
        }
      }),
      { numRuns: 40 },
    );
  });

  it('reads in GDAL as waypoints with the same names, heights and positions', () => {
    // GDAL 3.6 (Debian gdal-bin) GPX driver as an independent reader.
    const file = path.join(mkdtempSync(path.join(tmpdir(), 'plan-gpx-')), 'waypoints.gpx');
    writeFileSync(file, planToGpx(samplePlan()));
    expect(ogrLayers(file)).toContain('waypoints');
    const read = ogrFeatures(file, 'waypoints');
    const points = samplePlan().crossings[0]!.layoutPoints;
    expect(read).toHaveLength(points.length);
    read.forEach((feature, i) => {
      const [lon, lat] = feature.geometry!.coordinates as [number, number];
      expect(Math.abs(lon - points[i]!.position[0])).toBeLessThan(1e-8);
      expect(Math.abs(lat - points[i]!.position[1])).toBeLessThan(1e-8);
      expect(feature.properties.ele ?? null).toBe(points[i]!.elevationM);
    });
    expect(read[0]!.properties.name).toBe('F1 X1 ES1');
    expect(String(read[0]!.properties.desc)).toContain(TRICKY_NAME);
  });

  it('does not change its input', () => {
    const plan = samplePlan();
    planToGpx(plan);
    expect(plan).toEqual(samplePlan());
  });
});

describe('planToGpx with a scope (a work order)', () => {
  it("writes only the scoped crossings' points, named as in the whole plan's file", () => {
    const plan = samplePlan();
    const whole = waypoints(planToGpx(plan)).map((w) => text(w, 'name'));
    const only201 = waypoints(planToGpx(plan, { fenceLineIds: new Set([11]), crossingIds: new Set([201]) })).map((w) => text(w, 'name'));
    expect(only201).toEqual(whole.filter((name) => name!.startsWith('F1 X1 ')));
    expect(only201).toHaveLength(8);
    expect(waypoints(planToGpx(plan, { fenceLineIds: new Set([14]), crossingIds: new Set() }))).toEqual([]);
  });
});
