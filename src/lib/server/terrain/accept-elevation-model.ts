import path from 'node:path';
import { createToWgs84 } from '../../geo/reproject';
import type { ElevationModelView, TerrainRun } from '../../schemas/terrain';
import { getConfig } from '../config';
import { db } from '../db';
import { ElevationModelError } from '../elevation/elevation-model-error';
import { inspectElevationModel } from '../elevation/read-elevation-model';
import { ValidationError } from '../http';
import { enqueueTerrainRun } from '../jobs/terrain-jobs';
import { recordAudit } from '../repos/audit-log';
import { insertElevationModel, insertTerrainRun, listElevationModels } from '../repos/terrain';
import { dataPath, moveInto, receiveUpload, removeQuietly } from '../storage';
import { DEFAULT_THRESHOLD_HA } from './run-terrain';

export type AcceptedElevationModel = { elevationModel: ElevationModelView; run: TerrainRun; warnings: string[] };

/**
 * Takes an uploaded elevation model: stores the file, checks its header (a usable single-band
 * GeoTIFF with a CRS, within the size limit), records it and queues a terrain run over it.
 * A file that cannot be used is refused with the reason, and nothing is kept.
 *
 * @throws ElevationModelError (422), ValidationError (422, missing CRS), PayloadTooLargeError (413)
 */
export async function acceptElevationModel(input: {
  propertyId: number;
  userId: number;
  name: string;
  crs?: string;
  thresholdHa?: number;
  body: ReadableStream<Uint8Array> | null;
  declaredBytes: number;
}): Promise<AcceptedElevationModel> {
  const { tempFile, sizeBytes } = await receiveUpload(input.body, input.declaredBytes);
  const accepted = await registerElevationModel({ ...input, tempFile, sizeBytes });
  enqueueTerrainRun(accepted.run.id);
  return accepted;
}

/**
 * Records an elevation model file already on disk (moved into the data folder) with a queued
 * terrain run. The caller starts the run (the server), or leaves it queued for the server to pick
 * up when it starts (the demo seed). The file is removed when it cannot be used.
 */
export async function registerElevationModel(input: {
  propertyId: number;
  userId: number;
  name: string;
  crs?: string;
  thresholdHa?: number;
  tempFile: string;
  sizeBytes: number;
}): Promise<AcceptedElevationModel> {
  const { tempFile, sizeBytes } = input;
  let storedFile: string | undefined;
  try {
    const header = await inspectElevationModel(tempFile, { maxCells: getConfig().maxRasterCells, assumeCrs: input.crs });
    if (!header.crs) {
      throw new ValidationError(
        { crs: 'This file does not say which coordinate system it uses. Give its EPSG code (for example EPSG:7854 for GDA2020 / MGA zone 54) and upload it again.' },
        'The elevation model has no coordinate system.',
      );
    }
    const crs = header.crs;
    const toWgs84 = createToWgs84(crs.proj4);
    const { minX, minY, maxX, maxY } = header.extent;
    const corners = ([[minX, maxY], [maxX, maxY], [maxX, minY], [minX, minY]] as [number, number][]).map(toWgs84);
    const bounds: [number, number, number, number] = [
      Math.min(...corners.map(([lon]) => lon)),
      Math.min(...corners.map(([, lat]) => lat)),
      Math.max(...corners.map(([lon]) => lon)),
      Math.max(...corners.map(([, lat]) => lat)),
    ];
    if (!bounds.every(Number.isFinite) || bounds[1] < -90 || bounds[3] > 90) {
      throw new ElevationModelError('unsupported-crs', `The model's position does not make sense in ${crs.code}. Check that the file's coordinate system is right.`);
    }
    const warnings = await overlapWarnings(input.propertyId, bounds);
    const thresholdHa = input.thresholdHa ?? DEFAULT_THRESHOLD_HA;

    const { modelId, run } = await db().transaction(async (trx) => {
      const id = await insertElevationModel(
        {
          propertyId: input.propertyId,
          name: path.basename(input.name).replace(/[^\w.\- ()]/g, '_'),
          storedFile: 'pending',
          sizeBytes,
          crs: crs.code,
          crsName: crs.name,
          width: header.width,
          height: header.height,
          cellSizeM: header.cellSizeM?.westEastM ?? 0,
          boundsWgs84: bounds,
          uploadedBy: input.userId,
        },
        trx,
      );
      storedFile = `elevation-models/${id}/source.tif`;
      await moveInto(tempFile, storedFile);
      await trx('elevation_models').where({ id }).update({ stored_file: storedFile });
      const queued = await insertTerrainRun({ propertyId: input.propertyId, elevationModelId: id, thresholdHa, createdBy: input.userId }, trx);
      await recordAudit(
        { propertyId: input.propertyId, userId: input.userId, action: 'elevation_model.upload', entityType: 'elevation_model', entityId: id, detail: { name: input.name, crs: crs.code, sizeBytes } },
        trx,
      );
      return { modelId: id, run: queued };
    });
    const elevationModel = (await listElevationModels(input.propertyId)).find((model) => model.id === modelId)!;
    return { elevationModel, run, warnings };
  } catch (error) {
    await removeQuietly(tempFile);
    if (storedFile) await removeQuietly(path.dirname(dataPath(storedFile)));
    throw error;
  }
}

async function overlapWarnings(propertyId: number, [w, s, e, n]: [number, number, number, number]): Promise<string[]> {
  const property = await db()('properties').where({ id: propertyId }).first('extent_west', 'extent_south', 'extent_east', 'extent_north');
  if (property?.extent_west == null) return [];
  const overlaps = w < property.extent_east && e > property.extent_west && s < property.extent_north && n > property.extent_south;
  return overlaps
    ? []
    : ['This elevation model does not overlap the property: it lies elsewhere on the map. Check that it is the right file and coordinate system.'];
}
