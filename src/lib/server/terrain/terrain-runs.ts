import { readFile } from 'node:fs/promises';
import path from 'node:path';
import type { TerrainRun } from '../../schemas/terrain';
import { analyseCrossings } from '../crossings/analyse-crossings';
import { db } from '../db';
import { ConflictError, NotFoundError } from '../http';
import { cancelTerrainRun, enqueueTerrainRun } from '../jobs/terrain-jobs';
import { recordAudit } from '../repos/audit-log';
import { getElevationModelFile, getTerrainRun, insertTerrainRun } from '../repos/terrain';
import { dataPath, removeQuietly, terrainRunFolder } from '../storage';
import { forgetDrainageTiles } from './drainage-tiles';
import { DEFAULT_THRESHOLD_HA } from './run-terrain';

/** Queues a new terrain run over one of the property's elevation models (a re-run, or a new threshold). */
export async function startTerrainRun(propertyId: number, elevationModelId: number, thresholdHa: number | undefined, userId: number): Promise<TerrainRun> {
  await getElevationModelFile(propertyId, elevationModelId);
  const busy = await db()('terrain_runs').where({ elevation_model_id: elevationModelId }).whereIn('status', ['queued', 'running']).first('id');
  if (busy) throw new ConflictError('A terrain run over this elevation model is already under way. Wait for it, or cancel it first.');
  const run = await db().transaction(async (trx) => {
    const queued = await insertTerrainRun({ propertyId, elevationModelId, thresholdHa: thresholdHa ?? DEFAULT_THRESHOLD_HA, createdBy: userId }, trx);
    await recordAudit({ propertyId, userId, action: 'terrain_run.start', entityType: 'terrain_run', entityId: queued.id, detail: { elevationModelId } }, trx);
    return queued;
  });
  enqueueTerrainRun(run.id);
  return run;
}

/** Cancels a queued or running run. @throws ConflictError when it has already finished */
export async function stopTerrainRun(propertyId: number, runId: number, userId: number): Promise<TerrainRun> {
  const run = await getTerrainRun(propertyId, runId);
  if (run.status !== 'queued' && run.status !== 'running') {
    throw new ConflictError(`This terrain run has already ${run.status === 'succeeded' ? 'finished' : run.status === 'failed' ? 'failed' : 'been cancelled'}.`);
  }
  await cancelTerrainRun(runId);
  await recordAudit({ propertyId, userId, action: 'terrain_run.cancel', entityType: 'terrain_run', entityId: runId });
  return getTerrainRun(propertyId, runId);
}

/**
 * Deletes an elevation model with its runs, drainage lines and files. A run under way over it is
 * cancelled first.
 */
export async function deleteElevationModel(propertyId: number, elevationModelId: number, userId: number): Promise<void> {
  const { storedFile } = await getElevationModelFile(propertyId, elevationModelId);
  const runs = await db()('terrain_runs').where({ elevation_model_id: elevationModelId }).select('id', 'status');
  const [lines] = await db()('drainage_lines').whereIn('terrain_run_id', runs.map((run) => run.id)).count<{ n: number }[]>({ n: '*' });
  for (const run of runs) if (run.status === 'queued' || run.status === 'running') await cancelTerrainRun(run.id);
  await db().transaction(async (trx) => {
    // Runs and drainage lines go with the model (foreign keys cascade).
    await trx('elevation_models').where({ id: elevationModelId, property_id: propertyId }).delete();
    await recordAudit({ propertyId, userId, action: 'elevation_model.delete', entityType: 'elevation_model', entityId: elevationModelId }, trx);
  });
  forgetDrainageTiles(runs.map((run) => run.id));
  await removeQuietly(path.dirname(dataPath(storedFile)));
  for (const run of runs) await removeQuietly(dataPath(terrainRunFolder(run.id)));
  // Its drainage lines are gone: the crossings with them.
  if (Number(lines?.n ?? 0) > 0) await analyseCrossings(propertyId);
}

const RUN_FILES = { 'hillshade.png': 'image/png', 'contours.geojson': 'application/geo+json' } as const;
export type RunFileName = keyof typeof RUN_FILES;

/** A map product of a finished run of the property. @throws NotFoundError */
export async function readRunFile(propertyId: number, runId: number, name: RunFileName): Promise<{ body: Buffer; contentType: string }> {
  const run = await getTerrainRun(propertyId, runId);
  if (run.status !== 'succeeded') throw new NotFoundError('terrain run', 'This terrain run has not finished, so it has no map yet.');
  try {
    const body = await readFile(path.join(dataPath(terrainRunFolder(runId)), name));
    return { body, contentType: RUN_FILES[name] };
  } catch {
    throw new NotFoundError('terrain run', 'This terrain run has lost its map files. Start the run again.');
  }
}
