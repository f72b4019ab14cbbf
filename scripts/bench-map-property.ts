/**
 * The generated property of `bench:map` (invented, seeded, deterministic): a 30 km × 30 km square
 * of inland country centred on 141.6° E, 31.4° S, worked in GDA2020 / MGA zone 54 as the demo is.
 *
 * - an elevation model of 1000 × 1000 cells of 30 m (tilted plain, sines and value noise), stored
 *   as the upload would be, with one succeeded terrain run: its hillshade image and contours
 *   drawn by the app's own core, and 20 000 drainage segments (3–30 vertices, meandering chains
 *   of segments, Strahler order 1–5) stored through the app's repository. The drainage lines are
 *   random, not traced from the model: the map and the lists do not care.
 * - 2 000 fence lines of 2–20 vertices (paddock-like: straight runs of 80–400 m, right-angle
 *   corners), checked with the app's own fence checks.
 * - 500 crossings found by the crossing core where those fences meet those drainage lines (one
 *   from each fence, fences taken in seeded order, and a few runs-along stretches), designed by
 *   the design core over an invented channel profile (as in bench:crossings) with the demo's
 *   invented IFD table.
 *
 * The owner, property, settings, model, run and drainage lines go through the app's repositories;
 * fence lines and crossings are inserted in batches with the columns `createFenceLine` and the
 * crossing analysis write (their audit entries are left out). The filled and flow-direction
 * rasters a real run keeps for catchment queries are not written: loading the workspace does not
 * read them. `seedBenchProperty` imports the app's server modules itself, so that `DATA_DIR` can
 * be set before they first read the configuration.
 */
import { mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { designCrossing } from '../src/lib/crossings/design-crossing';
import { buildDrainageIndex, findCrossings } from '../src/lib/crossings/geometry/index';
import type { Crossing, RunsAlong } from '../src/lib/crossings/geometry/types';
import { positionsOfLayout } from '../src/lib/crossings/layout-positions';
import { crossingRow, runsAlongRow } from '../src/lib/server/crossings/crossing-row';
import { boundsOf, lineLengthM } from '../src/lib/geo/measure';
import { createFromWgs84, createToWgs84, roundLonLat } from '../src/lib/geo/reproject';
import { DEFAULT_DESIGN_SETTINGS } from '../src/lib/schemas/crossing';
import { FENCE_STATUSES, wireSpecSchema, type FenceStatus } from '../src/lib/schemas/plan';
import { chooseContourIntervalM, traceContours } from '../src/lib/terrain/contours';
import { cellCentre, type GridTransform } from '../src/lib/terrain/grid-transform';
import { computeHillshade } from '../src/lib/terrain/hillshade';
import { uniformCellSize, type ElevationGrid } from '../src/lib/terrain/raster';
import type { DrainageSegment } from '../src/lib/terrain/drainage-lines';
import { createMulberry32, type UniformSource } from '../data-samples/lib/prng';
import { CRS_PROJ4 } from '../data-samples/lib/scenario-constants';

export const BENCH_PROPERTY = {
  name: 'Bench Downs (generated)',
  region: 'far west, inland — invented',
  crs: 'EPSG:7854',
  crsName: 'GDA2020 / MGA zone 54',
  centreWgs84: [141.6, -31.4] as [number, number],
  sizeM: 30_000,
  cellSizeM: 30,
  fenceLines: 2_000,
  drainageSegments: 20_000,
  crossings: 500,
  ownerEmail: 'bench-owner@gullyline.localhost',
  ownerPassword: 'bench-map-password-1234',
};

export type SeededProperty = {
  propertyId: number;
  counts: { fenceLines: number; fenceVertices: number; fenceKm: number; drainageSegments: number; drainageVertices: number; crossings: number; fencesSearchedForCrossings: number };
  designStatuses: Record<string, number>;
  timesMs: Record<string, number>;
};

const toWgs84 = createToWgs84(CRS_PROJ4);
const lonLat = (xy: readonly [number, number]): [number, number] => roundLonLat(toWgs84(xy));

/** Heights in metres on the model's grid, row 0 northmost: a plain falling to the south-west with low rises. */
function generateHeights(random: UniformSource, size: number): Float32Array {
  const data = new Float32Array(size * size);
  const octaves = [
    { step: 120, amplitudeM: 9 },
    { step: 31, amplitudeM: 2.5 },
    { step: 7, amplitudeM: 0.4 },
  ].map(({ step, amplitudeM }) => {
    const lw = Math.ceil(size / step) + 2;
    const lattice = Float64Array.from({ length: lw * lw }, () => (random() * 2 - 1) * amplitudeM);
    return { step, lw, lattice };
  });
  const smooth = (t: number): number => t * t * (3 - 2 * t);
  for (let row = 0; row < size; row++) {
    for (let col = 0; col < size; col++) {
      let z = 140 + 0.02 * col + 0.015 * (size - row) + 6 * Math.sin(col / 90) * Math.sin(row / 130);
      for (const { step, lw, lattice } of octaves) {
        const ix = Math.floor(col / step);
        const iy = Math.floor(row / step);
        const tx = smooth(col / step - ix);
        const ty = smooth(row / step - iy);
        const i = iy * lw + ix;
        const top = lattice[i]! + (lattice[i + 1]! - lattice[i]!) * tx;
        const bottom = lattice[i + lw]! + (lattice[i + lw + 1]! - lattice[i + lw]!) * tx;
        z += top + (bottom - top) * ty;
      }
      data[row * size + col] = Math.round(z * 100) / 100;
    }
  }
  return data;
}

/** A step inside the square, bouncing off its edges (the heading turns back as a ball's would). */
function stepInside(from: [number, number], headingRad: number, stepM: number, bounds: { west: number; south: number; east: number; north: number }) {
  let [x, y] = [from[0] + stepM * Math.cos(headingRad), from[1] + stepM * Math.sin(headingRad)];
  let heading = headingRad;
  if (x < bounds.west || x > bounds.east) {
    x = x < bounds.west ? 2 * bounds.west - x : 2 * bounds.east - x;
    heading = Math.PI - heading;
  }
  if (y < bounds.south || y > bounds.north) {
    y = y < bounds.south ? 2 * bounds.south - y : 2 * bounds.north - y;
    heading = -heading;
  }
  return { point: [x, y] as [number, number], heading };
}

/** Meandering chains of segments (3–30 vertices 30–90 m apart), order rising downstream; `[x, y]` in MGA metres. */
function generateDrainage(random: UniformSource, count: number, bounds: Parameters<typeof stepInside>[3]): DrainageSegment[] {
  const segments: DrainageSegment[] = [];
  while (segments.length < count) {
    let at: [number, number] = [bounds.west + random() * (bounds.east - bounds.west), bounds.south + random() * (bounds.north - bounds.south)];
    let heading = random() * 2 * Math.PI;
    let order = 1;
    let areaM2 = 50_000 + random() * 150_000;
    const chain = Math.min(count - segments.length, 1 + Math.floor(random() * 12));
    for (let k = 0; k < chain; k++) {
      if (k > 0 && order < 5 && random() < 0.3) order += 1;
      const vertices = 3 + Math.floor(random() * 28);
      const coordinates: [number, number][] = [at];
      let lengthM = 0;
      for (let v = 1; v < vertices; v++) {
        const stepM = 30 + random() * 60;
        const next = stepInside(at, heading + (random() - 0.5) * 0.8, stepM, bounds);
        heading = next.heading;
        at = next.point;
        coordinates.push(at);
        lengthM += stepM;
      }
      const startM2 = areaM2;
      areaM2 += lengthM * (150 + random() * 450) * order;
      const id = segments.length;
      segments.push({
        id,
        coordinates,
        order,
        upstreamAreaStartM2: Math.round(startM2),
        upstreamAreaEndM2: Math.round(areaM2),
        lengthM: Math.round(lengthM * 10) / 10,
        meanSlope: Math.round((0.001 + random() * 0.015) * 1e5) / 1e5,
        downstreamId: k < chain - 1 ? id + 1 : null,
      });
    }
  }
  return segments;
}

type GeneratedFence = { name: string; status: FenceStatus; wgs84: [number, number][] };

const FENCE_KINDS = ['Boundary', 'Laneway', 'Paddock', 'Subdivision', 'Creek flat', 'Holding paddock'];
const STATUS_WEIGHTS: [FenceStatus, number][] = [['planned', 0.5], ['approved', 0.2], ['building', 0.1], ['built', 0.15], ['retired', 0.05]];

/** Paddock-like fence lines: straight runs with right-angle corners, none crossing itself (the app's own check). */
function generateFences(random: UniformSource, count: number, bounds: Parameters<typeof stepInside>[3], usable: (c: [number, number][]) => [number, number][]): GeneratedFence[] {
  const fences: GeneratedFence[] = [];
  while (fences.length < count) {
    const vertices = 2 + Math.floor(random() * 19);
    let at: [number, number] = [bounds.west + random() * (bounds.east - bounds.west), bounds.south + random() * (bounds.north - bounds.south)];
    let heading = Math.floor(random() * 4) * (Math.PI / 2) + (random() - 0.5) * 0.1;
    const mga: [number, number][] = [at];
    for (let v = 1; v < vertices; v++) {
      if (v > 1 && random() < 0.3) heading += (random() < 0.5 ? 1 : -1) * (Math.PI / 2);
      const next = stepInside(at, heading + (random() - 0.5) * 0.06, 80 + random() * 320, bounds);
      heading = next.heading;
      at = next.point;
      mga.push(at);
    }
    let wgs84: [number, number][];
    try {
      wgs84 = usable(mga.map(lonLat));
    } catch {
      continue; // crosses itself: the app would refuse it, so draw another
    }
    let pick = random();
    const status = STATUS_WEIGHTS.find(([, weight]) => (pick -= weight) < 0)?.[0] ?? FENCE_STATUSES[0];
    const name = `${FENCE_KINDS[Math.floor(random() * FENCE_KINDS.length)]} fence ${fences.length + 1}`;
    fences.push({ name, status, wgs84 });
  }
  return fences;
}

/** Where along a line (cumulative geodesic lengths given) a chainage falls, `[lon, lat]`. */
function pointAtChainage(coordinates: [number, number][], cumulativeM: number[], chainageM: number): [number, number] {
  let k = 1;
  while (k < coordinates.length - 1 && cumulativeM[k]! < chainageM) k++;
  const [a, b] = [coordinates[k - 1]!, coordinates[k]!];
  const t = Math.min(1, Math.max(0, (chainageM - cumulativeM[k - 1]!) / (cumulativeM[k]! - cumulativeM[k - 1]! || 1)));
  return roundLonLat([a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t]);
}

function shuffled<T>(items: readonly T[], random: UniformSource): T[] {
  const copy = [...items];
  for (let i = copy.length - 1; i > 0; i--) {
    const j = Math.floor(random() * (i + 1));
    [copy[i], copy[j]] = [copy[j]!, copy[i]!];
  }
  return copy;
}

async function folderMigrations() {
  const { migrationSource } = await import('../src/lib/server/migration-source');
  const dir = path.resolve('migrations');
  const files = readdirSync(dir).filter((file) => /^\d+_.+\.ts$/.test(file));
  const modules = await Promise.all(files.map(async (file) => [file, await import(pathToFileURL(path.join(dir, file)).href)] as const));
  return migrationSource(Object.fromEntries(modules));
}

/**
 * Migrates the database under `DATA_DIR` and stores the generated property with its owner.
 * Close the database with the returned `close` before another process opens it.
 */
export async function seedBenchProperty(seed: number): Promise<SeededProperty & { close: () => Promise<void> }> {
  const times: Record<string, number> = {};
  const timed = async <T>(name: string, work: () => Promise<T> | T): Promise<T> => {
    const started = performance.now();
    const result = await work();
    times[name] = Math.round(performance.now() - started);
    return result;
  };
  const { closeDb, db } = await import('../src/lib/server/db');
  const { hashPassword } = await import('../src/lib/server/passwords');
  const { createUser } = await import('../src/lib/server/repos/users');
  const { createProperty } = await import('../src/lib/server/repos/properties');
  const { usableFenceCoordinates } = await import('../src/lib/server/repos/fence-lines');
  const { insertElevationModel, insertTerrainRun, updateTerrainRun } = await import('../src/lib/server/repos/terrain');
  const { replaceDrainageLines } = await import('../src/lib/server/repos/drainage-lines');
  const { updatePropertySettings } = await import('../src/lib/server/repos/property-settings');
  const { dataPath, terrainRunFolder } = await import('../src/lib/server/storage');
  const { encodeHillshadePng } = await import('../src/lib/server/terrain/hillshade-png');
  const { encodeGeoTiff } = await import('../src/lib/server/elevation/write-geotiff');

  await timed('migrate', async () => db().migrate.latest({ migrationSource: await folderMigrations() }));
  const random = createMulberry32(seed);
  const { sizeM, cellSizeM } = BENCH_PROPERTY;
  const [cx, cy] = createFromWgs84(CRS_PROJ4)(BENCH_PROPERTY.centreWgs84);
  const west = Math.round(cx - sizeM / 2);
  const north = Math.round(cy + sizeM / 2);
  const bounds = { west, south: north - sizeM, east: west + sizeM, north };
  const transform: GridTransform = { originX: west, originY: north, cellSizeX: cellSizeM, cellSizeY: cellSizeM };
  const cornersWgs84 = ([[west, north], [bounds.east, north], [bounds.east, bounds.south], [west, bounds.south]] as [number, number][]).map(lonLat);
  const boundsWgs84 = boundsOf(cornersWgs84);

  // The terrain run's map products, drawn as the app draws them.
  const size = sizeM / cellSizeM;
  const model = await timed('elevation model', () => {
    const grid: ElevationGrid = { width: size, height: size, data: generateHeights(random, size), ...uniformCellSize(size, size, cellSizeM) };
    let [minM, maxM] = [Infinity, -Infinity];
    for (const z of grid.data) [minM, maxM] = [Math.min(minM, z), Math.max(maxM, z)];
    return { grid, minM, maxM, tiff: encodeGeoTiff(Float32Array.from(grid.data), { width: size, height: size, transform, epsg: 7854, geographic: false, nodata: -9999 }) };
  });
  const contourIntervalM = chooseContourIntervalM(model.minM, model.maxM);
  const products = await timed('hillshade and contours', () => ({
    hillshadePng: encodeHillshadePng(computeHillshade(model.grid), size, size),
    contours: {
      type: 'FeatureCollection',
      features: traceContours(model.grid, { intervalM: contourIntervalM })
        .filter((level) => level.lines.length > 0)
        .map((level) => ({
          type: 'Feature',
          properties: { elevationM: level.elevationM },
          geometry: { type: 'MultiLineString', coordinates: level.lines.map((line) => line.map(([col, row]) => lonLat(cellCentre(transform, col, row)))) },
        })),
    },
  }));

  const drainage = await timed('generate drainage', () => generateDrainage(random, BENCH_PROPERTY.drainageSegments, bounds));
  const drainageWgs84 = drainage.map((segment) => segment.coordinates.map(lonLat));
  const fences = await timed('generate fences', () => generateFences(random, BENCH_PROPERTY.fenceLines, bounds, usableFenceCoordinates));

  const user = await createUser({ email: BENCH_PROPERTY.ownerEmail, name: 'Bench Owner', passwordHash: await hashPassword(BENCH_PROPERTY.ownerPassword) });
  const property = await createProperty({ name: BENCH_PROPERTY.name, region: BENCH_PROPERTY.region, crs: BENCH_PROPERTY.crs, extentWgs84: boundsWgs84 }, user.id);
  const ifd = JSON.parse(readFileSync('data-samples/saltbush-rise-ifd.json', 'utf8')) as { aepPercent: number[]; durationsMin: number[]; intensitiesMmH: number[][]; source: string };
  await updatePropertySettings(property.id, { ifdTable: { aepPercent: ifd.aepPercent, durationsMin: ifd.durationsMin, intensitiesMmH: ifd.intensitiesMmH, source: ifd.source } }, 0, user.id);

  // Elevation model, its succeeded run and the run's drainage lines, in one transaction as a run's success is.
  const now = new Date().toISOString();
  const runId = await timed('store terrain', () =>
    db().transaction(async (trx) => {
      const modelId = await insertElevationModel(
        { propertyId: property.id, name: 'bench-downs-30m.tif', storedFile: 'pending', sizeBytes: model.tiff.byteLength, crs: BENCH_PROPERTY.crs, crsName: BENCH_PROPERTY.crsName, width: size, height: size, cellSizeM, boundsWgs84, uploadedBy: user.id },
        trx,
      );
      const storedFile = `elevation-models/${modelId}/source.tif`;
      mkdirSync(path.dirname(dataPath(storedFile)), { recursive: true });
      writeFileSync(dataPath(storedFile), model.tiff);
      await trx('elevation_models').where({ id: modelId }).update({ stored_file: storedFile });
      const run = await insertTerrainRun({ propertyId: property.id, elevationModelId: modelId, thresholdHa: 5, createdBy: user.id }, trx);
      await replaceDrainageLines(trx, { propertyId: property.id, runId: run.id, elevationModelId: modelId, segments: drainage, wgs84: drainageWgs84 });
      await updateTerrainRun(
        run.id,
        {
          status: 'succeeded',
          stage: null,
          percent: 100,
          message: null,
          startedAt: now,
          finishedAt: now,
          summary: { cornersWgs84, boundsWgs84, contourIntervalM, minElevationM: model.minM, maxElevationM: model.maxM, drainageLineCount: drainage.length, stageTimesMs: { map: times['hillshade and contours']! } },
        },
        trx,
      );
      const folder = dataPath(terrainRunFolder(run.id));
      mkdirSync(folder, { recursive: true });
      writeFileSync(path.join(folder, 'hillshade.png'), products.hillshadePng);
      writeFileSync(path.join(folder, 'contours.geojson'), JSON.stringify(products.contours));
      return run.id;
    }),
  );
  const drainageIds = (await db()('drainage_lines').where({ terrain_run_id: runId }).orderBy('id').select('id')).map((row: { id: number }) => row.id);

  // Fence lines with the columns createFenceLine writes, in batches.
  const wireSpec = wireSpecSchema.parse({});
  const fenceRows = fences.map((fence) => {
    const [minLon, minLat, maxLon, maxLat] = boundsOf(fence.wgs84);
    return {
      property_id: property.id,
      name: fence.name,
      status: fence.status,
      wire_spec: JSON.stringify(wireSpec),
      geometry: JSON.stringify({ type: 'LineString', coordinates: fence.wgs84 }),
      length_m: lineLengthM(fence.wgs84),
      min_lon: minLon,
      min_lat: minLat,
      max_lon: maxLon,
      max_lat: maxLat,
      created_by: user.id,
      created_at: now,
      updated_at: now,
    };
  });
  await timed('store fences', () => db().transaction((trx) => trx.batchInsert('fence_lines', fenceRows, 100)));
  const fenceIds = (await db()('fence_lines').where({ property_id: property.id }).orderBy('id').select('id')).map((row: { id: number }) => row.id);

  // Crossings where the core finds them, one per fence from fences taken in seeded order (finding
  // all of them, some 60 000 on this plan, takes minutes); retired fences are left out as the
  // analysis does. A few runs-along stretches come along.
  const fenceById = new Map(fences.map((fence, index) => [fenceIds[index]!, { ...fence, lengthM: fenceRows[index]!.length_m }]));
  const { chosen, runsAlong, searched } = await timed('find crossings', () => {
    const index = buildDrainageIndex(
      drainage.map((segment, k) => ({
        id: drainageIds[k]!,
        coordinates: drainageWgs84[k]!,
        streamOrder: segment.order,
        upstreamAreaStartM2: segment.upstreamAreaStartM2,
        upstreamAreaEndM2: segment.upstreamAreaEndM2,
      })),
    );
    const alongWanted = 10;
    const picked: Crossing[] = [];
    const along: RunsAlong[] = [];
    let fencesSearched = 0;
    for (const fenceId of shuffled(fenceIds, random)) {
      if (picked.length + along.length >= BENCH_PROPERTY.crossings) break;
      const fence = fenceById.get(fenceId)!;
      if (fence.status === 'retired') continue;
      fencesSearched += 1;
      const found = findCrossings([{ id: fenceId, coordinates: fence.wgs84 }], index, { goodWithinDeg: DEFAULT_DESIGN_SETTINGS.goodWithinDeg, fairWithinDeg: DEFAULT_DESIGN_SETTINGS.fairWithinDeg });
      if (along.length < alongWanted && found.runsAlong.length) along.push(found.runsAlong[0]!);
      else if (found.crossings.length && picked.length < BENCH_PROPERTY.crossings - alongWanted) picked.push(found.crossings[Math.floor(random() * found.crossings.length)]!);
    }
    return { chosen: picked, runsAlong: along, searched: fencesSearched };
  });
  const slopeOf = new Map(drainage.map((segment, index) => [drainageIds[index]!, segment.meanSlope]));
  const statuses: Record<string, number> = {};
  const crossingRows: Record<string, unknown>[] = await timed('design crossings', () =>
    chosen.map((crossing) => {
      const design = crossing.kind === 'crossing' ? designAt(crossing, fenceById.get(Number(crossing.fenceId))!, slopeOf.get(Number(crossing.drainageId)) ?? 0.002, random, ifd) : null;
      const status = design?.status ?? 'touch';
      statuses[status] = (statuses[status] ?? 0) + 1;
      return crossingRow({ propertyId: property.id, crossing, design, inputs: {}, computedAt: now });
    }),
  );
  for (const along of runsAlong) {
    const at = fenceById.get(Number(along.fenceId))!.wgs84[0]!;
    statuses['runs-along'] = (statuses['runs-along'] ?? 0) + 1;
    crossingRows.push(runsAlongRow({ propertyId: property.id, fenceLineId: Number(along.fenceId), drainageLineId: Number(along.drainageId), at: [at[0]!, at[1]!], along, computedAt: now }));
  }
  await timed('store crossings', () => db().transaction((trx) => trx.batchInsert('crossings', crossingRows, 50)));

  return {
    propertyId: property.id,
    counts: {
      fenceLines: fences.length,
      fenceVertices: fences.reduce((n, fence) => n + fence.wgs84.length, 0),
      fenceKm: fenceRows.reduce((sum, row) => sum + row.length_m, 0) / 1000,
      drainageSegments: drainage.length,
      drainageVertices: drainage.reduce((n, segment) => n + segment.coordinates.length, 0),
      crossings: crossingRows.length,
      fencesSearchedForCrossings: searched,
    },
    designStatuses: statuses,
    timesMs: times,
    close: closeDb,
  };
}

/**
 * The design the analysis would store for a crossing, over an invented channel (a trapezoid,
 * deeper for a higher stream order, on a gently sloping plain) sampled every metre along the
 * fence. Three in four have their catchment figures; the rest lack them and need a flood mark.
 */
function designAt(
  crossing: Crossing,
  fence: GeneratedFence & { lengthM: number },
  channelSlope: number,
  random: UniformSource,
  ifd: { aepPercent: number[]; durationsMin: number[]; intensitiesMmH: number[][] },
) {
  const cumulativeM = [0];
  for (let k = 1; k < fence.wgs84.length; k++) cumulativeM.push(cumulativeM[k - 1]! + lineLengthM([fence.wgs84[k - 1]!, fence.wgs84[k]!]));
  const halfWidthM = DEFAULT_DESIGN_SETTINGS.profileHalfWidthM + 5;
  const order = crossing.streamOrder ?? 1;
  const depthM = 0.4 + 0.4 * order;
  const bedHalfM = 1 + order;
  const sinAngle = Math.sin((crossing.crossingAngleDeg * Math.PI) / 180);
  const samples: { chainageM: number; position: [number, number]; elevationM: number }[] = [];
  for (let chainageM = Math.max(0, Math.ceil(crossing.fenceChainageM - halfWidthM)); chainageM <= Math.min(fence.lengthM, crossing.fenceChainageM + halfWidthM); chainageM++) {
    const offset = Math.abs(chainageM - crossing.fenceChainageM) * sinAngle;
    const elevationM =
      offset <= bedHalfM ? 100 : offset <= bedHalfM + 2 * depthM ? 100 + (offset - bedHalfM) / 2 : 100 + depthM + (offset - bedHalfM - 2 * depthM) * 0.004;
    samples.push({ chainageM, position: pointAtChainage(fence.wgs84, cumulativeM, chainageM), elevationM: Math.round(elevationM * 1000) / 1000 });
  }
  const areaKm2 = Math.max(0.05, (crossing.upstreamAreaM2 ?? 50_000) / 1e6);
  const catchment = random() < 0.75 ? { areaKm2, mainStreamLengthKm: 1.5 * Math.sqrt(areaKm2), equalAreaSlopeMPerKm: 1 + random() * 4 } : null;
  // As the analysis does: the crossing sits at the profile sample nearest to it.
  const nearest = samples.reduce((best, s) => (Math.abs(s.chainageM - crossing.fenceChainageM) < Math.abs(best.chainageM - crossing.fenceChainageM) ? s : best));
  const design = designCrossing({
    profile: samples.map(({ chainageM, elevationM }) => ({ chainageM, elevationM })),
    crossingChainageM: nearest.chainageM,
    crossingAngleDeg: crossing.crossingAngleDeg,
    channelSlope,
    catchment,
    ifd,
    fence: wireSpecSchema.parse({}),
    inputs: {},
    settings: DEFAULT_DESIGN_SETTINGS,
  });
  return {
    ...design,
    profile: samples.map(({ chainageM, elevationM }) => ({ chainageM, elevationM })),
    positions: design.status === 'designed' ? positionsOfLayout(design.layout, samples) : undefined,
    catchment: catchment && {
      areaHa: catchment.areaKm2 * 100,
      longestFlowPathM: catchment.mainStreamLengthKm * 1000,
      equalAreaSlopeMPerKm: catchment.equalAreaSlopeMPerKm,
      outlet: crossing.position,
    },
  };
}
