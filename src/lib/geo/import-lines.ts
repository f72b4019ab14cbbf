import { gpx, kml } from '@tmcw/togeojson';
import { DOMParser } from '@xmldom/xmldom';
import type { Feature, Geometry, Position } from 'geojson';

/** A line found in a GPX or KML file: a track segment, a route or a LineString placemark. */
export interface ImportedLine {
  readonly name: string;
  readonly kind: 'track' | 'route' | 'line';
  /** `[lon, lat]` WGS84 degrees (heights dropped). */
  readonly coordinates: [number, number][];
  /** Plain text only: markup in the source description is removed, never rendered. */
  readonly description: string;
}

/** A polygon found in a KML file (a paddock outline). */
export interface ImportedPolygon {
  readonly name: string;
  /** Outer ring then holes, `[lon, lat]`, closed. */
  readonly rings: [number, number][][];
  readonly description: string;
}

export interface ImportedFile {
  readonly format: 'gpx' | 'kml';
  readonly lines: ImportedLine[];
  readonly polygons: ImportedPolygon[];
  /** Things skipped, in words (points, lines of one point, coordinates out of range). */
  readonly skipped: string[];
}

/** Why a file cannot be read, in words a person can act on. */
export class ImportError extends Error {}

/**
 * Reads the lines (GPX tracks and routes, KML LineStrings, in folders and MultiGeometry) and
 * polygons of a GPX 1.1 or KML 2.2 file, through @tmcw/togeojson on an @xmldom/xmldom DOM.
 * Track segments become separate lines. The format is told by the root element, not the name.
 *
 * @param text - the file's text
 * @throws ImportError when the text is not well-formed XML, not GPX or KML, or holds no lines
 *   or polygons
 */
export function importLines(text: string): ImportedFile {
  const doc = parseXml(text);
  const root = doc.documentElement?.localName;
  if (root !== 'gpx' && root !== 'kml') {
    throw new ImportError(`This file is XML but not GPX or KML (its root element is <${root ?? '?'}>). Export the tracks as GPX 1.1 or KML and try again.`);
  }
  const features = root === 'gpx' ? gpx(doc).features : kml(doc, { skipNullGeometry: true }).features;
  const lines: ImportedLine[] = [];
  const polygons: ImportedPolygon[] = [];
  const skipped: string[] = [];
  features.forEach((feature, index) => collect(feature, index, root, lines, polygons, skipped));
  if (lines.length === 0 && polygons.length === 0) {
    throw new ImportError(
      `This ${root.toUpperCase()} file has no lines or polygons${skipped.length ? ` (${skipped.join('; ')})` : ''}. Gullyline imports tracks, routes and drawn lines.`,
    );
  }
  return { format: root, lines, polygons, skipped };
}

/**
 * Parses XML text with @xmldom/xmldom, turning its errors into words.
 * @throws ImportError when the text is not well-formed XML, has no root element, nests its
 *   elements more than {@link MAX_XML_DEPTH} deep, or is too detailed ({@link MAX_XML_TAGS},
 *   {@link MAX_XML_COMMAS})
 */
export function parseXml(text: string) {
  checkXmlBudget(text);
  const problems: string[] = [];
  let doc;
  try {
    doc = new DOMParser({
      // Stop at the first error: going on costs time for every further error (seconds for a
      // damaged file of a few hundred kilobytes) and the first one is what the message shows.
      onError: (level, message) => {
        if (level === 'warning') return;
        problems.push(String(message).split('\n')[0]!);
        throw new ImportError(problems[0]!);
      },
    }).parseFromString(text, 'text/xml');
  } catch (error) {
    if (problems.length === 0) problems.push(String((error as Error).message).split('\n')[0]!);
  }
  if (!doc || problems.length > 0 || !doc.documentElement) {
    throw new ImportError(`This file is not well-formed XML (${problems[0] ?? 'no root element'}). Export it again as GPX or KML.`);
  }
  if (nestingDepth(doc.documentElement) > MAX_XML_DEPTH) {
    throw new ImportError(`This file nests its elements more than ${MAX_XML_DEPTH} deep (folders within folders, or geometries within geometries), which no GPS or mapping program writes. Export it again as GPX or KML.`);
  }
  return doc;
}

/**
 * Most tags (`<`) and commas (the separators of KML coordinates) in one XML file: about 35 000 GPS
 * points with heights, or 200 000 KML positions. The DOM costs about 2.5 KB of memory per GPS
 * point (measured: 3 MB of GPX, 50 000 points, 170 MB and 4 s; a KML line of 290 000
 * positions took the server to 340 MB), so a file within the upload
 * limit but past these would hold hundreds of megabytes of the server's memory for tens of seconds.
 */
export const MAX_XML_TAGS = 150_000;
export const MAX_XML_COMMAS = 200_000;

/** Refuses text past {@link MAX_XML_TAGS} or {@link MAX_XML_COMMAS} before any of it is parsed. */
function checkXmlBudget(text: string): void {
  let tags = 0;
  let commas = 0;
  for (let i = text.indexOf('<'); i !== -1; i = text.indexOf('<', i + 1)) if (++tags > MAX_XML_TAGS) break;
  for (let i = text.indexOf(','); i !== -1; i = text.indexOf(',', i + 1)) if (++commas > MAX_XML_COMMAS) break;
  if (tags > MAX_XML_TAGS || commas > MAX_XML_COMMAS) {
    throw new ImportError(
      'This file is too detailed to read in one go (more than about 35 000 GPS points, or 200 000 positions in KML). Split it, or thin its points in your GPS or mapping program (one every few metres is plenty for a fence line), and import the parts.',
    );
  }
}

/** Deepest element nesting read: the GPX and KML readers recurse once per level. */
export const MAX_XML_DEPTH = 100;

type XmlNode = { readonly childNodes: { readonly length: number; readonly [index: number]: XmlNode }; readonly nodeType: number };

/** How deep elements nest under `root` (1 for an element without children), walked without recursion. */
function nestingDepth(root: XmlNode): number {
  let deepest = 0;
  const stack: [XmlNode, number][] = [[root, 1]];
  while (stack.length > 0) {
    const [node, depth] = stack.pop()!;
    if (depth > deepest) deepest = depth;
    if (deepest > MAX_XML_DEPTH) break;
    for (let i = 0; i < node.childNodes.length; i++) if (node.childNodes[i]!.nodeType === 1) stack.push([node.childNodes[i]!, depth + 1]);
  }
  return deepest;
}

function collect(feature: Feature<Geometry | null>, index: number, format: 'gpx' | 'kml', lines: ImportedLine[], polygons: ImportedPolygon[], skipped: string[]): void {
  const properties = feature.properties ?? {};
  const name = plainText(String(properties.name ?? '')) || `${format === 'gpx' ? 'Track' : 'Line'} ${index + 1}`;
  const description = plainText(textOf(properties.desc ?? properties.description));
  const gpxType = properties._gpxType as string | undefined;
  const kind: ImportedLine['kind'] = gpxType === 'rte' ? 'route' : gpxType === 'trk' ? 'track' : 'line';
  const addLine = (positions: Position[], suffix: string) => {
    const coordinates = toLonLat(positions, `${name}${suffix}`, skipped);
    if (coordinates.length >= 2) lines.push({ name: `${name}${suffix}`, kind, coordinates, description });
    else skipped.push(`"${name}${suffix}" has fewer than two usable points`);
  };
  const visit = (geometry: Geometry | null, suffix = ''): void => {
    if (!geometry) return;
    switch (geometry.type) {
      case 'LineString':
        return addLine(geometry.coordinates, suffix);
      case 'MultiLineString':
        geometry.coordinates.forEach((part, i) => addLine(part, geometry.coordinates.length > 1 ? ` (part ${i + 1})` : suffix));
        return;
      case 'Polygon': {
        const rings = geometry.coordinates.map((ring) => toLonLat(ring, name, skipped));
        if (rings[0] && rings[0].length >= 4) polygons.push({ name: `${name}${suffix}`, rings, description });
        else skipped.push(`"${name}" is a polygon with fewer than three corners`);
        return;
      }
      case 'MultiPolygon':
        geometry.coordinates.forEach((polygon, i) => visit({ type: 'Polygon', coordinates: polygon }, ` (part ${i + 1})`));
        return;
      case 'GeometryCollection':
        geometry.geometries.forEach((part, i) => visit(part, geometry.geometries.length > 1 ? ` (part ${i + 1})` : suffix));
        return;
      default:
        skipped.push(`"${name}" is a ${geometry.type}, not a line`);
    }
  };
  visit(feature.geometry);
}

function toLonLat(positions: Position[], name: string, skipped: string[]): [number, number][] {
  const out: [number, number][] = [];
  let dropped = 0;
  for (const [lon, lat] of positions) {
    if (Number.isFinite(lon) && Number.isFinite(lat) && Math.abs(lon!) <= 180 && Math.abs(lat!) <= 90) out.push([lon!, lat!]);
    else dropped += 1;
  }
  if (dropped > 0) skipped.push(`${dropped} point(s) of "${name}" are not valid longitudes and latitudes`);
  return out;
}

/** togeojson gives an HTML description as `{ '@type': 'html', value }`. */
function textOf(value: unknown): string {
  if (typeof value === 'string') return value;
  if (value && typeof value === 'object' && 'value' in value) return String((value as { value: unknown }).value ?? '');
  return '';
}

/** Text without markup: tags removed and whitespace collapsed, so a description can never carry a script. */
function plainText(value: string): string {
  return value
    .replace(/<(script|style)\b[^>]*>[\s\S]*?<\/\1\s*>/gi, ' ')
    .replace(/<[^>]*>/g, ' ')
    .replace(/\s+/g, ' ')
    .trim()
    .slice(0, 2000);
}
