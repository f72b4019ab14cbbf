import { removeLeftoverFiles } from './data-cleanup';
import { ensureMigrated } from './db';
import { recoverTerrainRuns } from './jobs/terrain-jobs';
import { startMailWorker } from './mail/outbox';

let ready: Promise<void> | undefined;

/**
 * Once per process, before the first request: migrate, remove files a killed process left behind,
 * then pick up terrain runs a restart interrupted and start the outbox worker.
 */
export function ensureReady(): Promise<void> {
  ready ??= ensureMigrated().then(removeLeftoverFiles).then(recoverTerrainRuns).then(startMailWorker);
  return ready;
}
