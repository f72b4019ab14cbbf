import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it, vi } from 'vitest';
import geodesic from 'geographiclib-geodesic';
import { oversizedTiff } from '../helpers/elevation-fixtures';
import { closeServerDb, rowCounts, signedInClient, type TestClient } from '../helpers/api-client';

const DEMO = 'data-samples/saltbush-rise-dem.tif';
const manifest = JSON.parse(readFileSync('data-samples/saltbush-rise.json', 'utf8')) as {
  creeks: { name: string; centrelineLonLat: [number, number][] }[];
  fenceLines: { name: string; pointsLonLat: [number, number][]; crossing: { pointLonLat: [number, number] } }[];
};
const work = mkdtempSync(path.join(tmpdir(), 'gullyline-terrain-api-'));
// Runs wait their turn for the server's one terrain worker, possibly behind earlier files' runs.
vi.setConfig({ testTimeout: 150_000 });

/** A variant of the demo model written by GDAL (Debian gdal-bin), the reference tool for GeoTIFFs. */
function gdalVariant(name: string, tool: string, args: string[]): Uint8Array {
  const out = path.join(work, name);
  execFileSync(tool, [...args, out], { stdio: 'pipe' });
  return new Uint8Array(readFileSync(out));
}

type Run = { id: number; status: string; stage: string | null; percent: number; message: string | null; summary: { boundsWgs84: number[] } | null };

let manager: TestClient;
let propertyId = 0;

async function upload(bytes: Uint8Array, query = '?name=model.tif', id = propertyId) {
  const response = await manager.request('POST', `/api/properties/${id}/elevation-models${query}`, bytes, { 'Content-Type': 'image/tiff' });
  return { status: response.status, body: (await response.json()) as { error?: string; fields?: Record<string, string>; run: Run; elevationModel: { id: number }; warnings: string[] } };
}

async function waitForRun(runId: number, id = propertyId): Promise<{ run: Run; seen: Set<string> }> {
  const seen = new Set<string>();
  // Up to two minutes: the server runs one terrain run at a time.
  for (let i = 0; i < 2400; i++) {
    const { body } = await manager.json<{ run: Run }>('GET', `/api/properties/${id}/terrain-runs/${runId}`);
    seen.add(`${body.run.status}:${body.run.stage ?? ''}`);
    if (!['queued', 'running'].includes(body.run.status)) return { run: body.run, seen };
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error(`run ${runId} did not finish`);
}

/** Files left in the upload area or for elevation models, to prove a refusal stores nothing. */
function storedFiles(): string[] {
  const dataDir = inject('dataDir');
  return ['uploads/incoming', 'elevation-models'].flatMap((folder) => {
    const full = path.join(dataDir, folder);
    return existsSync(full) ? readdirSync(full, { recursive: true }).map(String) : [];
  });
}

beforeAll(async () => {
  const signedIn = await signedInClient('terrain-manager');
  manager = signedIn.client;
  const created = await manager.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Saltbush Rise (test copy)', crs: 'EPSG:7854' });
  propertyId = created.body.property.id;
});
afterAll(closeServerDb);

describe('terrain runs over the demo elevation model', () => {
  let runId = 0;

  it('accepts the upload, runs every stage off the request thread and succeeds', async () => {
    const { status, body } = await upload(new Uint8Array(readFileSync(DEMO)), '?name=saltbush-rise-dem.tif');
    expect(status).toBe(201);
    expect(body.run.status).toBe('queued');
    expect(body.warnings).toEqual([]);
    runId = body.run.id;
    const { run, seen } = await waitForRun(runId);
    expect(run.status, run.message ?? '').toBe('succeeded');
    expect(run.percent).toBe(100);
    expect(seen.size).toBeGreaterThan(1);
  });

  it('yields drainage lines that follow the demo creek', async () => {
    const { body } = await manager.json<{ type: string; features: { properties: { streamOrder: number }; geometry: { coordinates: [number, number][] } }[] }>(
      'GET',
      `/api/properties/${propertyId}/drainage-lines`,
    );
    expect(body.type).toBe('FeatureCollection');
    expect(body.features.length).toBeGreaterThan(10);
    // Distance in metres from each point of the main creek's constructed centreline (data-samples
    // manifest) to the nearest drainage line, on a local plane (degrees to metres near 31.4° S).
    const mPerDegLat = 110_900;
    const mPerDegLon = 111_320 * Math.cos((31.44 * Math.PI) / 180);
    const toM = ([lon, lat]: [number, number]) => [lon * mPerDegLon, lat * mPerDegLat] as const;
    const segments = body.features.flatMap((f) => f.geometry.coordinates.slice(1).map((b, i) => [toM(f.geometry.coordinates[i]!), toM(b)] as const));
    const distanceToLines = (point: [number, number]) => {
      const [px, py] = toM(point);
      return Math.min(
        ...segments.map(([[ax, ay], [bx, by]]) => {
          const t = Math.max(0, Math.min(1, ((px - ax) * (bx - ax) + (py - ay) * (by - ay)) / ((bx - ax) ** 2 + (by - ay) ** 2 || 1)));
          return Math.hypot(px - (ax + t * (bx - ax)), py - (ay + t * (by - ay)));
        }),
      );
    };
    const main = manifest.creeks.find((creek) => /main/i.test(creek.name))!;
    // From the point where the creek drains more than the 5 ha threshold (past its first tenth).
    const downstream = main.centrelineLonLat.slice(Math.ceil(main.centrelineLonLat.length / 10));
    const offsets = downstream.filter((_, i) => i % 5 === 0).map(distanceToLines);
    // Within two 5 m cells, the light simplification of the traced lines included.
    expect(Math.max(...offsets)).toBeLessThan(10);
    expect(Math.max(...body.features.map((f) => f.properties.streamOrder))).toBeGreaterThanOrEqual(3);
  });

  it('serves the hillshade image and contour lines, and places the property on the map', async () => {
    const png = await manager.request('GET', `/api/properties/${propertyId}/terrain-runs/${runId}/hillshade.png`);
    expect(png.headers.get('content-type')).toBe('image/png');
    expect([...new Uint8Array(await png.arrayBuffer()).slice(0, 4)]).toEqual([0x89, 0x50, 0x4e, 0x47]);
    const contours = await manager.json<{ features: { properties: { elevationM: number } }[] }>('GET', `/api/properties/${propertyId}/terrain-runs/${runId}/contours.geojson`);
    expect(contours.body.features.length).toBeGreaterThan(5);
    const property = await manager.json<{ property: { extentWgs84: number[] } }>('GET', `/api/properties/${propertyId}`);
    expect(property.body.property.extentWgs84[0]).toBeCloseTo(141.6313, 3);
  });

  it('delineates the catchment of a crossing: larger downstream, the outlet on the creek', async () => {
    type Catchment = { areaHa: number; longestFlowPathM: number; equalAreaSlope: number; outlet: [number, number]; polygon: { coordinates: number[][][][] } };
    const at = async (lonLat: [number, number]) =>
      (await manager.json<{ catchment: Catchment }>('GET', `/api/properties/${propertyId}/catchment?lon=${lonLat[0]}&lat=${lonLat[1]}&snapM=30`)).body.catchment;
    const north = await at(manifest.fenceLines.find((f) => f.name === 'North cross fence')!.crossing.pointLonLat);
    const south = await at(manifest.fenceLines.find((f) => f.name === 'South cross fence')!.crossing.pointLonLat);
    expect(north.areaHa).toBeGreaterThan(5);
    expect(south.areaHa).toBeGreaterThan(north.areaHa);
    expect(south.longestFlowPathM).toBeGreaterThan(north.longestFlowPathM);
    // The plain falls about 2.2 m per km (data-samples manifest): the equal-area slope is of that order.
    expect(south.equalAreaSlope).toBeGreaterThan(0.0005);
    expect(south.equalAreaSlope).toBeLessThan(0.02);
    expect(south.polygon.coordinates.length).toBeGreaterThan(0);
    const outside = await manager.json<{ error: string }>('GET', `/api/properties/${propertyId}/catchment?lon=140&lat=-30`);
    expect(outside.status).toBe(404);
    expect(outside.body.error).toMatch(/No processed elevation model covers this place/);
  });

  it('samples the ground profile along a fence line, its length agreeing with GeographicLib within 0.1 %', async () => {
    const fence = manifest.fenceLines.find((f) => f.name === 'North cross fence')!.pointsLonLat;
    const { status, body } = await manager.json<{ profile: { lengthM: number; samples: { chainageM: number; elevationM: number | null }[] } }>(
      'POST',
      `/api/properties/${propertyId}/profile`,
      { line: fence },
    );
    expect(status).toBe(200);
    // Geodesic length on WGS84 (GeographicLib, Karney 2013, J. Geodesy 87:43–55).
    let geodesicM = 0;
    for (let i = 1; i < fence.length; i++) {
      geodesicM += geodesic.Geodesic.WGS84.Inverse(fence[i - 1]![1], fence[i - 1]![0], fence[i]![1], fence[i]![0]).s12!;
    }
    expect(Math.abs(body.profile.lengthM - geodesicM) / geodesicM).toBeLessThan(0.001);
    const heights = body.profile.samples.map((s) => s.elevationM).filter((z): z is number => z !== null);
    // The fence dips into the creek it crosses: its lowest ground lies well below its highest.
    expect(Math.max(...heights) - Math.min(...heights)).toBeGreaterThan(2);
    const bad = await manager.json<{ fields: Record<string, string> }>('POST', `/api/properties/${propertyId}/profile`, { line: [[141.64, -31.44]] });
    expect(bad.status).toBe(422);
    expect(bad.body.fields.line).toMatch(/at least two points/);
  });

  it('warns, and still accepts, a model that lies away from the property', async () => {
    const shifted = gdalVariant('shifted.tif', 'gdal_translate', ['-q', '-a_ullr', '660000', '6623000', '663000', '6620000', DEMO]);
    const { status, body } = await upload(shifted);
    expect(status).toBe(201);
    expect(body.warnings.join(' ')).toMatch(/does not overlap the property/);
    await waitForRun(body.run.id);
  });

  it('cancels a run that is under way', async () => {
    const big = gdalVariant('big.tif', 'gdal_translate', ['-q', '-outsize', '400%', '400%', DEMO]);
    const { body } = await upload(big);
    const cancelled = await manager.json<{ run: Run }>('POST', `/api/properties/${propertyId}/terrain-runs/${body.run.id}/cancel`);
    expect(cancelled.status).toBe(200);
    expect(cancelled.body.run.status).toBe('cancelled');
    const again = await manager.json<{ error: string }>('POST', `/api/properties/${propertyId}/terrain-runs/${body.run.id}/cancel`);
    expect(again.status).toBe(409);
    // A new run over the same model can start once this one is cancelled.
    const rerun = await manager.json<{ run: Run }>('POST', `/api/properties/${propertyId}/terrain-runs`, { elevationModelId: body.elevationModel.id, thresholdHa: 50 });
    expect(rerun.status).toBe(201);
    expect((await waitForRun(rerun.body.run.id)).run.status).toBe('succeeded');
  }, 120_000);
});

describe('bad elevation models: a clear message, and nothing stored', () => {
  const demo = () => new Uint8Array(readFileSync(DEMO));
  const cases: [string, () => Uint8Array, number, RegExp][] = [
    ['bytes that are not a TIFF', () => new TextEncoder().encode('this is a plain text file, not a GeoTIFF'), 422, /not a (Geo)?TIFF/i],
    ['a truncated TIFF', () => demo().slice(0, 5_000), 422, /truncated|cut short|incomplete/i],
    ['an RGB image', () => gdalVariant('rgb.tif', 'gdal_translate', ['-q', '-b', '1', '-b', '1', '-b', '1', '-ot', 'Byte', '-scale', DEMO]), 422, /band/i],
    ['an unsupported sample format', () => gdalVariant('byte.tif', 'gdal_translate', ['-q', '-ot', 'Byte', '-scale', DEMO]), 422, /8-bit|sample/i],
    ['a header declaring 200 000 × 200 000 cells', oversizedTiff, 422, /40,000,000,000 cells/],
    ['an empty file', () => new Uint8Array(0), 400, /empty/i],
  ];

  it.each(cases)('refuses %s', async (_label, bytes, status, message) => {
    const before = await rowCounts('elevation_models', 'terrain_runs', 'drainage_lines');
    const filesBefore = storedFiles();
    const answer = await upload(bytes());
    expect(answer.status).toBe(status);
    expect(answer.body.error).toMatch(message);
    expect(JSON.stringify(answer.body)).not.toMatch(/at .*\.(ts|js|mjs):\d+/);
    expect(await rowCounts('elevation_models', 'terrain_runs', 'drainage_lines')).toEqual(before);
    expect(storedFiles()).toEqual(filesBefore);
  });

  it('fails the run of a model that is all nodata with the reason, and deletes the model with its files on request', async () => {
    const nodata = gdalVariant('nodata.tif', 'gdal_create', ['-q', '-outsize', '20', '20', '-ot', 'Float32', '-a_ullr', '560000', '6523000', '560100', '6522900', '-burn', '-9999', '-a_nodata', '-9999', '-a_srs', 'EPSG:7854']);
    const before = await rowCounts('elevation_models', 'terrain_runs', 'drainage_lines');
    const filesBefore = storedFiles();
    // The header is fine, so the upload is taken; the heights are read by the run, off the request thread.
    const { status, body } = await upload(nodata);
    expect(status).toBe(201);
    const { run } = await waitForRun(body.run.id);
    expect(run.status).toBe('failed');
    expect(run.message).toMatch(/nodata/i);
    const removed = await manager.request('DELETE', `/api/properties/${propertyId}/elevation-models/${body.elevationModel.id}`);
    expect(removed.status).toBe(204);
    expect(await rowCounts('elevation_models', 'terrain_runs', 'drainage_lines')).toEqual(before);
    expect(storedFiles()).toEqual(filesBefore);
  });

  it('asks for the coordinate system of a model without one, and accepts it once given', async () => {
    const noCrs = gdalVariant('no-crs.tif', 'gdal_create', ['-q', '-outsize', '40', '40', '-ot', 'Float32', '-a_ullr', '560000', '6523000', '560200', '6522800', '-burn', '150']);
    const before = await rowCounts('elevation_models', 'terrain_runs');
    const refused = await upload(noCrs);
    expect(refused.status).toBe(422);
    expect(refused.body.fields?.crs).toMatch(/EPSG code/);
    expect(await rowCounts('elevation_models', 'terrain_runs')).toEqual(before);
    const accepted = await upload(noCrs, '?name=no-crs.tif&crs=EPSG:7854');
    expect(accepted.status).toBe(201);
    await waitForRun(accepted.body.run.id);
  });

  it('refuses a crew member and answers another property’s run with 404', async () => {
    const other = await signedInClient('terrain-other');
    const created = await other.client.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Other', crs: 'EPSG:7854' });
    const response = await other.client.request('GET', `/api/properties/${created.body.property.id}/terrain-runs/1`);
    expect(response.status).toBe(404);
  });
});
