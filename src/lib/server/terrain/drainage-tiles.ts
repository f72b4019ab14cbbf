import { DRAINAGE_ORDER_STEPS, minStreamOrderAt } from '../../geo/drainage-tile-rules';
import { createDrainageTiles, TILE_ZOOM_LIMIT, type DrainageTiles } from '../../geo/drainage-tiles';
import { db } from '../db';
import { BadRequestError, NotFoundError } from '../http';
import { getTerrainRun } from '../repos/terrain';

/**
 * Tile sets kept in memory, by terrain run id and smallest stream order, newest use last. A run's
 * lines never change once it has succeeded (a newer run replaces them under a new id), so a set is
 * built once. Each order step has its own set: a first look at a whole station cuts only its
 * bigger channels, a third of the lines. A few runs' worth covers the properties open at once.
 */
const MAX_CACHED_RUNS = 4;
const MAX_CACHED = MAX_CACHED_RUNS * DRAINAGE_ORDER_STEPS.length;
const cache = new Map<string, Promise<DrainageTiles>>();
const keyOf = (runId: number, minOrder: number) => `${runId}/${minOrder}`;

/** The tile numbers of a request, checked. @throws BadRequestError naming what is wrong */
export function parseTileCoords(params: { z?: string; x?: string; y?: string }): { z: number; x: number; y: number } {
  const [z, x, y] = [params.z, params.x, params.y].map((value) => (value && /^\d{1,8}$/.test(value) ? Number(value) : NaN)) as [number, number, number];
  if (!Number.isInteger(z) || z > TILE_ZOOM_LIMIT) throw new BadRequestError(`Give the tile zoom as a whole number from 0 to ${TILE_ZOOM_LIMIT}.`);
  const last = 2 ** z - 1;
  if (!Number.isInteger(x) || !Number.isInteger(y) || x > last || y > last) {
    throw new BadRequestError(`At zoom ${z}, give tile x and y as whole numbers from 0 to ${last}.`);
  }
  return { z, x, y };
}

async function loadTiles(runId: number, minOrder: number): Promise<DrainageTiles> {
  const rows = await db()<{ id: number; terrain_run_id: number; stream_order: number; geometry: string }>('drainage_lines')
    .where({ terrain_run_id: runId })
    .where('stream_order', '>=', minOrder)
    .orderBy('id')
    .select('id', 'stream_order', 'geometry');
  return createDrainageTiles(
    rows.map((row) => ({ id: row.id, streamOrder: row.stream_order, coordinates: (JSON.parse(row.geometry) as { coordinates: [number, number][] }).coordinates })),
  );
}

function tilesOf(runId: number, minOrder: number): Promise<DrainageTiles> {
  const key = keyOf(runId, minOrder);
  let tiles = cache.get(key);
  if (tiles) {
    cache.delete(key);
  } else {
    tiles = loadTiles(runId, minOrder);
    // A failed build is not kept: the next request tries again.
    tiles.catch(() => cache.get(key) === tiles && cache.delete(key));
  }
  cache.set(key, tiles);
  while (cache.size > MAX_CACHED) cache.delete(cache.keys().next().value!);
  return tiles;
}

/**
 * One vector tile of a finished terrain run's drainage lines, or null when none crosses it.
 * @throws NotFoundError when the run is not the property's or has not succeeded
 */
export async function drainageTile(propertyId: number, runId: number, coords: { z: number; x: number; y: number }): Promise<Uint8Array | null> {
  const run = await getTerrainRun(propertyId, runId);
  if (run.status !== 'succeeded') throw new NotFoundError('terrain run', 'This terrain run has not finished, so it has no drainage lines yet.');
  return (await tilesOf(runId, minStreamOrderAt(coords.z))).tile(coords.z, coords.x, coords.y);
}

/**
 * Cuts a newly finished run's tiles for the first view of the whole property (its bigger
 * channels), so the first person to open the map after the run does not wait for them.
 */
export async function prepareDrainageTiles(runId: number): Promise<void> {
  await tilesOf(runId, DRAINAGE_ORDER_STEPS[0]!.minOrder);
}

/** Drops the cached tiles of runs whose drainage lines were replaced or deleted. */
export function forgetDrainageTiles(runIds: readonly number[]): void {
  for (const runId of runIds) for (const step of DRAINAGE_ORDER_STEPS) cache.delete(keyOf(runId, step.minOrder));
}
