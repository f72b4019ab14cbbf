/**
 * Paddocks, track deletion and ground height at a point through the built server. Outside
 * references: GeographicLib (geographiclib-geodesic) for the squares and their areas; GDAL 3.6
 * (Debian gdal-bin) gdallocationinfo for the height in the demo model's cell under a point.
 */
import { copyFileSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import geographiclib from 'geographiclib-geodesic';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { closeServerDb, rowCounts, serverDb, signedInClient, type TestClient } from '../helpers/api-client';
import { gdalValuesAt, runGdal } from '../helpers/gdal';

type P = [number, number];
type Paddock = { id: number; name: string; rings: P[][]; areaHa: number; version: number; updatedAt: string };

const WGS84 = geographiclib.Geodesic.WGS84;
const destination = (from: P, bearingDeg: number, distanceM: number): P => {
  const r = WGS84.Direct(from[1], from[0], bearingDeg, distanceM);
  return [r.lon2!, r.lat2!];
};
function geographicLibAreaHa(corners: P[]): number {
  const polygon = WGS84.Polygon(false);
  for (const [lon, lat] of corners) polygon.AddPoint(lat, lon);
  return Math.abs(polygon.Compute(false, true).area!) / 10_000;
}

// A 1 km square at the demo latitude, corners by GeographicLib's direct solution.
const sw: P = [141.64, -31.44];
const se = destination(sw, 90, 1000);
const nw = destination(sw, 0, 1000);
const ne = destination(nw, 90, 1000);

// Terrain runs wait their turn for the server's one worker.
vi.setConfig({ testTimeout: 150_000 });

let manager: TestClient;
let propertyId = 0;
const base = () => `/api/properties/${propertyId}`;

beforeAll(async () => {
  manager = (await signedInClient('paddocks-manager')).client;
  propertyId = (await manager.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Paddock Flat', crs: 'EPSG:7854' })).body.property.id;
});
afterAll(closeServerDb);

describe('paddocks', () => {
  it('draws a paddock with its geodesic area, renames it, refuses a stale edit, and deletes it', async () => {
    const created = await manager.json<{ paddock: Paddock }>('POST', `${base()}/paddocks`, { name: 'Creek paddock', rings: [[sw, se, ne, nw]] });
    expect(created.status).toBe(201);
    // Analytic 100 ha; GeographicLib's area of the same corners.
    expect(created.body.paddock.areaHa).toBeCloseTo(100, 1);
    expect(created.body.paddock.areaHa).toBeCloseTo(geographicLibAreaHa([sw, se, ne, nw]), 6);
    expect(created.body.paddock.rings[0]).toHaveLength(5);
    const id = created.body.paddock.id;

    const renamed = await manager.json<{ paddock: Paddock }>('PATCH', `${base()}/paddocks/${id}`, { name: 'Creek flat', version: 1 });
    expect(renamed.body.paddock).toMatchObject({ name: 'Creek flat', version: 2 });
    const redrawn = await manager.json<{ paddock: Paddock }>('PATCH', `${base()}/paddocks/${id}`, { rings: [[sw, se, ne]], version: 2 });
    expect(redrawn.body.paddock.areaHa).toBeCloseTo(geographicLibAreaHa([sw, se, ne]), 6);

    const before = await rowCounts('paddocks', 'audit_log');
    const stale = await manager.json<{ error: string }>('PATCH', `${base()}/paddocks/${id}`, { name: 'Lost edit', version: 2 });
    expect(stale.status).toBe(409);
    expect(stale.body.error).toBe('Someone changed "Creek flat" since you opened it (now version 3). Reload it to see their change, then edit again.');
    expect(await rowCounts('paddocks', 'audit_log')).toEqual(before);
    expect((await manager.json<{ paddock: Paddock }>('GET', `${base()}/paddocks/${id}`)).body.paddock).toMatchObject({ name: 'Creek flat', version: 3 });

    expect((await manager.request('DELETE', `${base()}/paddocks/${id}`)).status).toBe(204);
    expect((await manager.json('GET', `${base()}/paddocks/${id}`)).status).toBe(404);
    const audit = await manager.json<{ entries: { action: string }[] }>('GET', `${base()}/audit`);
    expect(audit.body.entries.slice(0, 4).map((e) => e.action)).toEqual(['paddock.delete', 'paddock.update', 'paddock.update', 'paddock.create']);
  });

  it('deletes a paddock only at the version read when one is given: stale 409 keeps it, the right one 204', async () => {
    const { body } = await manager.json<{ paddock: Paddock }>('POST', `${base()}/paddocks`, { name: 'Careful flat', rings: [[sw, se, ne, nw]] });
    const id = body.paddock.id;
    await manager.json('PATCH', `${base()}/paddocks/${id}`, { name: 'Careful flat 2', version: 1 });

    const before = await rowCounts('paddocks', 'audit_log');
    const stale = await manager.json<{ error: string }>('DELETE', `${base()}/paddocks/${id}?version=1`);
    expect(stale.status).toBe(409);
    expect(stale.body.error).toBe('Someone changed "Careful flat 2" since you opened it (now version 2). Reload it to see their change, then delete it if you still mean to.');
    expect((await manager.json<{ fields: Record<string, string> }>('DELETE', `${base()}/paddocks/${id}?version=0`)).status).toBe(422);
    expect(await rowCounts('paddocks', 'audit_log')).toEqual(before);
    expect((await manager.json<{ paddock: Paddock }>('GET', `${base()}/paddocks/${id}`)).body.paddock).toMatchObject({ name: 'Careful flat 2', version: 2 });

    expect((await manager.request('DELETE', `${base()}/paddocks/${id}?version=2`)).status).toBe(204);
    expect((await manager.json('GET', `${base()}/paddocks/${id}`)).status).toBe(404);
  });

  const bowTie = [sw, se, nw, ne];
  it.each([
    ['two corners', { name: 'X', rings: [[sw, se]] }, 'rings.0', /at least three corners/],
    ['two distinct corners', { name: 'X', rings: [[sw, se, se, sw]] }, 'rings.0', /The boundary: a paddock boundary needs at least three distinct corners, got 2\./],
    ['a bow-tie crossing itself', { name: 'X', rings: [bowTie] }, 'rings.0', /The boundary: the boundary crosses or touches itself at \[141\.64\d+, -31\.43\d+\], near corner 1\./],
    ['a latitude of 95°', { name: 'X', rings: [[sw, [141.65, 95], ne]] }, 'rings.0.1.1', /Latitudes lie between -90 and 90/],
    ['corners on one line', { name: 'X', rings: [[sw, destination(sw, 90, 100), destination(sw, 90, 200)]] }, 'rings.0', /its corners lie on one line/],
    ['no boundary', { name: 'X' }, 'rings', /Give the boundary as rings/],
    ['no name', { name: ' ', rings: [[sw, se, ne]] }, 'name', /Give the paddock a name/],
  ])('refuses a paddock with %s: 422 naming the field, nothing stored', async (_label, input, field, message) => {
    const before = await rowCounts('paddocks', 'audit_log');
    const answer = await manager.json<{ error: string; fields: Record<string, string> }>('POST', `${base()}/paddocks`, input);
    expect(answer.status).toBe(422);
    expect(answer.body.fields[field]).toMatch(message);
    expect(await rowCounts('paddocks', 'audit_log')).toEqual(before);
  });

  it('refuses to redraw a paddock as a bow-tie, leaving it as it was', async () => {
    const { body } = await manager.json<{ paddock: Paddock }>('POST', `${base()}/paddocks`, { name: 'Kept', rings: [[sw, se, ne, nw]] });
    const before = await rowCounts('paddocks', 'audit_log');
    const answer = await manager.json<{ fields: Record<string, string> }>('PATCH', `${base()}/paddocks/${body.paddock.id}`, { rings: [bowTie], version: 1 });
    expect(answer.status).toBe(422);
    expect(answer.body.fields['rings.0']).toMatch(/crosses or touches itself/);
    expect(await rowCounts('paddocks', 'audit_log')).toEqual(before);
    expect((await manager.json<{ paddock: Paddock }>('GET', `${base()}/paddocks/${body.paddock.id}`)).body.paddock).toEqual(body.paddock);
    await manager.request('DELETE', `${base()}/paddocks/${body.paddock.id}`);
  });
});

describe('paddocks from fence lines', () => {
  let fenced = 0;
  const fenceIds: number[] = [];

  beforeAll(async () => {
    fenced = (await manager.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Four Fences', crs: 'EPSG:7854' })).body.property.id;
    // Four fences round the square; the north one stops 3 m short of the NW corner.
    const sides: P[][] = [[sw, se], [se, ne], [ne, destination(nw, 90, 3)], [nw, sw]];
    for (const [k, coordinates] of sides.entries()) {
      const { body } = await manager.json<{ fenceLine: { id: number } }>('POST', `/api/properties/${fenced}/fence-lines`, { name: `Side ${k + 1}`, coordinates });
      fenceIds.push(body.fenceLine.id);
    }
  });

  it('makes one paddock of about 100 ha from four fences closing a square, and none the second time', async () => {
    const made = await manager.json<{ paddocks: Paddock[]; enclosedAreas: number; alreadyCovered: number }>('POST', `/api/properties/${fenced}/paddocks/from-fences`);
    expect(made.status).toBe(201);
    expect(made.body.enclosedAreas).toBe(1);
    expect(made.body.paddocks).toHaveLength(1);
    // The 3 m gap is closed at its middle, which moves the NW corner 1.5 m east: GeographicLib's
    // area of those corners, about 100 ha less a 1.5 m × 1 km triangle (analytic: 0.075 ha).
    const areaHa = made.body.paddocks[0]!.areaHa;
    expect(Math.abs(areaHa - geographicLibAreaHa([sw, se, ne, destination(nw, 90, 1.5)]))).toBeLessThan(0.001);
    expect(geographicLibAreaHa([sw, se, ne, nw]) - areaHa).toBeCloseTo(0.075, 3);
    const again = await manager.json<{ paddocks: Paddock[]; alreadyCovered: number }>('POST', `/api/properties/${fenced}/paddocks/from-fences`, { fenceLineIds: fenceIds });
    expect(again.body).toEqual({ paddocks: [], enclosedAreas: 1, alreadyCovered: 1 });
    expect((await manager.json<{ paddocks: Paddock[] }>('GET', `/api/properties/${fenced}/paddocks`)).body.paddocks).toHaveLength(1);
  });

  it('refuses a fence line that is not this property\'s, naming it, and makes nothing', async () => {
    const before = await rowCounts('paddocks', 'audit_log');
    const answer = await manager.json<{ fields: Record<string, string> }>('POST', `/api/properties/${fenced}/paddocks/from-fences`, { fenceLineIds: [fenceIds[0], 987_654] });
    expect(answer.status).toBe(422);
    expect(answer.body.fields.fenceLineIds).toBe('No fence line with id 987654 on this property.');
    const empty = await manager.json<{ fields: Record<string, string> }>('POST', `/api/properties/${fenced}/paddocks/from-fences`, { fenceLineIds: [] });
    expect(empty.body.fields.fenceLineIds).toMatch(/Give at least one fence line, or leave fenceLineIds out/);
    expect(await rowCounts('paddocks', 'audit_log')).toEqual(before);
  });
});

describe('tracks', () => {
  it('deletes an imported track, with an audit entry', async () => {
    const kml = '<kml xmlns="http://www.opengis.net/kml/2.2"><Placemark><name>Old fence</name><LineString><coordinates>141.64,-31.44 141.65,-31.45</coordinates></LineString></Placemark></kml>';
    await manager.request('POST', `${base()}/tracks?name=old.kml`, new TextEncoder().encode(kml), { 'Content-Type': 'application/vnd.google-earth.kml+xml' });
    const { body } = await manager.json<{ tracks: { id: number; name: string }[] }>('GET', `${base()}/tracks`);
    const track = body.tracks.find((t) => t.name === 'Old fence')!;
    const before = await rowCounts('tracks');
    expect((await manager.request('DELETE', `${base()}/tracks/${track.id}`)).status).toBe(204);
    expect(await rowCounts('tracks')).toEqual({ tracks: before.tracks! - 1 });
    expect((await manager.request('DELETE', `${base()}/tracks/${track.id}`)).status).toBe(404);
    const entry = await serverDb()('audit_log').where({ property_id: propertyId, action: 'track.delete' }).first('entity_id');
    expect(entry.entity_id).toBe(String(track.id));
  });
});

describe('ground height at a point', () => {
  const work = mkdtempSync(path.join(tmpdir(), 'gullyline-elevation-api-'));
  // A copy, so that no GDAL side file is written beside the committed demo model.
  const demo = path.join(work, 'demo.tif');
  let modelId = 0;

  beforeAll(async () => {
    copyFileSync('data-samples/saltbush-rise-dem.tif', demo);
    const upload = await manager.request('POST', `${base()}/elevation-models?name=saltbush-rise-dem.tif`, new Uint8Array(readFileSync(demo)), { 'Content-Type': 'image/tiff' });
    const uploaded = (await upload.json()) as { elevationModel: { id: number }; run: { id: number } };
    modelId = uploaded.elevationModel.id;
    for (let i = 0; i < 2400; i++) {
      const { body } = await manager.json<{ run: { status: string; message: string | null } }>('GET', `${base()}/terrain-runs/${uploaded.run.id}`);
      if (body.run.status === 'succeeded') return;
      if (!['queued', 'running'].includes(body.run.status)) throw new Error(`terrain run ${body.run.status}: ${body.run.message}`);
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    throw new Error('terrain run did not finish');
  });
  afterAll(() => rmSync(work, { recursive: true, force: true }));

  /** The cell GDAL finds under a WGS84 point (gdallocationinfo -wgs84 -xml), and its height. */
  function gdalCellAt([lon, lat]: P): { col: number; row: number; elevationM: number } {
    const xml = runGdal('gdallocationinfo', ['-wgs84', '-xml', demo, String(lon), String(lat)]);
    const [, col, row] = /pixel="(\d+)" line="(\d+)"/.exec(xml)!.map(Number);
    const elevationM = Number(runGdal('gdallocationinfo', ['-wgs84', '-valonly', demo, String(lon), String(lat)]).trim());
    return { col: col!, row: row!, elevationM };
  }

  it.each([
    ['by the main creek', [141.6455, -31.4395] as P],
    ['on the east tributary crossing', [141.6557275, -31.4366741] as P],
    ['on the south slope', [141.6371, -31.4488] as P],
  ])('agrees with GDAL at a point %s, within the relief between the cell under it and its neighbours', async (_label, point) => {
    const { status, body } = await manager.json<{ elevationM: number; modelId: number; cellSizeM: number }>('GET', `${base()}/elevation?lon=${point[0]}&lat=${point[1]}`);
    expect(status).toBe(200);
    expect(body).toMatchObject({ modelId, cellSizeM: 5 });
    // GDAL gives the height of the cell holding the point (nearest cell); the app interpolates
    // between the four cell centres around it, all among that cell and its eight neighbours. So
    // the two differ by no more than the largest height difference between that cell and a
    // neighbour (GDAL's own values): the tolerance, a few decimetres on this terrain.
    const cell = gdalCellAt(point);
    const around = [-1, 0, 1].flatMap((dr) => [-1, 0, 1].map((dc) => [cell.col + dc, cell.row + dr] as const));
    const tolerance = Math.max(...gdalValuesAt(demo, around).map((z) => Math.abs(z - cell.elevationM)));
    expect(tolerance).toBeLessThan(5);
    expect(Math.abs(body.elevationM - cell.elevationM)).toBeLessThanOrEqual(tolerance);
  });

  it('answers null with 200 off every model', async () => {
    const { status, body } = await manager.json('GET', `${base()}/elevation?lon=141.5&lat=-31.44`);
    expect(status).toBe(200);
    expect(body).toEqual({ elevationM: null, modelId: null, cellSizeM: null });
  });

  it.each([
    ['no lat', '?lon=141.64', 'lat', 'Give lat=… in degrees.'],
    ['an empty lon', '?lon=&lat=-31.44', 'lon', 'Give lon=… in degrees.'],
    ['a lon that is not a number', '?lon=east&lat=-31.44', 'lon', 'Give lon as a number of degrees.'],
    ['a latitude of 95°', '?lon=141.64&lat=95', 'lat', 'lat must be between -90 and 90.'],
  ])('refuses %s with 422 and a message saying what to send', async (_label, query, field, message) => {
    const { status, body } = await manager.json<{ fields: Record<string, string> }>('GET', `${base()}/elevation${query}`);
    expect(status).toBe(422);
    expect(body.fields[field]).toBe(message);
  });
});
