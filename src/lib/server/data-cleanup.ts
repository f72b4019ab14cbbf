import { readdir } from 'node:fs/promises';
import { db } from './db';
import { dataPath, removeQuietly } from './storage';

/**
 * On start, before any request: files a killed process left behind are removed, so every file
 * under the data folder belongs to a row. Uploads still in `uploads/incoming/` were never
 * accepted; a model folder without its row was moved in by a transaction that never committed;
 * a run folder without a run, or of a run that failed or was cancelled, holds no product the app
 * reads. Runs still marked running are not touched here (recovery marks them failed and removes
 * their folders).
 * @returns how many files or folders were removed
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
  return removed;
}

async function entries(relative: string): Promise<string[]> {
  try {
    return await readdir(dataPath(relative));
  } catch {
    return [];
  }
}
