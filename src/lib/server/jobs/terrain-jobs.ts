import type { Worker } from 'node:worker_threads';
import { analyseCrossings } from '../crossings/analyse-crossings';
import { db } from '../db';
import { getConfig } from '../config';
import { recordAudit } from '../repos/audit-log';
import { replaceDrainageLines } from '../repos/drainage-lines';
import { forgetDrainageTiles, prepareDrainageTiles } from '../terrain/drainage-tiles';
import { findRunById, getElevationModelFile, listRunsWithStatus, updateRunProgress, updateTerrainRun } from '../repos/terrain';
import { dataPath, removeQuietly, terrainRunFolder } from '../storage';
import type { TerrainRunInput } from '../terrain/run-terrain';
import { startWorker } from './start-worker';
import type { WorkerMessage } from './terrain-worker';

/**
 * Terrain runs as persisted jobs: one at a time in a worker thread (the machine's other core keeps
 * answering requests), stage and percent written to `terrain_runs` as they change.
 */
const queue: number[] = [];
let active: { runId: number; worker: Worker } | undefined;
// Set from the moment a run is taken from the queue, so two callers never start two workers.
let starting = false;

/** Adds a queued run to the line and starts it when the worker is free. */
export function enqueueTerrainRun(runId: number): void {
  if (!queue.includes(runId) && active?.runId !== runId) queue.push(runId);
  void startNext();
}

/** Stops a queued or running run. @returns whether it was waiting or running here */
export async function cancelTerrainRun(runId: number): Promise<boolean> {
  const waiting = queue.indexOf(runId);
  if (waiting >= 0) queue.splice(waiting, 1);
  const running = active?.runId === runId;
  if (running) await active!.worker.terminate();
  await updateTerrainRun(runId, { status: 'cancelled', message: 'Cancelled.', finishedAt: new Date().toISOString() });
  await removeQuietly(dataPath(terrainRunFolder(runId)));
  return waiting >= 0 || running;
}

/**
 * After a restart: a run that was working cannot be resumed mid-stage, so it is marked failed
 * with the reason; queued runs are put back in line.
 */
export async function recoverTerrainRuns(): Promise<void> {
  const interrupted = await listRunsWithStatus(['running']);
  for (const run of interrupted) {
    await updateTerrainRun(run.id, {
      status: 'failed',
      message: 'The server restarted while this run was working. Start it again.',
      finishedAt: new Date().toISOString(),
    });
    // Half-written products of the interrupted run are never read.
    await removeQuietly(dataPath(terrainRunFolder(run.id)));
  }
  await pickUpQueuedRuns();
  // Runs queued by another process (the demo seed, a second server) are picked up within seconds.
  setInterval(() => void pickUpQueuedRuns().catch(() => undefined), 10_000).unref();
}

async function pickUpQueuedRuns(): Promise<void> {
  for (const run of await listRunsWithStatus(['queued'])) enqueueTerrainRun(run.id);
}

/** Waits until no run is queued or running in this process (tests and the CLI). */
export async function whenTerrainIdle(): Promise<void> {
  while (active || starting || queue.length > 0) await new Promise((resolve) => setTimeout(resolve, 50));
}

async function startNext(): Promise<void> {
  if (active || starting) return;
  const runId = queue.shift();
  if (runId === undefined) return;
  starting = true;
  try {
    await startRun(runId);
  } catch (error) {
    console.error(`[gullyline] terrain run ${runId} could not start:`, error);
    await recordFailure(runId, 'The terrain run could not start. Try again; if it fails again, tell us.').catch(() => undefined);
  } finally {
    starting = false;
  }
  if (!active) void startNext();
}

async function startRun(runId: number): Promise<void> {
  const run = await findRunById(runId);
  if (!run || run.status !== 'queued') return;
  const model = await getElevationModelFile(run.propertyId, run.elevationModelId);
  const input: TerrainRunInput = {
    file: dataPath(model.storedFile),
    outDir: dataPath(terrainRunFolder(run.id)),
    thresholdHa: run.thresholdHa,
    assumeCrs: model.crs,
    maxCells: getConfig().maxRasterCells,
  };
  await updateTerrainRun(runId, { status: 'running', stage: 'read', percent: 0, startedAt: new Date().toISOString() });
  const worker = createTerrainWorker(input);
  active = { runId, worker };
  let settled = false;
  const finish = async (work: () => Promise<void>) => {
    if (settled) return;
    settled = true;
    try {
      await work();
    } catch (error) {
      console.error(`[gullyline] terrain run ${runId} could not be recorded:`, error);
    } finally {
      active = undefined;
      void startNext();
    }
  };
  worker.on('message', (message: WorkerMessage) => {
    if (message.type === 'progress') {
      void updateRunProgress(runId, message.stage, message.percent).catch(() => undefined);
    } else if (message.type === 'done') {
      void finish(async () => {
        await recordSuccess(run.propertyId, runId, run.elevationModelId, message.summary);
        // New drainage lines: find and design the property's crossings again.
        await analyseCrossings(run.propertyId).catch((error: unknown) => console.error(`[gullyline] crossings after terrain run ${runId}:`, error));
        void prepareDrainageTiles(runId).catch((error: unknown) => console.error(`[gullyline] drainage tiles of terrain run ${runId}:`, error));
      });
      void worker.terminate();
    } else {
      if (!message.expected) console.error(`[gullyline] terrain run ${runId} failed:`, message.message);
      const shown = message.expected ? message.message : 'The terrain run failed on our side. Try again; if it fails again, tell us.';
      void finish(() => recordFailure(runId, shown));
      void worker.terminate();
    }
  });
  worker.on('error', (error) => {
    console.error(`[gullyline] terrain worker for run ${runId} stopped:`, error);
    void finish(() => recordFailure(runId, 'The terrain run stopped unexpectedly (out of memory?). Try again with a smaller model.'));
  });
  worker.on('exit', () => {
    // A terminate() from cancel: the cancel has already recorded the outcome.
    void finish(async () => undefined);
  });
}

async function recordSuccess(propertyId: number, runId: number, elevationModelId: number, summary: Extract<WorkerMessage, { type: 'done' }>['summary']): Promise<void> {
  const replacedRuns = await db().transaction(async (trx) => {
    const current = await findRunById(runId, trx);
    if (current?.status !== 'running') return []; // cancelled meanwhile
    const earlier = await replaceDrainageLines(trx, { propertyId, runId, elevationModelId, segments: summary.drainage, wgs84: summary.drainageWgs84 });
    await updateTerrainRun(
      runId,
      {
        status: 'succeeded',
        stage: null,
        percent: 100,
        message: null,
        finishedAt: new Date().toISOString(),
        summary: {
          cornersWgs84: summary.cornersWgs84,
          boundsWgs84: summary.boundsWgs84,
          contourIntervalM: summary.contourIntervalM,
          minElevationM: summary.minElevationM,
          maxElevationM: summary.maxElevationM,
          drainageLineCount: summary.drainage.length,
          stageTimesMs: summary.stageTimesMs as Record<string, number>,
        },
      },
      trx,
    );
    const [w, s, e, n] = summary.boundsWgs84;
    // A property without an extent takes its first model's.
    await trx('properties').where({ id: propertyId }).whereNull('extent_west').update({ extent_west: w, extent_south: s, extent_east: e, extent_north: n });
    await recordAudit({ propertyId, action: 'terrain_run.succeed', entityType: 'terrain_run', entityId: runId, detail: { drainageLines: summary.drainage.length } }, trx);
    return earlier;
  });
  // Once committed: the earlier runs' lines are gone, and so are their tiles.
  forgetDrainageTiles(replacedRuns);
}

async function recordFailure(runId: number, message: string): Promise<void> {
  await updateTerrainRun(runId, { status: 'failed', message, finishedAt: new Date().toISOString() });
  await removeQuietly(dataPath(terrainRunFolder(runId)));
}

/**
 * Starts a terrain worker: the bundle `npm run build` writes beside the server, or, running from
 * source (vitest, dev, benchmarks), the TypeScript module loaded through tsx's loader.
 */
export function createTerrainWorker(input: TerrainRunInput): Worker {
  return startWorker('terrain-worker', input);
}
