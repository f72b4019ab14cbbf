/**
 * Write the planned subdivision as a KML 2.2 document (OGC KML 2.2, OGC 07-147r2): a folder of
 * fence lines (Placemark/LineString) and a folder of paddocks (Placemark/Polygon).
 */
import { escapeXml } from './xml-text';

/** A named line or ring in WGS84 `[lon, lat]` with its description and extended data. */
export interface KmlFeature {
  readonly id: string;
  readonly name: string;
  readonly description: string;
  readonly data: Readonly<Record<string, string>>;
  readonly coordinates: readonly (readonly [number, number])[];
}

/** What goes into the document. */
export interface KmlDocument {
  readonly name: string;
  readonly description: string;
  readonly fenceFolderName: string;
  readonly fences: readonly KmlFeature[];
  readonly paddockFolderName: string;
  readonly paddocks: readonly KmlFeature[];
}

function formatCoordinates(coordinates: readonly (readonly [number, number])[]): string {
  return coordinates.map(([lon, lat]) => `${lon.toFixed(7)},${lat.toFixed(7)}`).join(' ');
}

function formatPlacemark(feature: KmlFeature, geometry: string[]): string[] {
  const data = Object.entries(feature.data).map(
    ([key, value]) => `        <Data name="${escapeXml(key)}"><value>${escapeXml(value)}</value></Data>`,
  );
  return [
    `      <Placemark id="${escapeXml(feature.id)}">`,
    `        <name>${escapeXml(feature.name)}</name>`,
    `        <description>${escapeXml(feature.description)}</description>`,
    '        <ExtendedData>',
    ...data.map((line) => `  ${line}`),
    '        </ExtendedData>',
    ...geometry.map((line) => `        ${line}`),
    '      </Placemark>',
  ];
}

/**
 * The KML text. Coordinates are `lon,lat` to 7 decimals (about 1 cm), no altitude (clamped to
 * ground). Paddock rings must be closed (first vertex repeated last), as KML requires.
 *
 * @param doc - the document
 * @throws Error if a paddock ring is not closed or a line has fewer than two vertices
 */
export function formatSubdivisionKml(doc: KmlDocument): string {
  for (const fence of doc.fences) {
    if (fence.coordinates.length < 2) throw new Error(`fence line ${fence.id} needs at least 2 vertices`);
  }
  for (const paddock of doc.paddocks) {
    const first = paddock.coordinates[0];
    const last = paddock.coordinates[paddock.coordinates.length - 1];
    if (paddock.coordinates.length < 4 || !first || !last || first[0] !== last[0] || first[1] !== last[1]) {
      throw new Error(`paddock ${paddock.id} needs a closed ring of at least 4 vertices`);
    }
  }
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<kml xmlns="http://www.opengis.net/kml/2.2">',
    '  <Document>',
    `    <name>${escapeXml(doc.name)}</name>`,
    `    <description>${escapeXml(doc.description)}</description>`,
    '    <Folder>',
    `      <name>${escapeXml(doc.fenceFolderName)}</name>`,
    ...doc.fences.flatMap((fence) =>
      formatPlacemark(fence, ['<LineString>', '  <tessellate>1</tessellate>', `  <coordinates>${formatCoordinates(fence.coordinates)}</coordinates>`, '</LineString>']),
    ),
    '    </Folder>',
    '    <Folder>',
    `      <name>${escapeXml(doc.paddockFolderName)}</name>`,
    ...doc.paddocks.flatMap((paddock) =>
      formatPlacemark(paddock, [
        '<Polygon>',
        '  <outerBoundaryIs>',
        '    <LinearRing>',
        `      <coordinates>${formatCoordinates(paddock.coordinates)}</coordinates>`,
        '    </LinearRing>',
        '  </outerBoundaryIs>',
        '</Polygon>',
      ]),
    ),
    '    </Folder>',
    '  </Document>',
    '</kml>',
    '',
  ].join('\n');
}
