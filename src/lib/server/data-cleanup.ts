import { readdir } from 'node:fs/promises';
import { db } from './db';
import { photoStore } from './photo-storage';
import { dataPath, removeQuietly } from './storage';

/**
 * On start, before any request: files a killed process left behind are removed, so every file
 * under the data folder belongs to a row. Uploads still in `uploads/incoming/` were never
 * accepted; a model folder without its row was moved in by a transaction that never committed;
 * a run folder without a run, or of a run that failed or was cancelled, holds no product the app
 * reads. Runs still marked running are not touched here (recovery marks them failed and removes
 * their folders). Photos (in the data folder or an S3 bucket) that no row names were stored by an
 * upload killed before its row was committed.
 * @returns how many files, folders or photos were removed
 */
export async function removeLeftoverFiles(): Promise<number> {
  let removed = 0;
  const drop = async (relative: string) => {
    await removeQuietly(dataPath(relative));
    removed += 1;
  };
  for (const name of await entries('uploads/incoming')) await drop(`uploads/incoming/${name}`);

  const models = new Set((await db()('elevation_models').pluck('id')).map(String));
  for (const name of await entries('elevation-models')) if (!models.has(name)) await drop(`elevation-models/${name}`);

  const runs = new Map<string, string>((await db()('terrain_runs').select('id', 'status')).map((row: { id: number; status: string }) => [String(row.id), row.status]));
  for (const name of await entries('terrain-runs')) {
    const status = runs.get(name);
    if (status === undefined || status === 'failed' || status === 'cancelled') await drop(`terrain-runs/${name}`);
  }

  const store = photoStore();
  const owned = new Set((await db()('inspection_photos').select('storage_key', 'thumbnail_key')).flatMap((row: { storage_key: string; thumbnail_key: string }) => [row.storage_key, row.thumbnail_key]));
  try {
    for (const key of await store.keys()) {
      if (owned.has(key)) continue;
      await store.remove(key);
      removed += 1;
    }
  } catch (error) {
    // An unreachable bucket must not stop the server: the next start tries again.
    console.error(`[gullyline] could not look for leftover photos (${store.kind}):`, error);
  }
  return removed;
}

async function entries(relative: string): Promise<string[]> {
  try {
    return await readdir(dataPath(relative));
  } catch {
    return [];
  }
}
