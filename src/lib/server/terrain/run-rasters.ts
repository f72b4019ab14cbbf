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

// A few rasters at most stay in memory, least recently used dropped first (a 16 M-cell model's
// run rasters take about 300 MB).
const cache = new Map<string, Promise<unknown>>();
const CACHE_SIZE = 3;

function cached<T>(key: string, load: () => Promise<T>): Promise<T> {
  const hit = cache.get(key) as Promise<T> | undefined;
  if (hit) {
    cache.delete(key);
    cache.set(key, hit);
    return hit;
  }
  const loading = load();
  loading.catch(() => cache.delete(key));
  cache.set(key, loading);
  while (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value!);
  return loading;
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
