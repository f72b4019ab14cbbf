/**
 * Ground height at a point from the demo elevation model (data-samples), against GDAL 3.6
 * (Debian gdal-bin): gdaltransform gives the WGS84 position of chosen cell centres (EPSG:7854 →
 * EPSG:4326, which PROJ takes as the null transformation, as the app does) and gdallocationinfo
 * the heights GDAL reads in those cells. Bilinear interpolation at a cell centre is the cell's
 * own height, and halfway between four centres their mean (plain arithmetic).
 */
import { copyFileSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { getConfig } from '../../../src/lib/server/config';
import { closeDb, db, ensureMigrated } from '../../../src/lib/server/db';
import { createProperty } from '../../../src/lib/server/repos/properties';
import { createUser } from '../../../src/lib/server/repos/users';
import { elevationAt } from '../../../src/lib/server/terrain/terrain-queries';
import { gdalValuesAt, runGdal } from '../../helpers/gdal';

// Counts reads of model files from disk, to show that following the cursor reads the model once.
const reads = vi.hoisted(() => ({ count: 0 }));
vi.mock('../../../src/lib/server/elevation/read-elevation-model', async (importOriginal) => {
  const original = await importOriginal<typeof import('../../../src/lib/server/elevation/read-elevation-model')>();
  return {
    ...original,
    readElevationModel: (...args: Parameters<typeof original.readElevationModel>) => {
      reads.count += 1;
      return original.readElevationModel(...args);
    },
  };
});

// The demo model: 600 × 600 cells of 5 m from (560000, 6523000) in EPSG:7854; cell (0, 599) is nodata.
const centreXY = (col: number, row: number) => [560_000 + (col + 0.5) * 5, 6_523_000 - (row + 0.5) * 5] as const;
const work = mkdtempSync(path.join(tmpdir(), 'gullyline-elevation-at-'));
const copy = path.join(work, 'demo.tif');

/** WGS84 `[lon, lat]` of EPSG:7854 points, by GDAL's gdaltransform. */
function gdalToWgs84(points: readonly (readonly [number, number])[]): [number, number][] {
  const out = runGdal('gdaltransform', ['-s_srs', 'EPSG:7854', '-t_srs', 'EPSG:4326', '-output_xy'], points.map(([x, y]) => `${x} ${y}`).join('\n') + '\n');
  return out.trim().split('\n').map((line) => line.trim().split(/\s+/).map(Number) as [number, number]);
}

let propertyId = 0;
let modelId = 0;

beforeAll(async () => {
  await ensureMigrated();
  copyFileSync('data-samples/saltbush-rise-dem.tif', copy);
  const user = await createUser({ email: 'elevation@test.example', name: 'Heights', passwordHash: 'x' });
  propertyId = (await createProperty({ name: 'Heights', region: '', crs: 'EPSG:7854' }, user.id)).id;
  const stored = 'elevation-models/heights/source.tif';
  mkdirSync(path.join(getConfig().dataDir, 'elevation-models/heights'), { recursive: true });
  copyFileSync('data-samples/saltbush-rise-dem.tif', path.join(getConfig().dataDir, stored));
  // Extent from gdalinfo's wgs84Extent of the demo model, rounded outward.
  const [model] = await db()('elevation_models')
    .insert({
      property_id: propertyId, name: 'dem.tif', stored_file: stored, size_bytes: 1, crs: 'EPSG:7854', crs_name: 'GDA2020 / MGA zone 54',
      width: 600, height: 600, cell_size_m: 5, extent_west: 141.6313, extent_south: -31.4532, extent_east: 141.6631, extent_north: -31.4259, created_at: new Date().toISOString(),
    })
    .returning('id');
  modelId = model.id;
  await db()('terrain_runs').insert({ property_id: propertyId, elevation_model_id: modelId, status: 'succeeded', percent: 100, threshold_ha: 5, created_at: new Date().toISOString() });
});
afterAll(async () => {
  await closeDb();
  rmSync(work, { recursive: true, force: true });
});

describe('elevationAt', () => {
  it('gives a cell centre the height GDAL reads in that cell', async () => {
    const cells = [[267, 298], [10, 10], [590, 420], [123, 457]] as const;
    const places = gdalToWgs84(cells.map(([c, r]) => centreXY(c, r)));
    const expected = gdalValuesAt(copy, cells);
    for (const [k, place] of places.entries()) {
      const answer = await elevationAt(propertyId, place);
      expect(answer.modelId).toBe(modelId);
      expect(answer.cellSizeM).toBe(5);
      // gdaltransform prints 15 significant digits: the place is within a micrometre of the centre.
      expect(answer.elevationM).toBeCloseTo(expected[k]!, 3);
    }
  });

  it('gives the mean of the four cells around the point where their centres meet', async () => {
    const [x, y] = centreXY(267, 298);
    const [place] = gdalToWgs84([[x + 2.5, y - 2.5]]);
    const four = gdalValuesAt(copy, [[267, 298], [268, 298], [267, 299], [268, 299]]);
    expect((await elevationAt(propertyId, place!)).elevationM).toBeCloseTo(four.reduce((s, v) => s + v, 0) / 4, 3);
  });

  it('answers null off the model, and on a nodata cell says which model it looked at', async () => {
    expect(await elevationAt(propertyId, [141.5, -31.44])).toEqual({ elevationM: null, modelId: null, cellSizeM: null });
    expect(gdalValuesAt(copy, [[0, 599]])).toEqual([-9999]);
    const [nodata] = gdalToWgs84([centreXY(0, 599)]);
    expect(await elevationAt(propertyId, nodata!)).toEqual({ elevationM: null, modelId, cellSizeM: 5 });
  });

  it('reads the model from disk once however often it is asked (the map cursor)', async () => {
    const before = reads.count;
    const started = performance.now();
    for (let k = 0; k < 200; k++) await elevationAt(propertyId, [141.64 + k * 1e-5, -31.44]);
    // Earlier tests in this file loaded it already: no read at all here.
    expect(reads.count - before).toBe(0);
    expect(reads.count).toBe(1);
    // A generous bound for 200 answers without reading the file: about a millisecond each here.
    expect(performance.now() - started).toBeLessThan(4000);
  });
});
