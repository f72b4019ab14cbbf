import { VectorTile } from '@mapbox/vector-tile';
import { readFileSync } from 'node:fs';
import Pbf from 'pbf';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { TestClient, closeServerDb, serverDb, signedInClient } from '../helpers/api-client';

const DEM = new Uint8Array(readFileSync('data-samples/saltbush-rise-dem.tif'));
const manifest = JSON.parse(readFileSync('data-samples/saltbush-rise.json', 'utf8')) as { creeks: { name: string; centrelineLonLat: [number, number][] }[] };
// The run waits its turn for the server's one terrain worker, possibly behind other files' runs.
vi.setConfig({ testTimeout: 150_000 });

/** Slippy-map tile numbers of a point (OpenStreetMap wiki, "Slippy map tilenames"). */
function tileOf([lon, lat]: [number, number], z: number): { z: number; x: number; y: number } {
  const n = 2 ** z;
  const latRad = (lat * Math.PI) / 180;
  return { z, x: Math.floor(((lon + 180) / 360) * n), y: Math.floor(((1 - Math.asinh(Math.tan(latRad)) / Math.PI) / 2) * n) };
}

let manager: TestClient;
let viewer: TestClient;
let outsider: TestClient;
let propertyId = 0;
let runId = 0;
const tilePath = (id: number, run: number, { z, x, y }: { z: number; x: number | string; y: number | string }) =>
  `/api/properties/${id}/terrain-runs/${run}/drainage/${z}/${x}/${y}`;

beforeAll(async () => {
  manager = (await signedInClient('tiles-manager')).client;
  const created = await manager.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Saltbush Rise (tiles)', crs: 'EPSG:7854' });
  propertyId = created.body.property.id;
  const member = await signedInClient('tiles-viewer');
  viewer = member.client;
  await serverDb()('memberships').insert({ property_id: propertyId, user_id: member.userId, role: 'viewer', created_at: new Date().toISOString() });
  outsider = (await signedInClient('tiles-outsider')).client;
  const upload = await manager.request('POST', `/api/properties/${propertyId}/elevation-models?name=dem.tif`, DEM, { 'Content-Type': 'image/tiff' });
  runId = ((await upload.json()) as { run: { id: number } }).run.id;
  for (let i = 0; i < 2400; i++) {
    const { body } = await manager.json<{ run: { status: string } }>('GET', `/api/properties/${propertyId}/terrain-runs/${runId}`);
    if (!['queued', 'running'].includes(body.run.status)) {
      expect(body.run.status).toBe('succeeded');
      return;
    }
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error('the terrain run did not finish');
}, 150_000);

afterAll(closeServerDb);

describe('drainage vector tiles', () => {
  // A tile over the main creek's middle (data-samples manifest): it must hold drainage lines.
  const creek = manifest.creeks.find((c) => /main/i.test(c.name))!.centrelineLonLat;
  const onCreek = tileOf(creek[Math.floor(creek.length / 2)]!, 14);

  it('gives a member the tile as a Mapbox Vector Tile of the run’s own lines, with stream orders', async () => {
    const response = await viewer.request('GET', tilePath(propertyId, runId, onCreek));
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toBe('application/x-protobuf');
    expect(response.headers.get('cache-control')).toMatch(/max-age=31536000/);
    const layer = new VectorTile(new Pbf(new Uint8Array(await response.arrayBuffer()))).layers.drainage!;
    expect(layer.length).toBeGreaterThan(0);
    const rows = await serverDb()('drainage_lines').where({ terrain_run_id: runId }).select('id', 'stream_order', 'min_lon', 'max_lon', 'min_lat', 'max_lat');
    const byId = new Map(rows.map((row: { id: number; stream_order: number }) => [row.id, row]));
    for (let i = 0; i < layer.length; i++) {
      const feature = layer.feature(i);
      expect(byId.get(feature.id!)?.stream_order, `feature ${feature.id} is one of the run's lines`).toBe(feature.properties.streamOrder);
    }
    // Every line whose box lies inside the tile is in it (zoom 14 shows every stream order).
    const n = 2 ** onCreek.z;
    const west = (onCreek.x / n) * 360 - 180;
    const east = ((onCreek.x + 1) / n) * 360 - 180;
    const latOf = (y: number) => (Math.atan(Math.sinh(Math.PI * (1 - (2 * y) / n))) * 180) / Math.PI;
    const [north, south] = [latOf(onCreek.y), latOf(onCreek.y + 1)];
    const inside = rows.filter((row: { min_lon: number; max_lon: number; min_lat: number; max_lat: number }) => row.min_lon > west && row.max_lon < east && row.min_lat > south && row.max_lat < north);
    const ids = new Set(Array.from({ length: layer.length }, (_, i) => layer.feature(i).id));
    for (const row of inside) expect(ids.has(row.id)).toBe(true);
  });

  it('answers 204 for a tile no drainage line crosses', async () => {
    const response = await viewer.request('GET', tilePath(propertyId, runId, tileOf([0, 0], 14)));
    expect(response.status).toBe(204);
    expect(await response.text()).toBe('');
  });

  it('hides the property from those outside it, and another property’s run from members', async () => {
    const outside = await outsider.request('GET', tilePath(propertyId, runId, onCreek));
    expect(outside.status).toBe(404);
    const other = await outsider.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Elsewhere Downs', crs: 'EPSG:7854' });
    // The member asks for this run under a property that is not its own, and the outsider for this run under theirs.
    const asOwner = await outsider.json<{ error: string }>('GET', tilePath(other.body.property.id, runId, onCreek));
    expect(asOwner.status).toBe(404);
    expect(asOwner.body.error).toMatch(/terrain run/);
    const anonymous = await new TestClient().request('GET', tilePath(propertyId, runId, onCreek));
    expect(anonymous.status).toBe(401);
  });

  it('has no tiles for a run that has not finished', async () => {
    const model = await serverDb()('terrain_runs').where({ id: runId }).first('elevation_model_id');
    const [queued] = await serverDb()('terrain_runs')
      .insert({ property_id: propertyId, elevation_model_id: model.elevation_model_id, status: 'queued', percent: 0, threshold_ha: 5, created_at: new Date().toISOString() })
      .returning('id');
    try {
      const { status, body } = await viewer.json<{ error: string }>('GET', tilePath(propertyId, queued.id, onCreek));
      expect(status).toBe(404);
      expect(body.error).toMatch(/not finished/);
    } finally {
      await serverDb()('terrain_runs').where({ id: queued.id }).delete();
    }
  });

  it.each([
    ['a zoom past 24', { z: 25, x: 0, y: 0 }, /zoom as a whole number from 0 to 24/],
    ['x off the map', { z: 2, x: 4, y: 0 }, /at zoom 2, give tile x and y as whole numbers from 0 to 3/i],
    ['y that is not a number', { z: 14, x: 1, y: 'south' }, /tile x and y as whole numbers/],
    ['a fractional x', { z: 14, x: '1.5', y: 2 }, /tile x and y as whole numbers/],
  ])('refuses %s with 400 and says what is wrong', async (_, coords, message) => {
    const { status, body } = await viewer.json<{ error: string }>('GET', tilePath(propertyId, runId, coords));
    expect(status).toBe(400);
    expect(body.error).toMatch(message);
  });
});
