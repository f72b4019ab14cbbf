import type { Knex } from 'knex';
import type { ElevationModelView, TerrainRun, TerrainRunStatus, TerrainRunSummaryView } from '../../schemas/terrain';
import { TERRAIN_STAGES } from '../terrain/run-terrain';
import { db } from '../db';
import { NotFoundError } from '../http';

type ModelRow = {
  id: number;
  property_id: number;
  name: string;
  stored_file: string;
  size_bytes: number;
  crs: string;
  crs_name: string;
  width: number;
  height: number;
  cell_size_m: number;
  extent_west: number;
  extent_south: number;
  extent_east: number;
  extent_north: number;
  created_at: string;
};

type RunRow = {
  id: number;
  property_id: number;
  elevation_model_id: number;
  status: TerrainRunStatus;
  stage: string | null;
  percent: number;
  message: string | null;
  threshold_ha: number;
  summary: string | null;
  created_at: string;
  started_at: string | null;
  finished_at: string | null;
};

export function rowToRun(row: RunRow): TerrainRun {
  return {
    id: row.id,
    elevationModelId: row.elevation_model_id,
    status: row.status,
    stage: row.stage,
    stageLabel: TERRAIN_STAGES.find((s) => s.stage === row.stage)?.label ?? null,
    percent: row.percent,
    message: row.message,
    thresholdHa: row.threshold_ha,
    createdAt: row.created_at,
    startedAt: row.started_at,
    finishedAt: row.finished_at,
    summary: row.summary ? (JSON.parse(row.summary) as TerrainRunSummaryView) : null,
  };
}

function rowToModel(row: ModelRow, latestRun: TerrainRun | null, currentRun: TerrainRun | null): ElevationModelView {
  return {
    id: row.id,
    name: row.name,
    sizeBytes: row.size_bytes,
    crs: row.crs,
    crsName: row.crs_name,
    width: row.width,
    height: row.height,
    cellSizeM: row.cell_size_m,
    boundsWgs84: [row.extent_west, row.extent_south, row.extent_east, row.extent_north],
    createdAt: row.created_at,
    latestRun,
    currentRun,
  };
}

export type NewElevationModel = {
  propertyId: number;
  name: string;
  storedFile: string;
  sizeBytes: number;
  crs: string;
  crsName: string;
  width: number;
  height: number;
  cellSizeM: number;
  boundsWgs84: [number, number, number, number];
  uploadedBy: number;
};

export async function insertElevationModel(input: NewElevationModel, trx: Knex): Promise<number> {
  const [w, s, e, n] = input.boundsWgs84;
  const [row] = await trx('elevation_models')
    .insert({
      property_id: input.propertyId,
      name: input.name,
      stored_file: input.storedFile,
      size_bytes: input.sizeBytes,
      crs: input.crs,
      crs_name: input.crsName,
      width: input.width,
      height: input.height,
      cell_size_m: input.cellSizeM,
      extent_west: w,
      extent_south: s,
      extent_east: e,
      extent_north: n,
      uploaded_by: input.uploadedBy,
      created_at: new Date().toISOString(),
    })
    .returning('id');
  return (row as { id: number }).id;
}

/** The stored file of an elevation model of the property. @throws NotFoundError */
export async function getElevationModelFile(propertyId: number, modelId: number, trx: Knex = db()): Promise<{ storedFile: string; crs: string }> {
  const row = await trx<ModelRow>('elevation_models').where({ id: modelId, property_id: propertyId }).first();
  if (!row) throw new NotFoundError('elevation model');
  return { storedFile: row.stored_file, crs: row.crs };
}

export async function listElevationModels(propertyId: number, trx: Knex = db()): Promise<ElevationModelView[]> {
  const models = await trx<ModelRow>('elevation_models').where({ property_id: propertyId }).orderBy('id', 'desc');
  const runs = await trx<RunRow>('terrain_runs').where({ property_id: propertyId }).orderBy('id', 'desc');
  return models.map((model) => {
    const latest = runs.find((run) => run.elevation_model_id === model.id);
    const current = runs.find((run) => run.elevation_model_id === model.id && run.status === 'succeeded');
    return rowToModel(model, latest ? rowToRun(latest) : null, current ? rowToRun(current) : null);
  });
}

export async function insertTerrainRun(
  input: { propertyId: number; elevationModelId: number; thresholdHa: number; createdBy: number },
  trx: Knex = db(),
): Promise<TerrainRun> {
  const [row] = await trx<RunRow>('terrain_runs')
    .insert({
      property_id: input.propertyId,
      elevation_model_id: input.elevationModelId,
      status: 'queued',
      percent: 0,
      threshold_ha: input.thresholdHa,
      created_by: input.createdBy,
      created_at: new Date().toISOString(),
    } as Partial<RunRow>)
    .returning('*');
  return rowToRun(row as RunRow);
}

/** One run of the property. @throws NotFoundError (also for another property's run) */
export async function getTerrainRun(propertyId: number, runId: number, trx: Knex = db()): Promise<TerrainRun> {
  const row = await trx<RunRow>('terrain_runs').where({ id: runId, property_id: propertyId }).first();
  if (!row) throw new NotFoundError('terrain run');
  return rowToRun(row);
}

export async function findRunById(runId: number, trx: Knex = db()): Promise<(TerrainRun & { propertyId: number }) | undefined> {
  const row = await trx<RunRow>('terrain_runs').where({ id: runId }).first();
  return row && { ...rowToRun(row), propertyId: row.property_id };
}

export async function updateTerrainRun(
  runId: number,
  changes: Partial<{ status: TerrainRunStatus; stage: string | null; percent: number; message: string | null; summary: TerrainRunSummaryView; startedAt: string; finishedAt: string }>,
  trx: Knex = db(),
): Promise<void> {
  const row: Record<string, unknown> = {};
  if (changes.status !== undefined) row.status = changes.status;
  if (changes.stage !== undefined) row.stage = changes.stage;
  if (changes.percent !== undefined) row.percent = changes.percent;
  if (changes.message !== undefined) row.message = changes.message;
  if (changes.summary !== undefined) row.summary = JSON.stringify(changes.summary);
  if (changes.startedAt !== undefined) row.started_at = changes.startedAt;
  if (changes.finishedAt !== undefined) row.finished_at = changes.finishedAt;
  await trx('terrain_runs').where({ id: runId }).update(row);
}

export async function listRunsWithStatus(statuses: TerrainRunStatus[], trx: Knex = db()): Promise<(TerrainRun & { propertyId: number })[]> {
  const rows = await trx<RunRow>('terrain_runs').whereIn('status', statuses).orderBy('id');
  return rows.map((row) => ({ ...rowToRun(row), propertyId: row.property_id }));
}

/** Progress of a running run; ignored once the run has finished or been cancelled. */
export async function updateRunProgress(runId: number, stage: string, percent: number, trx: Knex = db()): Promise<void> {
  await trx('terrain_runs').where({ id: runId, status: 'running' }).update({ stage, percent });
}
