import { createDrainageTiles, TILE_ZOOM_LIMIT, type DrainageTiles } from '../../geo/drainage-tiles';
import { db } from '../db';
import { BadRequestError, NotFoundError } from '../http';
import { getTerrainRun } from '../repos/terrain';

/**
 * Tile sets kept in memory, by terrain run id, newest use last. A run's lines never change once
 * it has succeeded (a newer run replaces them under a new id), so a set is built once; a few
 * runs' worth covers the properties people have open at once.
 */
const MAX_CACHED_RUNS = 4;
const cache = new Map<number, Promise<DrainageTiles>>();

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

async function loadTiles(runId: number): Promise<DrainageTiles> {
  const rows = await db()<{ id: number; terrain_run_id: number; stream_order: number; geometry: string }>('drainage_lines')
    .where({ terrain_run_id: runId })
    .orderBy('id')
    .select('id', 'stream_order', 'geometry');
  return createDrainageTiles(
    rows.map((row) => ({ id: row.id, streamOrder: row.stream_order, coordinates: (JSON.parse(row.geometry) as { coordinates: [number, number][] }).coordinates })),
  );
}

function tilesOf(runId: number): Promise<DrainageTiles> {
  let tiles = cache.get(runId);
  if (tiles) {
    cache.delete(runId);
  } else {
    tiles = loadTiles(runId);
    // A failed build is not kept: the next request tries again.
    tiles.catch(() => cache.get(runId) === tiles && cache.delete(runId));
  }
  cache.set(runId, tiles);
  while (cache.size > MAX_CACHED_RUNS) cache.delete(cache.keys().next().value!);
  return tiles;
}

/**
 * One vector tile of a finished terrain run's drainage lines, or null when none crosses it.
 * @throws NotFoundError when the run is not the property's or has not succeeded
 */
export async function drainageTile(propertyId: number, runId: number, coords: { z: number; x: number; y: number }): Promise<Uint8Array | null> {
  const run = await getTerrainRun(propertyId, runId);
  if (run.status !== 'succeeded') throw new NotFoundError('terrain run', 'This terrain run has not finished, so it has no drainage lines yet.');
  return (await tilesOf(runId)).tile(coords.z, coords.x, coords.y);
}

/** Drops the cached tiles of runs whose drainage lines were replaced or deleted. */
export function forgetDrainageTiles(runIds: readonly number[]): void {
  for (const runId of runIds) cache.delete(runId);
}
