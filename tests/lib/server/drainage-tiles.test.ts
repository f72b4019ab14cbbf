import { VectorTile } from '@mapbox/vector-tile';
import Pbf from 'pbf';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db, ensureMigrated } from '../../../src/lib/server/db';
import { BadRequestError, NotFoundError } from '../../../src/lib/server/http';
import { createProperty } from '../../../src/lib/server/repos/properties';
import { createUser } from '../../../src/lib/server/repos/users';
import { drainageTile, forgetDrainageTiles, parseTileCoords } from '../../../src/lib/server/terrain/drainage-tiles';

// The line and its zoom-12 tile worked by hand in tests/lib/geo/drainage-tiles.test.ts (slippy-map
// formula, OSM wiki "Slippy map tilenames"): 31.4° S from 141.58° E to 141.62° E is in x 3658–3659, y 2424.
const TILE = { z: 12, x: 3659, y: 2424 };
const LINE = [[141.58, -31.4], [141.62, -31.4]];

let propertyId = 0;
let otherPropertyId = 0;
let modelId = 0;

async function insertRun(property: number, status: 'succeeded' | 'queued'): Promise<number> {
  const [row] = await db()('terrain_runs')
    .insert({ property_id: property, elevation_model_id: modelId, status, percent: status === 'succeeded' ? 100 : 0, threshold_ha: 5, created_at: new Date().toISOString() })
    .returning('id');
  return (row as { id: number }).id;
}

async function insertLine(runId: number, streamOrder: number): Promise<number> {
  const [row] = await db()('drainage_lines')
    .insert({
      property_id: propertyId, terrain_run_id: runId, geometry: JSON.stringify({ type: 'LineString', coordinates: LINE }), stream_order: streamOrder,
      upstream_area_start_m2: 1, upstream_area_end_m2: 2, length_m: 3800, mean_slope: 0.01, min_lon: 141.58, min_lat: -31.4, max_lon: 141.62, max_lat: -31.4,
    })
    .returning('id');
  return (row as { id: number }).id;
}

const idsIn = (bytes: Uint8Array | null) => {
  const layer = bytes && new VectorTile(new Pbf(bytes)).layers.drainage;
  return layer ? Array.from({ length: layer.length }, (_, i) => layer.feature(i).id) : [];
};

beforeAll(async () => {
  await ensureMigrated();
  const user = await createUser({ email: 'tiles@test.example', name: 'Tiles', passwordHash: 'x' });
  propertyId = (await createProperty({ name: 'Tiles', region: '', crs: 'EPSG:7854' }, user.id)).id;
  otherPropertyId = (await createProperty({ name: 'Elsewhere', region: '', crs: 'EPSG:7854' }, user.id)).id;
  [modelId] = (await db()('elevation_models')
    .insert({
      property_id: propertyId, name: 'dem.tif', stored_file: 'elevation-models/1/source.tif', size_bytes: 1, crs: 'EPSG:7854', crs_name: 'GDA2020 / MGA zone 54',
      width: 1, height: 1, cell_size_m: 5, extent_west: 141.5, extent_south: -31.5, extent_east: 141.7, extent_north: -31.3, created_at: new Date().toISOString(),
    })
    .returning('id')
    .then((rows) => rows.map((row: { id: number }) => row.id))) as [number];
});
afterAll(closeDb);

describe('drainageTile', () => {
  it('serves a finished run’s lines, keeps the cut tiles, and drops them when told the lines went', async () => {
    const runId = await insertRun(propertyId, 'succeeded');
    const lineId = await insertLine(runId, 3);
    expect(idsIn(await drainageTile(propertyId, runId, TILE))).toEqual([lineId]);
    // The lines go (as when a newer run replaces them): the kept tiles still answer until forgotten.
    await db()('drainage_lines').where({ terrain_run_id: runId }).delete();
    expect(idsIn(await drainageTile(propertyId, runId, TILE))).toEqual([lineId]);
    forgetDrainageTiles([runId]);
    expect(await drainageTile(propertyId, runId, TILE)).toBeNull();
  });

  it('cuts low zooms from the bigger channels only', async () => {
    const runId = await insertRun(propertyId, 'succeeded');
    const gully = await insertLine(runId, 1);
    const creek = await insertLine(runId, 3);
    expect(idsIn(await drainageTile(propertyId, runId, { z: 11, x: 1829, y: 1212 }))).toEqual([creek]);
    expect(idsIn(await drainageTile(propertyId, runId, { z: 13, x: 7318, y: 4849 })).sort()).toEqual([gully, creek].sort());
  });

  it('has no tiles for another property’s run or a run not yet finished', async () => {
    const runId = await insertRun(propertyId, 'succeeded');
    await expect(drainageTile(otherPropertyId, runId, TILE)).rejects.toBeInstanceOf(NotFoundError);
    const queued = await insertRun(propertyId, 'queued');
    await expect(drainageTile(propertyId, queued, TILE)).rejects.toThrow(/not finished/);
  });
});

describe('parseTileCoords', () => {
  it('reads whole tile numbers on the map and refuses the rest with a reason', () => {
    expect(parseTileCoords({ z: '12', x: '3659', y: '2424' })).toEqual(TILE);
    expect(parseTileCoords({ z: '0', x: '0', y: '0' })).toEqual({ z: 0, x: 0, y: 0 });
    expect(() => parseTileCoords({ z: '25', x: '0', y: '0' })).toThrow(BadRequestError);
    expect(() => parseTileCoords({ z: '-1', x: '0', y: '0' })).toThrow(/zoom/);
    expect(() => parseTileCoords({ z: '3', x: '8', y: '0' })).toThrow(/from 0 to 7/);
    expect(() => parseTileCoords({ z: '3', x: '1', y: '2e0' })).toThrow(BadRequestError);
    expect(() => parseTileCoords({ z: '3', x: '1' })).toThrow(BadRequestError);
  });
});
