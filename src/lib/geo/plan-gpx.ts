import { checkPlan, scopedParts, type PlanForExport, type PlanScope } from './plan-data';
import { numberPlan } from './plan-numbering';
import { createXmlWriter, decimalText } from './xml-writer';

export const GPX_NAMESPACE = 'http://www.topografix.com/GPX/1/1';

/**
 * The layout points of a plan's designed crossings as GPX 1.1 waypoints (topografix.com/GPX/1/1)
 * for a handheld GPS: end strainers, flex-run strainers, posts (stayed or not) and breakaway
 * ties. Each `<wpt lat lon>` has `<ele>` (ground height from the elevation model, metres) when
 * known, a short `<name>` by {@link numberPlan}'s scheme (`F3 X2 ES1`, at most 20 characters),
 * the full `<desc>`, and `<type>` the point's kind. Positions are written to 8 decimals (about a
 * millimetre), as xsd:decimal text; a longitude of 180 is written −180, as GPX's longitudeType
 * allows −180 ≤ lon < 180. The XML is built with @xmldom/xmldom, so text is escaped.
 *
 * @param plan - the plan, with the export time from the caller's clock
 * @param scope - only these crossings' points (a work order's), named as in the whole plan
 * @throws RangeError when the plan holds a position out of range
 */
export function planToGpx(plan: PlanForExport, scope?: PlanScope): string {
  checkPlan(plan);
  const numbering = numberPlan(plan);
  const xml = createXmlWriter(GPX_NAMESPACE, 'gpx', { version: '1.1', creator: 'Gullyline' });
  const metadata = xml.add(xml.root, 'metadata');
  xml.add(metadata, 'name', `${plan.propertyName} — crossing layout points`);
  xml.add(metadata, 'desc', 'Strainers, posts and breakaway ties of the designed crossings. Names: F<fence> X<crossing> <code>; ES end strainer (1 near side, 2 far side), FR flex-run strainer, P<n> post n (S: stayed), BT breakaway tie.');
  xml.add(metadata, 'time', new Date(plan.exportedAt).toISOString());
  for (const crossing of scopedParts(plan, scope).crossings) {
    for (const point of numbering.namedPoints(crossing)) {
      const [lon, lat] = point.position;
      const lonText = decimalText(lon, 8);
      const wpt = xml.add(xml.root, 'wpt', null, { lat: decimalText(lat, 8), lon: lonText === '180' ? '-180' : lonText });
      if (point.elevationM !== null) xml.add(wpt, 'ele', decimalText(point.elevationM, 2));
      xml.add(wpt, 'name', point.shortName);
      xml.add(wpt, 'desc', point.description);
      xml.add(wpt, 'type', point.kind);
    }
  }
  return xml.serialize();
}
