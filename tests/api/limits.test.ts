// Limits the built server enforces, with the message a person sees. The test server allows 60
// expensive requests a minute per person (tests/helpers/global-server.ts).
import { beforeAll, describe, expect, it } from 'vitest';
import { signedInClient, type TestClient } from '../helpers/api-client';

const PER_MINUTE = 60;

let client: TestClient;
let propertyId = 0;

beforeAll(async () => {
  ({ client } = await signedInClient('limits'));
  propertyId = (await client.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Limits', crs: 'EPSG:7854' })).body.property.id;
});

describe('requests per minute on expensive routes', () => {
  it('answers 429 with Retry-After and a clear message past the limit, for that person only', async () => {
    for (let i = 0; i < PER_MINUTE; i += 1) {
      const response = await client.request('GET', `/api/properties/${propertyId}/exports/plan.geojson`);
      expect(response.status).toBe(200);
      await response.arrayBuffer();
    }
    const refused = await client.request('GET', `/api/properties/${propertyId}/exports/plan.kml`);
    expect(refused.status).toBe(429);
    const retryAfterS = Number(refused.headers.get('retry-after'));
    expect(retryAfterS).toBeGreaterThanOrEqual(1);
    expect(retryAfterS).toBeLessThanOrEqual(60);
    expect(await refused.json()).toEqual({
      error: `Too many requests for exports and other heavy work: each person may make ${PER_MINUTE} a minute. Wait ${retryAfterS} second${retryAfterS === 1 ? '' : 's'} and try again.`,
    });
    // Ordinary reads go on, and another person is not held back.
    expect((await client.request('GET', `/api/properties/${propertyId}/fence-lines`)).status).toBe(200);
    const { client: other } = await signedInClient('limits-other');
    const otherProperty = (await other.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Other', crs: 'EPSG:7854' })).body.property.id;
    expect((await other.request('GET', `/api/properties/${otherProperty}/exports/plan.geojson`)).status).toBe(200);
  });
});

describe('vertices per fence line', () => {
  it('refuses a fence line past MAX_FENCE_VERTICES (default 5000) with 422 and stores nothing', async () => {
    const coordinates = Array.from({ length: 5001 }, (_, i) => [141.9 + i * 0.00001, -37.1 + (i % 2) * 0.00001]);
    const { status, body } = await client.json('POST', `/api/properties/${propertyId}/fence-lines`, { name: 'Too detailed', coordinates });
    expect(status).toBe(422);
    expect(body).toMatchObject({ fields: { coordinates: 'Keep a fence line under 5000 points.' } });
    expect((await client.json<{ fenceLines: unknown[] }>('GET', `/api/properties/${propertyId}/fence-lines`)).body.fenceLines).toEqual([]);
  });
});
