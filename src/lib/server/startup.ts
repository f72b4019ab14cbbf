import { ensureMigrated } from './db';
import { recoverTerrainRuns } from './jobs/terrain-jobs';

let ready: Promise<void> | undefined;

/** Once per process, before the first request: migrate, then pick up terrain runs a restart interrupted. */
export function ensureReady(): Promise<void> {
  ready ??= ensureMigrated().then(recoverTerrainRuns);
  return ready;
}
