import path from 'node:path';
import { fromFile } from 'geotiff';
import { accumulateFlow, type FlowAccumulation } from '../../terrain/flow-accumulation';
import type { ElevationGrid } from '../../terrain/raster';
import type { GridTransform } from '../../terrain/grid-transform';
import { getConfig } from '../config';
import { readElevationModel, type ElevationModel, type ElevationModelCrs } from '../elevation/read-elevation-model';
import { dataPath, terrainRunFolder } from '../storage';

/** What a finished run keeps on disk for catchment queries, loaded back into memory. */
export type RunRasters = {
  grid: ElevationGrid;
  filled: Float64Array;
  directions: Uint8Array;
  accumulation: FlowAccumulation;
  transform: GridTransform;
  crs: ElevationModelCrs;
};

// Rasters stay in memory within a budget, least recently used dropped first: a 16 M-cell model's
// run rasters take about 300 MB, a 600 × 600 one about 10 MB (so a server with many small
// properties keeps all of theirs, where a count of three made each edit read its run from disk).
const BUDGET_BYTES = 640 * 1024 * 1024;
const cache = new Map<string, { loading: Promise<unknown>; bytes: number }>();

function cached<T extends object>(key: string, load: () => Promise<T>): Promise<T> {
  const hit = cache.get(key);
  if (hit) {
    cache.delete(key);
    cache.set(key, hit);
    return hit.loading as Promise<T>;
  }
  const entry = { loading: load() as Promise<unknown>, bytes: 0 };
  cache.set(key, entry);
  entry.loading.then(
    (value) => {
      entry.bytes = arrayBytes(value as object);
      let total = 0;
      for (const { bytes } of cache.values()) total += bytes;
      // The oldest go first; the one just read stays even when it alone is over the budget.
      for (const [oldKey, old] of cache) {
        if (total <= BUDGET_BYTES || old === entry) break;
        cache.delete(oldKey);
        total -= old.bytes;
      }
    },
    () => cache.get(key) === entry && cache.delete(key),
  );
  return entry.loading as Promise<T>;
}

/** Bytes of the typed arrays a loaded raster holds (two levels down: grid, accumulation). */
function arrayBytes(value: object, depth = 0): number {
  let bytes = 0;
  for (const part of Object.values(value)) {
    if (ArrayBuffer.isView(part)) bytes += part.byteLength;
    else if (part && typeof part === 'object' && depth < 2) bytes += arrayBytes(part as object, depth + 1);
  }
  return bytes;
}

/** The conditioned surface, flow directions and accumulation of a finished run (cached). */
export function loadRunRasters(runId: number, crsCode: string): Promise<RunRasters> {
  return cached(`run:${runId}`, () => readRunRasters(runId, crsCode));
}

/** An uploaded elevation model's own heights (cached), for ground profiles. */
export function loadSourceModel(storedFile: string, crsCode: string): Promise<ElevationModel> {
  return cached(`model:${storedFile}`, () => readElevationModel(dataPath(storedFile), { assumeCrs: crsCode, maxCells: getConfig().maxRasterCells }));
}

async function readRunRasters(runId: number, crsCode: string): Promise<RunRasters> {
  const folder = dataPath(terrainRunFolder(runId));
  const model = await readElevationModel(path.join(folder, 'filled.tif'), { assumeCrs: crsCode, maxCells: getConfig().maxRasterCells });
  const tiff = await fromFile(path.join(folder, 'flowdir.tif'));
  try {
    const image = await tiff.getImage();
    const [band] = (await image.readRasters({ samples: [0] })) as unknown as [Uint8Array];
    const directions = Uint8Array.from(band);
    const { grid } = model;
    return {
      grid,
      filled: Float64Array.from(grid.data),
      directions,
      accumulation: accumulateFlow(directions, grid),
      transform: model.transform,
      crs: model.crs,
    };
  } finally {
    await tiff.close();
  }
}
