/**
 * Write a one-track GPX 1.1 document (TopoGrafix GPX 1.1 schema,
 * http://www.topografix.com/GPX/1/1/).
 */
import { escapeXml } from './xml-text';

/** One track point in WGS84. */
export interface GpxPoint {
  readonly lon: number;
  readonly lat: number;
  readonly eleM: number;
  readonly timeMs: number;
}

/** What goes into the document. */
export interface GpxDocument {
  /** Document name and description (`<metadata>`). */
  readonly name: string;
  readonly desc: string;
  /** Track name and description (`<trk>`). */
  readonly trackName: string;
  readonly trackDesc: string;
  readonly points: readonly GpxPoint[];
}

/** ISO 8601 UTC time to the second, as GPX uses: `2026-03-13T20:10:00Z`. */
function formatTime(timeMs: number): string {
  return new Date(timeMs).toISOString().replace(/\.\d{3}Z$/, 'Z');
}

/**
 * The GPX text: `<metadata>` (name, desc, time of the first point, bounds) and one `<trk>` with
 * one `<trkseg>`; coordinates to 7 decimals (about 1 cm), heights to 0.1 m.
 *
 * @param doc - the document
 * @throws Error if there are no points
 */
export function formatGpx(doc: GpxDocument): string {
  const first = doc.points[0];
  if (!first) throw new Error('a GPX track needs at least one point');
  const lats = doc.points.map((p) => p.lat);
  const lons = doc.points.map((p) => p.lon);
  const bounds =
    `minlat="${Math.min(...lats).toFixed(7)}" minlon="${Math.min(...lons).toFixed(7)}" ` +
    `maxlat="${Math.max(...lats).toFixed(7)}" maxlon="${Math.max(...lons).toFixed(7)}"`;
  const lines = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<gpx version="1.1" creator="Gullyline demo generator (data-samples/generate.ts)" xmlns="http://www.topografix.com/GPX/1/1" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance" xsi:schemaLocation="http://www.topografix.com/GPX/1/1 http://www.topografix.com/GPX/1/1/gpx.xsd">',
    '  <metadata>',
    `    <name>${escapeXml(doc.name)}</name>`,
    `    <desc>${escapeXml(doc.desc)}</desc>`,
    `    <time>${formatTime(first.timeMs)}</time>`,
    `    <bounds ${bounds}/>`,
    '  </metadata>',
    '  <trk>',
    `    <name>${escapeXml(doc.trackName)}</name>`,
    `    <desc>${escapeXml(doc.trackDesc)}</desc>`,
    '    <trkseg>',
    ...doc.points.map(
      (p) =>
        `      <trkpt lat="${p.lat.toFixed(7)}" lon="${p.lon.toFixed(7)}"><ele>${p.eleM.toFixed(1)}</ele><time>${formatTime(p.timeMs)}</time></trkpt>`,
    ),
    '    </trkseg>',
    '  </trk>',
    '</gpx>',
    '',
  ];
  return lines.join('\n');
}
