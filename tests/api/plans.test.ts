import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeServerDb, rowCounts, signedInClient, type TestClient } from '../helpers/api-client';

type FenceLine = { id: number; name: string; status: string; lengthM: number; version: number; coordinates: [number, number][] };

let manager: TestClient;
let propertyId = 0;

beforeAll(async () => {
  manager = (await signedInClient('plans-manager')).client;
  const created = await manager.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Plans', crs: 'EPSG:7854' });
  propertyId = created.body.property.id;
});
afterAll(closeServerDb);

const importFile = (name: string, text: string, type = 'application/gpx+xml') =>
  manager.request('POST', `/api/properties/${propertyId}/tracks?name=${encodeURIComponent(name)}`, new TextEncoder().encode(text), { 'Content-Type': type });

describe('fence lines', () => {
  it('creates a fence line with its geodesic length, and refuses an edit made on stale data', async () => {
    const created = await manager.json<{ fenceLine: FenceLine }>('POST', `/api/properties/${propertyId}/fence-lines`, {
      name: 'Test line',
      coordinates: [[141.64, -31.44], [141.65, -31.44]],
    });
    expect(created.status).toBe(201);
    // 0.01° of longitude at 31.44° S on WGS84 ≈ 950.9 m (GeographicLib Inverse; analytic check:
    // N·cos φ·Δλ with N the prime-vertical radius, 6 384 490 m × 0.85318 × 0.000174533 = 950.7 m).
    expect(created.body.fenceLine.lengthM).toBeGreaterThan(950);
    expect(created.body.fenceLine.lengthM).toBeLessThan(952);
    const id = created.body.fenceLine.id;
    const moved = await manager.json<{ fenceLine: FenceLine }>('PATCH', `/api/properties/${propertyId}/fence-lines/${id}`, { status: 'approved', version: 1 });
    expect(moved.body.fenceLine).toMatchObject({ status: 'approved', version: 2 });
    const stale = await manager.json<{ error: string }>('PATCH', `/api/properties/${propertyId}/fence-lines/${id}`, { name: 'Lost edit', version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error).toMatch(/Reload it to see their change/);
    const now = await manager.json<{ fenceLine: FenceLine }>('GET', `/api/properties/${propertyId}/fence-lines/${id}`);
    expect(now.body.fenceLine.name).toBe('Test line');
  });

  it('deletes a fence line only at the version read when one is given: stale 409 keeps it, the right one 204', async () => {
    const created = await manager.json<{ fenceLine: FenceLine }>('POST', `/api/properties/${propertyId}/fence-lines`, {
      name: 'Deleted with care',
      coordinates: [[141.64, -31.45], [141.65, -31.45]],
    });
    const id = created.body.fenceLine.id;
    await manager.json('PATCH', `/api/properties/${propertyId}/fence-lines/${id}`, { status: 'approved', version: 1 });

    const before = await rowCounts('fence_lines', 'audit_log');
    const stale = await manager.json<{ error: string }>('DELETE', `/api/properties/${propertyId}/fence-lines/${id}?version=1`);
    expect(stale.status).toBe(409);
    expect(stale.body.error).toBe('Someone changed "Deleted with care" since you opened it (now version 2). Reload it to see their change, then delete it if you still mean to.');
    const bad = await manager.json<{ fields: Record<string, string> }>('DELETE', `/api/properties/${propertyId}/fence-lines/${id}?version=two`);
    expect(bad.status).toBe(422);
    expect(bad.body.fields.version).toMatch(/whole number/);
    expect(await rowCounts('fence_lines', 'audit_log')).toEqual(before);
    expect((await manager.json<{ fenceLine: FenceLine }>('GET', `/api/properties/${propertyId}/fence-lines/${id}`)).body.fenceLine).toMatchObject({ name: 'Deleted with care', version: 2 });

    expect((await manager.request('DELETE', `/api/properties/${propertyId}/fence-lines/${id}?version=2`)).status).toBe(204);
    expect((await manager.json('GET', `/api/properties/${propertyId}/fence-lines/${id}`)).status).toBe(404);
  });

  it.each([
    ['one point', { name: 'X', coordinates: [[141.64, -31.44]] }, 'coordinates', /at least two points/],
    ['a latitude out of range', { name: 'X', coordinates: [[141.64, -95], [141.65, -31.44]] }, 'coordinates.0.1', /Latitudes lie between/],
    ['no name', { name: ' ', coordinates: [[141.64, -31.44], [141.65, -31.44]] }, 'name', /Give the fence line a name/],
  ])('refuses %s with 422 naming the field, and stores nothing', async (_label, input, field, message) => {
    const before = await rowCounts('fence_lines', 'audit_log');
    const answer = await manager.json<{ fields: Record<string, string> }>('POST', `/api/properties/${propertyId}/fence-lines`, input);
    expect(answer.status).toBe(422);
    expect(answer.body.fields[field]).toMatch(message);
    expect(await rowCounts('fence_lines', 'audit_log')).toEqual(before);
  });
});

describe('importing GPX and KML', () => {
  it('imports the demo tracks and subdivision: lines become tracks, polygons paddocks with their area', async () => {
    const gpx = await importFile('saltbush-rise-old-boundary.gpx', readFileSync('data-samples/saltbush-rise-old-boundary.gpx', 'utf8'));
    expect(gpx.status).toBe(201);
    const kml = await importFile('saltbush-rise-subdivision.kml', readFileSync('data-samples/saltbush-rise-subdivision.kml', 'utf8'), 'application/vnd.google-earth.kml+xml');
    expect(((await kml.json()) as { imported: { tracks: number; paddocks: number } }).imported).toMatchObject({ tracks: 3, paddocks: 2 });
    const paddocks = await manager.json<{ paddocks: { name: string; areaHa: number }[] }>('GET', `/api/properties/${propertyId}/paddocks`);
    // Geodesic area (GeographicLib) against the generator's planar area in EPSG:7854 (data-samples manifest):
    // within 0.1 %, the order of the grid's scale factor.
    const manifest = JSON.parse(readFileSync('data-samples/saltbush-rise.json', 'utf8')) as { paddocks: { name: string; areaHa: number }[] };
    for (const expected of manifest.paddocks) {
      const found = paddocks.body.paddocks.find((p) => p.name === expected.name)!;
      expect(Math.abs(found.areaHa - expected.areaHa) / expected.areaHa).toBeLessThan(0.001);
    }
  });

  it('turns a track into a fence line in one step', async () => {
    const tracks = await manager.json<{ tracks: { id: number; name: string; lengthM: number }[] }>('GET', `/api/properties/${propertyId}/tracks`);
    const boundary = tracks.body.tracks.find((t) => /Old boundary/.test(t.name))!;
    const made = await manager.json<{ fenceLine: FenceLine }>('POST', `/api/properties/${propertyId}/tracks/${boundary.id}/fence-line`);
    expect(made.status).toBe(201);
    expect(made.body.fenceLine.status).toBe('planned');
    expect(made.body.fenceLine.lengthM).toBeCloseTo(boundary.lengthM, 6);
  });

  it.each([
    ['an empty GPX', 'empty.gpx', '<gpx version="1.1" xmlns="http://www.topografix.com/GPX/1/1"></gpx>', 422, /no lines or polygons/],
    ['a KML with no lines', 'points.kml', '<kml><Placemark><Point><coordinates>141,-31</coordinates></Point></Placemark></kml>', 422, /no lines or polygons/],
    ['a file that is not XML, named .gpx', 'photo.gpx', '\u00ff\u00d8\u00ff\u00e0 JFIF binary', 422, /not well-formed XML/],
    ['a KMZ', 'plan.kmz', 'PK\u0003\u0004', 422, /unzip it/],
    ['an empty file', 'nothing.gpx', '', 400, /empty/],
  ])('refuses %s with a clear message, and stores nothing', async (_label, name, text, status, message) => {
    const before = await rowCounts('tracks', 'paddocks', 'audit_log');
    const response = await importFile(name, text);
    expect(response.status).toBe(status);
    expect(((await response.json()) as { error: string }).error).toMatch(message);
    expect(await rowCounts('tracks', 'paddocks', 'audit_log')).toEqual(before);
  });
});
