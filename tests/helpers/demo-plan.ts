// The demo property's plan built through the API on a property of a test's own: settings (IFD
// table and prices from data-samples), the demo elevation model processed, then the three fence lines.
import { readFileSync } from 'node:fs';
import type { TestClient } from './api-client';

const manifest = JSON.parse(readFileSync('data-samples/saltbush-rise.json', 'utf8')) as { fenceLines: { name: string; pointsLonLat: [number, number][] }[] };
const ifd = JSON.parse(readFileSync('data-samples/saltbush-rise-ifd.json', 'utf8')) as Record<string, unknown>;
const prices = JSON.parse(readFileSync('data-samples/saltbush-rise-prices.json', 'utf8')) as { items: unknown[] };

/** Creates the property, waits for its terrain run (up to 100 s) and draws the demo fences; their ids by name. */
export async function loadDemoPlan(manager: TestClient, propertyName: string): Promise<{ propertyId: number; fenceIds: Map<string, number> }> {
  const propertyId = (await manager.json<{ property: { id: number } }>('POST', '/api/properties', { name: propertyName, crs: 'EPSG:7854' })).body.property.id;
  await manager.json('PATCH', `/api/properties/${propertyId}/settings`, { version: 0, ifdTable: ifd, priceList: prices.items });
  const upload = await manager.request('POST', `/api/properties/${propertyId}/elevation-models?name=dem.tif`, new Uint8Array(readFileSync('data-samples/saltbush-rise-dem.tif')), { 'Content-Type': 'image/tiff' });
  const runId = ((await upload.json()) as { run: { id: number } }).run.id;
  for (let i = 0; ; i++) {
    const { body } = await manager.json<{ run: { status: string; message: string | null } }>('GET', `/api/properties/${propertyId}/terrain-runs/${runId}`);
    if (body.run.status === 'succeeded') break;
    if (body.run.status !== 'queued' && body.run.status !== 'running') throw new Error(`terrain run ${body.run.status}: ${body.run.message}`);
    if (i > 1000) throw new Error('terrain run did not finish in 100 s');
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  const fenceIds = new Map<string, number>();
  for (const fence of manifest.fenceLines) {
    const { body } = await manager.json<{ fenceLine: { id: number } }>('POST', `/api/properties/${propertyId}/fence-lines`, { name: fence.name, coordinates: fence.pointsLonLat });
    fenceIds.set(fence.name, body.fenceLine.id);
  }
  return { propertyId, fenceIds };
}
