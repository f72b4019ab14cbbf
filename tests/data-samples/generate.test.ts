/**
 * The invented Saltbush Rise demo scenario: the generator is deterministic, its files are what
 * the manifest says, the committed copies are up to date, and outside tools read them the same.
 *
 * Outside references used here:
 * - GDAL 3.6 command-line tools from Debian's gdal-bin package (`gdalinfo -json`,
 *   `gdallocationinfo -valonly -geoloc`): CRS, georeferencing, nodata and cell values;
 *   `ogrinfo` and `ogr2ogr` (GPX and KML drivers, PROJ): point counts and reprojected fence lines.
 * - proj4js (`proj4` on npm) with the EPSG:7854 definition from the EPSG dataset
 *   (GDA2020 / MGA zone 54: UTM zone 54 south on GRS80).
 * - GPX 1.1 schema (TopoGrafix, http://www.topografix.com/GPX/1/1/) and OGC KML 2.2 (OGC 07-147r2)
 *   for the element names checked.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { fromArrayBuffer } from 'geotiff';
import proj4 from 'proj4';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { writeDemoScenario } from '../../data-samples/generate';
import { createTerrainModel } from '../../data-samples/lib/terrain-model';

const DATA_SAMPLES_DIR = resolve(dirname(fileURLToPath(import.meta.url)), '../../data-samples');
const EPSG_7854 = '+proj=utm +zone=54 +south +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs +type=crs';
const toXY = proj4('WGS84', EPSG_7854);
const SEED = 20260314;

type XY = [number, number];
const pair = z.tuple([z.number(), z.number()]);
const manifestSchema = z.object({
  name: z.literal('Saltbush Rise'),
  invented: z.literal('Demo data, invented for the Gullyline demo; not a real place.'),
  region: z.string(),
  crs: z.literal('EPSG:7854'),
  seed: z.number().int(),
  cellSizeM: z.literal(5),
  files: z.object({
    elevationModel: z.string(),
    boundaryTrack: z.string(),
    creekTrack: z.string(),
    subdivision: z.string(),
    manifest: z.string(),
  }),
  extent: z.object({ epsg7854: z.tuple([z.number(), z.number(), z.number(), z.number()]), wgs84: z.tuple([z.number(), z.number(), z.number(), z.number()]) }),
  elevationModel: z.object({ width: z.number(), height: z.number(), nodata: z.number(), nodataCells: z.number() }),
  creeks: z.array(z.object({ id: z.string(), name: z.string(), centrelineXY: z.array(pair), centrelineLonLat: z.array(pair) })),
  fenceLines: z.array(
    z.object({
      id: z.string(),
      name: z.string(),
      crossing: z.object({ creekId: z.string(), constructedAngleDeg: z.number(), pointXY: pair, pointLonLat: pair }),
      pointsXY: z.array(pair),
    }),
  ),
  paddocks: z.array(z.object({ id: z.string(), name: z.string(), areaHa: z.number(), ringXY: z.array(pair) })),
  tracks: z.object({
    oldBoundary: z.object({ file: z.string(), points: z.number(), startTime: z.string() }),
    mainCreekWalk: z.object({ file: z.string(), points: z.number(), startTime: z.string() }),
  }),
});
type Manifest = z.infer<typeof manifestSchema>;

/** Run a GDAL tool; fail (never skip) with an install hint when GDAL is missing. */
function runGdal(tool: string, args: readonly string[]): string {
  const result = spawnSync(tool, args, { encoding: 'utf8' });
  if (result.error) {
    const code = (result.error as NodeJS.ErrnoException).code;
    if (code === 'ENOENT') {
      throw new Error(`${tool} not found: install GDAL's command-line tools (Debian: apt-get install gdal-bin) to run the GDAL checks`);
    }
    throw result.error;
  }
  if (result.status !== 0) throw new Error(`${tool} ${args.join(' ')} failed: ${result.stderr}`);
  return result.stdout;
}

let dirA = '';
let dirB = '';
let manifest: Manifest;
let raster: Float32Array;
const model = createTerrainModel(SEED);

const readText = (name: string) => readFileSync(join(dirA, name), 'utf8');

/** Cell value of the generated raster at `[x, y]` in EPSG:7854 (the cell containing the point). */
function cellAt(x: number, y: number): number {
  const col = Math.floor((x - 560000) / 5);
  const row = Math.floor((6523000 - y) / 5);
  return raster[row * 600 + col]!;
}

/** Every crossing of a fence polyline with a creek polyline, with the acute angle between the two segments. */
function crossings(fence: readonly XY[], creek: readonly XY[]): { point: XY; angleDeg: number }[] {
  const out: { point: XY; angleDeg: number }[] = [];
  for (let i = 0; i + 1 < fence.length; i++) {
    const [px, py] = fence[i]!;
    const rx = fence[i + 1]![0] - px;
    const ry = fence[i + 1]![1] - py;
    for (let j = 0; j + 1 < creek.length; j++) {
      const [qx, qy] = creek[j]!;
      const sx = creek[j + 1]![0] - qx;
      const sy = creek[j + 1]![1] - qy;
      const cross = rx * sy - ry * sx;
      if (cross === 0) continue;
      const t = ((qx - px) * sy - (qy - py) * sx) / cross;
      const u = ((qx - px) * ry - (qy - py) * rx) / cross;
      if (t < 0 || t > 1 || u < 0 || u >= 1) continue;
      // Acute angle between the fence segment and the creek segment (downstream direction).
      const cos = Math.abs(rx * sx + ry * sy) / (Math.hypot(rx, ry) * Math.hypot(sx, sy));
      out.push({ point: [px + t * rx, py + t * ry], angleDeg: (Math.acos(Math.min(1, cos)) * 180) / Math.PI });
    }
  }
  return out;
}

beforeAll(() => {
  dirA = mkdtempSync(join(tmpdir(), 'gullyline-demo-a-'));
  dirB = mkdtempSync(join(tmpdir(), 'gullyline-demo-b-'));
  writeDemoScenario(dirA);
  writeDemoScenario(dirB);
  manifest = manifestSchema.parse(JSON.parse(readText('saltbush-rise.json')));
}, 60_000);

afterAll(() => {
  for (const dir of [dirA, dirB]) if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('demo scenario generator', () => {
  it('writes byte-identical files on two runs', () => {
    const names = readdirSync(dirA).sort();
    expect(names).toEqual(['saltbush-rise-creek.gpx', 'saltbush-rise-dem.tif', 'saltbush-rise-old-boundary.gpx', 'saltbush-rise-subdivision.kml', 'saltbush-rise.json']);
    expect(readdirSync(dirB).sort()).toEqual(names);
    for (const name of names) {
      expect(Buffer.compare(readFileSync(join(dirA, name)), readFileSync(join(dirB, name))), name).toBe(0);
    }
  });

  it('matches the committed copies in data-samples/ (regenerate with npm run demo:generate)', () => {
    for (const name of readdirSync(dirA)) {
      const committed = join(DATA_SAMPLES_DIR, name);
      expect(Buffer.compare(readFileSync(join(dirA, name)), readFileSync(committed)), `${name} is stale`).toBe(0);
    }
  });

  it('says in every file that the data is invented', () => {
    expect(manifest.invented).toContain('invented');
    for (const name of ['saltbush-rise-old-boundary.gpx', 'saltbush-rise-creek.gpx']) {
      expect(readText(name)).toMatch(/<metadata>[\s\S]*<desc>[^<]*invented[^<]*<\/desc>[\s\S]*<\/metadata>/);
    }
    expect(readText('saltbush-rise-subdivision.kml')).toMatch(/<Document>\s*<name>[^<]*<\/name>\s*<description>[^<]*invented/);
  });
});

describe('elevation model GeoTIFF', () => {
  beforeAll(async () => {
    const bytes = readFileSync(join(dirA, 'saltbush-rise-dem.tif'));
    const tiff = await fromArrayBuffer(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength));
    const image = await tiff.getImage();
    const [band] = await image.readRasters();
    if (!(band instanceof Float32Array)) throw new Error('expected a Float32 band');
    raster = band;
  });

  it('reads back with geotiff.js: size, origin, cell size, nodata, CRS, description', async () => {
    const bytes = readFileSync(join(dirA, 'saltbush-rise-dem.tif'));
    const image = await (await fromArrayBuffer(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength))).getImage();
    expect([image.getWidth(), image.getHeight(), image.getSamplesPerPixel()]).toEqual([600, 600, 1]);
    expect(image.getOrigin()).toEqual([560000, 6523000, 0]);
    expect(image.getResolution()).toEqual([5, -5, 0]);
    expect(image.getGDALNoData()).toBe(-9999);
    const geoKeys: Record<string, unknown> = { ...image.getGeoKeys() };
    expect(geoKeys['GTModelTypeGeoKey']).toBe(1);
    expect(geoKeys['GTRasterTypeGeoKey']).toBe(1);
    expect(geoKeys['ProjectedCSTypeGeoKey']).toBe(7854);
    expect(String(await image.getFileDirectory().loadValue('ImageDescription'))).toContain('invented');
    expect(raster.length).toBe(600 * 600);
  });

  it('has a few nodata cells in the south-west corner only', () => {
    let nodata = 0;
    let misplaced = 0;
    let min = Infinity;
    let max = -Infinity;
    for (let i = 0; i < raster.length; i++) {
      const v = raster[i]!;
      if (v === -9999) {
        nodata++;
        if (i % 600 >= 10 || Math.floor(i / 600) < 590) misplaced++;
      } else {
        min = Math.min(min, v);
        max = Math.max(max, v);
      }
    }
    expect(misplaced).toBe(0);
    expect(nodata).toBe(manifest.elevationModel.nodataCells);
    expect(nodata).toBeGreaterThan(0);
    expect(nodata).toBeLessThan(100);
    // Dry inland plain: a few metres of relief, no wild values.
    expect(min).toBeGreaterThan(140);
    expect(max).toBeLessThan(160);
  });

  // GDAL gdalinfo -json, Debian gdal-bin: CRS, georeferencing, nodata, band type, description.
  it('GDAL gdalinfo reads EPSG:7854, the origin, 5 m cells and nodata -9999', () => {
    const info = z
      .object({
        size: z.tuple([z.number(), z.number()]),
        geoTransform: z.array(z.number()),
        stac: z.object({ 'proj:epsg': z.number() }),
        coordinateSystem: z.object({ wkt: z.string() }),
        wgs84Extent: z.object({ coordinates: z.array(z.array(pair)) }),
        metadata: z.object({ '': z.record(z.string()) }),
        bands: z.array(z.object({ type: z.string(), noDataValue: z.number() })),
      })
      .parse(JSON.parse(runGdal('gdalinfo', ['-json', join(dirA, 'saltbush-rise-dem.tif')])));
    expect(info.size).toEqual([600, 600]);
    expect(info.geoTransform).toEqual([560000, 5, 0, 6523000, 0, -5]);
    expect(info.stac['proj:epsg']).toBe(7854);
    expect(info.coordinateSystem.wkt).toContain('GDA2020 / MGA zone 54');
    expect(info.bands).toHaveLength(1);
    expect(info.bands[0]!.type).toBe('Float32');
    expect(info.bands[0]!.noDataValue).toBe(-9999);
    expect(info.metadata['']['AREA_OR_POINT']).toBe('Area');
    expect(info.metadata['']['TIFFTAG_IMAGEDESCRIPTION']).toContain('invented');
    // GDAL (through PROJ) puts the corners where proj4js does: the manifest's WGS84 extent.
    const lons = info.wgs84Extent.coordinates[0]!.map((p) => p[0]);
    const lats = info.wgs84Extent.coordinates[0]!.map((p) => p[1]);
    const [west, south, east, north] = manifest.extent.wgs84;
    expect(Math.min(...lons)).toBeCloseTo(west, 6);
    expect(Math.min(...lats)).toBeCloseTo(south, 6);
    expect(Math.max(...lons)).toBeCloseTo(east, 6);
    expect(Math.max(...lats)).toBeCloseTo(north, 6);
  });

  // GDAL gdallocationinfo -valonly -geoloc, Debian gdal-bin: the value GDAL reads at a map position.
  it('GDAL gdallocationinfo reads the terrain function’s values at sample points', () => {
    const samples: { what: string; col: number; row: number }[] = [
      { what: 'main creek bed at the north cross fence', col: Math.floor((manifest.fenceLines[0]!.crossing.pointXY[0] - 560000) / 5), row: Math.floor((6523000 - manifest.fenceLines[0]!.crossing.pointXY[1]) / 5) },
      { what: 'crest of the low rise', col: 450, row: 119 },
      { what: 'floor of the claypan', col: 490, row: 469 },
    ];
    for (const { what, col, row } of samples) {
      const x = 560000 + (col + 0.5) * 5;
      const y = 6523000 - (row + 0.5) * 5;
      const gdalValue = Number(runGdal('gdallocationinfo', ['-valonly', '-geoloc', join(dirA, 'saltbush-rise-dem.tif'), String(x), String(y)]).trim());
      expect(gdalValue, what).toBeCloseTo(Math.fround(model.cellElevationM(col, row)), 6);
      expect(raster[row * 600 + col], what).toBeCloseTo(gdalValue, 6);
    }
    const corner = runGdal('gdallocationinfo', ['-valonly', '-geoloc', join(dirA, 'saltbush-rise-dem.tif'), '560002.5', '6520002.5']).trim();
    expect(Number(corner)).toBe(-9999);
  });

  it('has creeks really incised: each centreline cell is lower than the cells 30 m either side', () => {
    const others = (id: string) => manifest.creeks.filter((c) => c.id !== id).map((c) => c.centrelineXY);
    const distanceTo = (p: XY, line: readonly XY[]) => Math.min(...line.map((q) => Math.hypot(p[0] - q[0], p[1] - q[1])));
    let checked = 0;
    for (const creek of manifest.creeks) {
      const line = creek.centrelineXY;
      const minDropM = creek.id === 'main-creek' ? 1.0 : 0.3;
      // Every 10th vertex (about 50 m apart), away from the grid edges.
      for (let i = 10; i < line.length - 10; i += 10) {
        const p = line[i]!;
        const a = line[i - 1]!;
        const b = line[i + 1]!;
        const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
        const normal: XY = [-(b[1] - a[1]) / len, (b[0] - a[0]) / len];
        const left: XY = [p[0] + 30 * normal[0], p[1] + 30 * normal[1]];
        const right: XY = [p[0] - 30 * normal[0], p[1] - 30 * normal[1]];
        // Skip where a side sample lands in another creek's channel (near a junction).
        if (others(creek.id).some((o) => distanceTo(left, o) < 80 || distanceTo(right, o) < 80)) continue;
        const bed = cellAt(p[0], p[1]);
        expect(cellAt(left[0], left[1]) - bed, `${creek.id} vertex ${i}`).toBeGreaterThan(minDropM);
        expect(cellAt(right[0], right[1]) - bed, `${creek.id} vertex ${i}`).toBeGreaterThan(minDropM);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(80);
  });

  it('has creek beds that never rise downstream (terrain function without cell noise)', () => {
    for (const creek of model.network.creeks) {
      const beds = creek.points.map(([x, y]) => model.surfaceElevationM(x, y));
      for (let i = 1; i < beds.length; i++) expect(beds[i]!, `${creek.id} vertex ${i}`).toBeLessThanOrEqual(beds[i - 1]!);
    }
  });
});

describe('planned subdivision KML', () => {
  const placemarks = () =>
    [...readText('saltbush-rise-subdivision.kml').matchAll(/<Placemark id="([^"]+)">([\s\S]*?)<\/Placemark>/g)].map((m) => ({ id: m[1]!, body: m[2]! }));
  const lonLatList = (text: string): [number, number][] =>
    text
      .trim()
      .split(/\s+/)
      .map((t) => {
        const [lon, lat] = t.split(',').map(Number);
        return [lon!, lat!];
      });

  it('is KML 2.2 with three fence lines in a folder and two paddock polygons', () => {
    const kml = readText('saltbush-rise-subdivision.kml');
    expect(kml).toContain('<kml xmlns="http://www.opengis.net/kml/2.2">');
    expect(kml).toMatch(/<Folder>\s*<name>Planned fence lines<\/name>(\s*<Placemark[\s\S]*?<LineString>[\s\S]*?<\/Placemark>){3}\s*<\/Folder>/);
    expect(placemarks().filter((p) => p.body.includes('<LineString>'))).toHaveLength(3);
    expect(placemarks().filter((p) => p.body.includes('<Polygon>'))).toHaveLength(2);
    for (const p of placemarks()) expect(p.body).toMatch(/<description>[^<]*invented/);
  });

  it('crosses the creeks at the stated angles within 1°, measured in EPSG:7854', () => {
    const creekXY = new Map(manifest.creeks.map((c) => [c.id, c.centrelineXY]));
    const fences = placemarks().filter((p) => p.body.includes('<LineString>'));
    const statedAngles: number[] = [];
    for (const fence of fences) {
      const stated = /at (\d+(?:\.\d+)?)° to the downstream flow direction/.exec(fence.body);
      expect(stated, `${fence.id} states its crossing angle`).not.toBeNull();
      const statedDeg = Number(stated![1]);
      statedAngles.push(statedDeg);
      const inManifest = manifest.fenceLines.find((f) => f.id === fence.id);
      expect(inManifest?.crossing.constructedAngleDeg).toBe(statedDeg);
      const coords = /<coordinates>([^<]+)<\/coordinates>/.exec(fence.body)![1]!;
      const line = lonLatList(coords).map((ll) => toXY.forward(ll) as XY);
      for (const [creekId, creek] of creekXY) {
        const found = crossings(line, creek);
        if (creekId !== inManifest!.crossing.creekId) {
          expect(found, `${fence.id} × ${creekId}`).toHaveLength(0);
          continue;
        }
        expect(found, `${fence.id} × ${creekId}`).toHaveLength(1);
        expect(Math.abs(found[0]!.angleDeg - statedDeg), `${fence.id} angle`).toBeLessThan(1);
        const [mx, my] = inManifest!.crossing.pointXY;
        expect(Math.hypot(found[0]!.point[0] - mx, found[0]!.point[1] - my), `${fence.id} crossing point`).toBeLessThan(0.5);
      }
    }
    expect(statedAngles.sort((a, b) => a - b)).toEqual([35, 60, 90]);
  });

  // GDAL ogr2ogr (KML driver and PROJ), Debian gdal-bin: an independent reader and reprojection.
  it('GDAL ogr2ogr reads the three fence lines, reprojects them to EPSG:7854, and the angles hold within 1°', () => {
    const csv = runGdal('ogr2ogr', [
      '-f', 'CSV', '/vsistdout/', join(dirA, 'saltbush-rise-subdivision.kml'), 'Planned fence lines',
      '-t_srs', 'EPSG:7854', '-lco', 'GEOMETRY=AS_WKT',
    ]);
    const rows = [...csv.matchAll(/^"LINESTRING \(([^)]+)\)",([^,]+),/gm)].map((m) => ({
      name: m[2]!,
      line: m[1]!.split(',').map((p) => p.trim().split(' ').map(Number) as XY),
    }));
    expect(rows.map((r) => r.name).sort()).toEqual(manifest.fenceLines.map((f) => f.name).sort());
    for (const { name, line } of rows) {
      const fence = manifest.fenceLines.find((f) => f.name === name)!;
      const creek = manifest.creeks.find((c) => c.id === fence.crossing.creekId)!.centrelineXY;
      const found = crossings(line, creek);
      expect(found, name).toHaveLength(1);
      expect(Math.abs(found[0]!.angleDeg - fence.crossing.constructedAngleDeg), name).toBeLessThan(1);
    }
  });
});

describe('GPS tracks (GPX 1.1)', () => {
  const trackPoints = (name: string) =>
    [...readText(name).matchAll(/<trkpt lat="(-?[\d.]+)" lon="(-?[\d.]+)"><ele>(-?[\d.]+)<\/ele><time>([^<]+)<\/time><\/trkpt>/g)].map((m) => ({
      lat: Number(m[1]),
      lon: Number(m[2]),
      ele: Number(m[3]),
      timeMs: Date.parse(m[4]!),
    }));

  for (const [key, name, intervalS] of [
    ['oldBoundary', 'saltbush-rise-old-boundary.gpx', 5],
    ['mainCreekWalk', 'saltbush-rise-creek.gpx', 10],
  ] as const) {
    it(`${name}: one track, the manifest's point count, ele and rising 2026 times`, () => {
      const gpx = readText(name);
      expect(gpx).toMatch(/<gpx version="1.1"[^>]*xmlns="http:\/\/www.topografix.com\/GPX\/1\/1"/);
      expect(gpx.match(/<trk>/g)).toHaveLength(1);
      expect(gpx.match(/<trkseg>/g)).toHaveLength(1);
      const points = trackPoints(name);
      expect(points.length).toBe(gpx.match(/<trkpt /g)!.length);
      // GDAL ogrinfo (GPX driver), Debian gdal-bin: an independent reader counts the same points.
      const ogr = runGdal('ogrinfo', ['-ro', '-so', join(dirA, name), 'track_points']);
      expect(/Feature Count: (\d+)/.exec(ogr)?.[1]).toBe(String(points.length));
      expect(points.length).toBe(manifest.tracks[key].points);
      expect(points.length).toBeGreaterThan(200);
      expect(new Date(points[0]!.timeMs).toISOString().replace('.000Z', 'Z')).toBe(manifest.tracks[key].startTime);
      expect(new Date(points[0]!.timeMs).getUTCFullYear()).toBe(2026);
      for (let i = 1; i < points.length; i++) expect(points[i]!.timeMs - points[i - 1]!.timeMs).toBe(intervalS * 1000);
      const [west, south, east, north] = manifest.extent.wgs84;
      for (const p of points) {
        expect(p.lon).toBeGreaterThan(west - 0.001);
        expect(p.lon).toBeLessThan(east + 0.001);
        expect(p.lat).toBeGreaterThan(south - 0.001);
        expect(p.lat).toBeLessThan(north + 0.001);
        expect(p.ele).toBeGreaterThan(130);
        expect(p.ele).toBeLessThan(170);
      }
    });
  }

  it('walks the main creek: every creek-walk fix is within 20 m of the centreline (GPS jitter)', () => {
    const creek = manifest.creeks.find((c) => c.id === 'main-creek')!.centrelineXY;
    for (const p of trackPoints('saltbush-rise-creek.gpx')) {
      const [x, y] = toXY.forward([p.lon, p.lat]) as XY;
      expect(Math.min(...creek.map((q) => Math.hypot(x - q[0], y - q[1])))).toBeLessThan(20);
    }
  });

  it('drives the boundary: every fix is within 25 m of the property edge', () => {
    for (const p of trackPoints('saltbush-rise-old-boundary.gpx')) {
      const [x, y] = toXY.forward([p.lon, p.lat]) as XY;
      const toEdge = Math.min(Math.abs(x - 560000), Math.abs(x - 563000), Math.abs(y - 6520000), Math.abs(y - 6523000));
      expect(toEdge).toBeLessThan(25);
    }
  });
});
