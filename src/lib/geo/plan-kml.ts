import type { Element } from '@xmldom/xmldom';
import { orientRing } from './measure';
import { checkPlan, PLAN_EXPORT_FORMAT_VERSION, type LonLat, type PlanForExport } from './plan-data';
import { numberPlan } from './plan-numbering';
import { createXmlWriter, decimalText, type XmlWriter } from './xml-writer';

export const KML_NAMESPACE = 'http://www.opengis.net/kml/2.2';

/** Our own colours, as KML writes them: aabbggrr. */
const STYLES: Record<string, { line?: [string, number]; poly?: string; icon?: [string, number] }> = {
  'fence-line': { line: ['ff1c4fd6', 3] },
  paddock: { line: ['ff3c8c3c', 2], poly: '4d5fb45f' },
  'crossing-good': { icon: ['ff50a02d', 1.1] },
  'crossing-fair': { icon: ['ff1ea5f0', 1.1] },
  'crossing-poor': { icon: ['ff2828d2', 1.1] },
  'crossing-none': { icon: ['ff8c8c8c', 1.1] },
  strainer: { icon: ['ffb45a1e', 0.8] },
  post: { icon: ['ffdcdcdc', 0.6] },
  'breakaway-tie': { icon: ['ff00d7ff', 0.7] },
};

/** A coordinate as written: every digit JavaScript keeps (so an import gives back the same number), never in exponent form. */
const coordinate = (value: number) => (/e/i.test(String(value)) ? decimalText(value, 12) : String(value));
const coordinatesText = (positions: readonly LonLat[]) => positions.map(([lon, lat]) => `${coordinate(lon)},${coordinate(lat)}`).join(' ');

/**
 * A property's plan as KML 2.2 (OGC 07-147r2) for desktop globes and GIS programs: a Document
 * with our styles and four Folders — fence lines, paddocks, crossings, and the layout points of
 * each designed crossing in a folder of its own. Each Placemark has a name a person can read
 * (the fence line's or paddock's own name; `F3 X2 — fence name` for a crossing;
 * `F3 X2 ES1: End strainer (near side)` for a layout point), a plain-text description, and
 * ExtendedData carrying the same fields as the GeoJSON export (`featureType` first; the wire
 * spec as JSON text). Text is escaped by the XML serializer (@xmldom/xmldom). Paddock rings are
 * written exterior counter-clockwise, holes clockwise, as in the GeoJSON export.
 *
 * @param plan - the plan, with the export time from the caller's clock
 * @throws RangeError when the plan holds a position out of range or an open paddock ring
 */
export function planToKml(plan: PlanForExport): string {
  checkPlan(plan);
  const numbering = numberPlan(plan);
  const xml = createXmlWriter(KML_NAMESPACE, 'kml');
  const doc = xml.add(xml.root, 'Document');
  xml.add(doc, 'name', `${plan.propertyName} — fence plan`);
  xml.add(doc, 'description', `Exported from Gullyline at ${plan.exportedAt}. Crossings and layout points are worked out from the terrain; importing this file reads back only the fence lines and paddocks.`);
  for (const [id, style] of Object.entries(STYLES)) addStyle(xml, doc, id, style);
  addData(xml, doc, { gullylineFormatVersion: PLAN_EXPORT_FORMAT_VERSION, exportedAt: plan.exportedAt });

  const fences = folder(xml, doc, 'Fence lines');
  for (const fence of plan.fenceLines) {
    const wires = fence.wireSpec.wireHeightsM.map((h, i) => `${fence.wireSpec.wireKinds[i] ?? '?'} at ${h} m`).join(', ');
    const mark = placemark(xml, fences, fence.name, `Fence line F${numbering.fenceNo(fence.id)}, ${fence.status}, ${fence.lengthM.toFixed(1)} m long. Wires: ${wires}.`, 'fence-line', {
      featureType: 'fence-line', id: fence.id, fenceNo: numbering.fenceNo(fence.id), status: fence.status, lengthM: fence.lengthM.toFixed(2), wireSpec: JSON.stringify(fence.wireSpec), version: fence.version,
    });
    const line = xml.add(mark, 'LineString');
    xml.add(line, 'tessellate', '1');
    xml.add(line, 'coordinates', coordinatesText(fence.coordinates));
  }

  const paddocks = folder(xml, doc, 'Paddocks');
  for (const paddock of plan.paddocks) {
    const mark = placemark(xml, paddocks, paddock.name, `Paddock, ${paddock.areaHa.toFixed(2)} ha.`, 'paddock', { featureType: 'paddock', id: paddock.id, areaHa: paddock.areaHa.toFixed(4) });
    const polygon = xml.add(mark, 'Polygon');
    xml.add(polygon, 'tessellate', '1');
    paddock.rings.forEach((ring, i) => {
      const boundary = xml.add(polygon, i === 0 ? 'outerBoundaryIs' : 'innerBoundaryIs');
      xml.add(xml.add(boundary, 'LinearRing'), 'coordinates', coordinatesText(orientRing(ring, i === 0)));
    });
  }

  const fenceNames = new Map(plan.fenceLines.map((fence) => [fence.id, fence.name]));
  const crossings = folder(xml, doc, 'Crossings');
  const layouts = folder(xml, doc, 'Crossing layouts');
  for (const crossing of plan.crossings) {
    const tag = numbering.crossingTag(crossing);
    const fenceName = fenceNames.get(crossing.fenceLineId) ?? '';
    const angle = crossing.angleDeg === null ? 'no angle' : `${crossing.angleDeg.toFixed(0)}° to the flow (${crossing.angleClass ?? 'unclassed'})`;
    const catchment = crossing.catchmentHa === null ? '' : `, catchment ${crossing.catchmentHa.toFixed(1)} ha`;
    const flood = crossing.flood?.maxDepthM == null ? '' : `, design flood ${crossing.flood.maxDepthM.toFixed(2)} m deep`;
    const mark = placemark(xml, crossings, `${tag} — ${fenceName}`, `Crossing (${crossing.kind}) of fence line "${fenceName}" at ${crossing.chainageM.toFixed(1)} m: ${angle}${catchment}${flood}; design ${crossing.designStatus}.`, `crossing-${crossing.angleClass ?? 'none'}`, {
      featureType: 'crossing', id: crossing.id, tag, fenceLineId: crossing.fenceLineId, fenceName, drainageLineId: crossing.drainageLineId, kind: crossing.kind,
      chainageM: crossing.chainageM.toFixed(2), angleDeg: crossing.angleDeg?.toFixed(1), angleClass: crossing.angleClass, streamOrder: crossing.streamOrder,
      catchmentHa: crossing.catchmentHa?.toFixed(2), designStatus: crossing.designStatus, style: crossing.style, floodLevelM: crossing.flood?.levelM?.toFixed(2),
      floodMaxDepthM: crossing.flood?.maxDepthM?.toFixed(2), floodWidthM: crossing.flood?.widthM?.toFixed(2),
    });
    xml.add(xml.add(mark, 'Point'), 'coordinates', coordinatesText([crossing.position]));

    const points = numbering.namedPoints(crossing);
    if (points.length === 0) continue;
    const layout = folder(xml, layouts, `${tag} — ${fenceName}`);
    for (const point of points) {
      const style = point.kind === 'breakaway-tie' ? 'breakaway-tie' : point.kind.endsWith('strainer') ? 'strainer' : 'post';
      const placed = placemark(xml, layout, `${point.shortName}: ${point.label}`, point.description, style, {
        featureType: 'layout-point', kind: point.kind, waypoint: point.shortName, label: point.label, crossingId: crossing.id, fenceLineId: crossing.fenceLineId,
        chainageM: point.chainageM.toFixed(2), braced: point.braced, hungDropperLink: point.hungDropperLink, elevationM: point.elevationM?.toFixed(2), beyondFence: point.beyondFence,
      });
      xml.add(xml.add(placed, 'Point'), 'coordinates', coordinatesText([point.position]));
    }
  }
  return xml.serialize();
}

function folder(xml: XmlWriter, parent: Element, name: string): Element {
  const element = xml.add(parent, 'Folder');
  xml.add(element, 'name', name);
  return element;
}

function placemark(xml: XmlWriter, parent: Element, name: string, description: string, style: string, data: Record<string, string | number | boolean | null | undefined>): Element {
  const element = xml.add(parent, 'Placemark');
  xml.add(element, 'name', name);
  xml.add(element, 'description', description);
  xml.add(element, 'styleUrl', `#${style}`);
  addData(xml, element, data);
  return element;
}

/** ExtendedData/Data pairs; empty values are left out. */
function addData(xml: XmlWriter, parent: Element, data: Record<string, string | number | boolean | null | undefined>): void {
  const extended = xml.add(parent, 'ExtendedData');
  for (const [key, value] of Object.entries(data)) {
    if (value === null || value === undefined) continue;
    xml.add(xml.add(extended, 'Data', null, { name: key }), 'value', String(value));
  }
}

function addStyle(xml: XmlWriter, parent: Element, id: string, style: (typeof STYLES)[string]): void {
  const element = xml.add(parent, 'Style', null, { id });
  if (style.icon) {
    const icon = xml.add(element, 'IconStyle');
    xml.add(icon, 'color', style.icon[0]);
    xml.add(icon, 'scale', String(style.icon[1]));
  }
  if (style.line) {
    const line = xml.add(element, 'LineStyle');
    xml.add(line, 'color', style.line[0]);
    xml.add(line, 'width', String(style.line[1]));
  }
  if (style.poly) xml.add(xml.add(element, 'PolyStyle'), 'color', style.poly);
}
