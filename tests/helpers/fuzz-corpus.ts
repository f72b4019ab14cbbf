// Damaged files for the importers, made from good ones by a seeded generator: the same seed gives
// the same files, so a failing case is replayed with FUZZ_SEED=<seed> (printed in the failure).
import { encodeGeoTiff } from '../../src/lib/server/elevation/write-geotiff';
import { createMulberry32 } from '../../data-samples/lib/prng';

/** The seed of this run: FUZZ_SEED when set (to replay or explore), else a fixed one. */
export function fuzzSeed(): number {
  const value = process.env.FUZZ_SEED;
  return value && Number.isSafeInteger(Number(value)) ? Number(value) : 20261202;
}

/** The demo data's Mulberry32 generator: small, fast, plenty for choosing where to damage a file. */
export function seededRandom(seed: number): () => number {
  return createMulberry32(seed);
}

export type FuzzCase = { readonly label: string; readonly bytes: Uint8Array };

const INTERESTING = [0x00, 0xff, 0x7f, 0x80, 0x01, 0xfe, 0x3c, 0x22, 0x26];

/**
 * `count` damaged copies of `base`, each labelled with what was done and the seed, in turn:
 * truncated at a random point; 1–8 bits flipped; a run of bytes set to a boundary value (0, 255,
 * 127, 128, '<', '"', '&'); a slice repeated until the file is `growTo` bytes (oversized); a
 * slice cut out of the middle. Flips and overwrites favour the first `headerBytes` half the time,
 * where a format's structure lives.
 */
export function mutate(base: Uint8Array, count: number, seed: number, options: { headerBytes?: number; growTo?: number } = {}): FuzzCase[] {
  const random = seededRandom(seed);
  const int = (below: number) => Math.floor(random() * below);
  const headerBytes = Math.min(options.headerBytes ?? base.length, base.length);
  const position = () => (random() < 0.5 ? int(headerBytes) : int(base.length));
  const cases: FuzzCase[] = [];
  for (let i = 0; i < count; i++) {
    const kind = i % 5;
    const bytes = new Uint8Array(base);
    let label: string;
    if (kind === 0) {
      const at = int(base.length);
      cases.push({ label: `seed ${seed} case ${i}: truncated to ${at} of ${base.length} bytes`, bytes: bytes.slice(0, at) });
      continue;
    } else if (kind === 1) {
      const flips = 1 + int(8);
      const where: number[] = [];
      for (let f = 0; f < flips; f++) {
        const at = position();
        bytes[at]! ^= 1 << int(8);
        where.push(at);
      }
      label = `bits flipped at bytes ${where.join(', ')}`;
    } else if (kind === 2) {
      const at = position();
      const length = 1 + int(8);
      const value = INTERESTING[int(INTERESTING.length)]!;
      bytes.fill(value, at, Math.min(base.length, at + length));
      label = `${length} bytes at ${at} set to ${value}`;
    } else if (kind === 3) {
      const target = options.growTo ?? base.length * 4;
      const start = int(base.length);
      const slice = base.slice(start, Math.min(base.length, start + 1 + int(256)));
      const grown = new Uint8Array(Math.max(target, base.length + slice.length));
      grown.set(base.subarray(0, start), 0);
      let at = start;
      while (at < grown.length - (base.length - start)) {
        grown.set(slice.subarray(0, Math.min(slice.length, grown.length - (base.length - start) - at)), at);
        at += slice.length;
      }
      grown.set(base.subarray(start), grown.length - (base.length - start));
      cases.push({ label: `seed ${seed} case ${i}: ${slice.length} bytes from ${start} repeated to ${grown.length} bytes`, bytes: grown });
      continue;
    } else {
      const start = int(base.length);
      const end = Math.min(base.length, start + 1 + int(64));
      cases.push({ label: `seed ${seed} case ${i}: bytes ${start}–${end} cut out`, bytes: new Uint8Array([...base.subarray(0, start), ...base.subarray(end)]) });
      continue;
    }
    cases.push({ label: `seed ${seed} case ${i}: ${label}`, bytes });
  }
  return cases;
}

const encoder = new TextEncoder();
const decoder = new TextDecoder();
export const utf8 = (text: string) => encoder.encode(text);
export const text = (bytes: Uint8Array) => decoder.decode(bytes);

/** A valid 24 × 16 Float32 GeoTIFF in EPSG:7854 (GDA2020 / MGA zone 54), 5 m cells, a tilted plane. */
export function smallGeoTiff(): Uint8Array {
  const width = 24;
  const height = 16;
  const samples = new Float32Array(width * height).map((_, i) => 150 + (i % width) * 0.3 + Math.floor(i / width) * 0.2);
  return encodeGeoTiff(samples, { width, height, transform: { originX: 560_000, originY: 6_523_000, cellSizeX: 5, cellSizeY: 5 }, epsg: 7854, geographic: false, nodata: -9999 });
}

/** A GPX 1.1 track of `points` points near the demo property. */
export function sampleGpx(points = 40): string {
  const pts = Array.from({ length: points }, (_, i) => `<trkpt lat="${(-31.44 + i * 0.0002).toFixed(5)}" lon="${(141.64 + i * 0.0003).toFixed(5)}"><ele>${150 + i}</ele></trkpt>`).join('');
  return `<?xml version="1.0" encoding="UTF-8"?><gpx version="1.1" creator="Gullyline tests" xmlns="http://www.topografix.com/GPX/1/1"><trk><name>Creek walk</name><desc>Walked &amp; marked</desc><trkseg>${pts}</trkseg></trk></gpx>`;
}

/** A KML 2.2 file with a line and a polygon in a folder. */
export function sampleKml(): string {
  return `<?xml version="1.0" encoding="UTF-8"?><kml xmlns="http://www.opengis.net/kml/2.2"><Document><Folder><name>Old fences</name>
<Placemark><name>North fence</name><description>Built 1990</description><LineString><coordinates>141.64,-31.44,0 141.65,-31.441,0 141.655,-31.445,0</coordinates></LineString></Placemark>
<Placemark><name>Home paddock</name><Polygon><outerBoundaryIs><LinearRing><coordinates>141.64,-31.44 141.65,-31.44 141.65,-31.43 141.64,-31.44</coordinates></LinearRing></outerBoundaryIs></Polygon></Placemark>
</Folder></Document></kml>`;
}

/** A Gullyline plan export (GeoJSON) with two fence lines and a paddock. */
export function samplePlanGeoJson(): string {
  return JSON.stringify({
    type: 'FeatureCollection',
    gullylineExport: { formatVersion: 1 },
    features: [
      { type: 'Feature', geometry: { type: 'LineString', coordinates: [[141.5, -31.5], [141.51, -31.5], [141.515, -31.505]] }, properties: { featureType: 'fence-line', name: 'West boundary', status: 'planned' } },
      { type: 'Feature', geometry: { type: 'LineString', coordinates: [[141.52, -31.5], [141.53, -31.51]] }, properties: { featureType: 'fence-line', name: 'Lane', status: 'built' } },
      { type: 'Feature', geometry: { type: 'Polygon', coordinates: [[[141.5, -31.5], [141.51, -31.5], [141.51, -31.49], [141.5, -31.5]]] }, properties: { featureType: 'paddock', name: 'Front' } },
      { type: 'Feature', geometry: { type: 'Point', coordinates: [141.505, -31.5] }, properties: { featureType: 'crossing' } },
    ],
  });
}

/** A Gullyline plan export as KML (ExtendedData carries the featureType). */
export function samplePlanKml(): string {
  const data = (type: string) => `<ExtendedData><Data name="featureType"><value>${type}</value></Data></ExtendedData>`;
  return `<?xml version="1.0" encoding="UTF-8"?><kml xmlns="http://www.opengis.net/kml/2.2"><Document>
<Placemark><name>West boundary</name>${data('fence-line')}<LineString><coordinates>141.5,-31.5 141.51,-31.5</coordinates></LineString></Placemark>
<Placemark><name>Front</name>${data('paddock')}<Polygon><outerBoundaryIs><LinearRing><coordinates>141.5,-31.5 141.51,-31.5 141.51,-31.49 141.5,-31.5</coordinates></LinearRing></outerBoundaryIs></Polygon></Placemark>
</Document></kml>`;
}

/** A price list as a spreadsheet exports it. */
export function samplePriceCsv(): string {
  return 'id,name,unit,unit_price_aud,supplier_note\nSTEEL-POST,Steel post 1.8 m,each,12.50,Rural Supplies\nHT-WIRE,"High tensile wire, 2.5 mm",roll,189.00,\nSTRAINER,Strainer post,each,"$1,250.00",quote 2026\n';
}

/** An IFD table a person could type in (three AEPs by four durations). */
export function sampleIfdTable() {
  return { aepPercent: [10, 2, 1], durationsMin: [10, 30, 60, 120], intensitiesMmH: [[80, 50, 33, 21], [110, 70, 46, 29], [125, 80, 53, 33]], source: 'Invented for tests' };
}

/**
 * Hostile XML for the GPX and KML readers: entity expansion ("billion laughs", XML 1.0 §4.2 as the
 * OWASP XXE cheat sheet describes it), external entities and DTDs (file: and http: system ids),
 * folders nested `depth` deep, and a coordinate string of `hugeCoordinates` positions.
 */
export function hostileXml(options: { depth?: number; hugeCoordinates?: number } = {}): { label: string; text: string }[] {
  const depth = options.depth ?? 5000;
  const huge = options.hugeCoordinates ?? 150_000;
  const laughs = ['<!ENTITY lol "lol">'];
  for (let i = 1; i <= 9; i++) laughs.push(`<!ENTITY lol${i} "${`&lol${i === 1 ? '' : i - 1};`.repeat(10)}">`);
  const placemark = (name: string, description = '') => `<Placemark><name>${name}</name><description>${description}</description><LineString><coordinates>141.64,-31.44 141.65,-31.45</coordinates></LineString></Placemark>`;
  const coordinates = Array.from({ length: huge }, (_, i) => `141.${(640000 + (i % 9999)).toString().padStart(6, '0')},-31.44`).join(' ');
  return [
    { label: 'billion laughs in a KML name', text: `<?xml version="1.0"?><!DOCTYPE kml [${laughs.join('')}]><kml xmlns="http://www.opengis.net/kml/2.2">${placemark('&lol9;')}</kml>` },
    { label: 'billion laughs in a GPX name', text: `<?xml version="1.0"?><!DOCTYPE gpx [${laughs.join('')}]><gpx version="1.1" xmlns="http://www.topografix.com/GPX/1/1"><trk><name>&lol9;</name><trkseg><trkpt lat="-31.44" lon="141.64"/><trkpt lat="-31.45" lon="141.65"/></trkseg></trk></gpx>` },
    { label: 'external entity to /etc/passwd', text: `<?xml version="1.0"?><!DOCTYPE kml [<!ENTITY xxe SYSTEM "file:///etc/passwd">]><kml xmlns="http://www.opengis.net/kml/2.2">${placemark('&xxe;', '&xxe;')}</kml>` },
    { label: 'external entity over http', text: `<?xml version="1.0"?><!DOCTYPE kml [<!ENTITY xxe SYSTEM "http://127.0.0.1:9/evil">]><kml xmlns="http://www.opengis.net/kml/2.2">${placemark('&xxe;')}</kml>` },
    { label: 'external DTD', text: `<?xml version="1.0"?><!DOCTYPE kml SYSTEM "http://127.0.0.1:9/evil.dtd"><kml xmlns="http://www.opengis.net/kml/2.2">${placemark('Outside')}</kml>` },
    { label: 'parameter entity', text: `<?xml version="1.0"?><!DOCTYPE kml [<!ENTITY % remote SYSTEM "http://127.0.0.1:9/p.dtd"> %remote;]><kml xmlns="http://www.opengis.net/kml/2.2">${placemark('Param')}</kml>` },
    { label: `folders nested ${depth} deep`, text: `<kml xmlns="http://www.opengis.net/kml/2.2">${'<Folder>'.repeat(depth)}${placemark('Deep')}${'</Folder>'.repeat(depth)}</kml>` },
    { label: `MultiGeometry nested ${depth} deep`, text: `<kml xmlns="http://www.opengis.net/kml/2.2"><Placemark><name>Deep</name>${'<MultiGeometry>'.repeat(depth)}<LineString><coordinates>141.64,-31.44 141.65,-31.45</coordinates></LineString>${'</MultiGeometry>'.repeat(depth)}</Placemark></kml>` },
    { label: `a coordinate string of ${huge} positions`, text: `<kml xmlns="http://www.opengis.net/kml/2.2"><Placemark><name>Long</name><LineString><coordinates>${coordinates}</coordinates></LineString></Placemark></kml>` },
    { label: 'a coordinate string of one unbroken number', text: `<kml xmlns="http://www.opengis.net/kml/2.2"><Placemark><name>Digits</name><LineString><coordinates>1${'1'.repeat(500_000)},-31.44 141.65,-31.45</coordinates></LineString></Placemark></kml>` },
    { label: 'a GPX of unclosed elements', text: `<gpx version="1.1" xmlns="http://www.topografix.com/GPX/1/1">${'<trk><trkseg>'.repeat(2000)}` },
  ];
}
