import { ImportError } from '../geo/import-lines';
import { importPlan, type ImportedPlan } from '../geo/import-plan';
import { analyseCrossings } from './crossings/analyse-crossings';
import { db } from './db';
import { getConfig } from './config';
import { ConflictError, DomainError, readTextWithin, ValidationError } from './http';
import { recordAudit } from './repos/audit-log';
import { checkRoomForFenceLines, createFenceLine } from './repos/fence-lines';
import { createPaddocks } from './repos/paddocks';

/** Largest plan file taken, bytes. */
export const MAX_PLAN_FILE_BYTES = 20 * 1024 * 1024;

const refuse = (message: string) => new DomainError(422, message, { file: message });

/**
 * Imports a Gullyline plan export (GeoJSON or KML, sent as the request body) into a property:
 * its fence lines and paddocks are stored in one transaction with their audit entries, all or
 * nothing, and the new fence lines' crossings are then found and designed. Crossings and layout
 * points in the file are not read; they are worked out again here.
 *
 * @throws DomainError 422 with the reason when the file cannot be used or holds more fence lines
 *   than the property has room for (nothing is stored), 413
 *   past {@link MAX_PLAN_FILE_BYTES}
 */
export async function importPlanFile(propertyId: number, userId: number, fileName: string, request: Request) {
  if (/\.kmz$/i.test(fileName)) throw refuse('KMZ files are zipped KML: unzip it (or export the plan as KML) and upload the .kml file.');
  const text = await readTextWithin(request, MAX_PLAN_FILE_BYTES);
  let plan: ImportedPlan;
  try {
    plan = importPlan(text, { maxFenceVertices: getConfig().maxFenceVertices });
  } catch (error) {
    if (error instanceof ImportError) throw refuse(error.message);
    throw error;
  }
  const stored = await db().transaction(async (trx) => {
    try {
      await checkRoomForFenceLines(propertyId, plan.fenceLines.length, trx);
    } catch (error) {
      if (error instanceof ConflictError) throw refuse(`Nothing was imported: ${error.message}`);
      throw error;
    }
    const fenceLineIds: number[] = [];
    for (const [index, input] of plan.fenceLines.entries()) {
      try {
        fenceLineIds.push((await createFenceLine(propertyId, input, userId, trx)).id);
      } catch (error) {
        // A line that crosses itself passes the file's checks but not the drawing rules.
        if (error instanceof ValidationError) throw refuse(`Nothing was imported: fence line ${index + 1} ("${input.name}") cannot be used as drawn. ${error.fields?.coordinates ?? error.message}`);
        throw error;
      }
    }
    const paddockIds = await createPaddocks(propertyId, plan.paddocks, trx);
    await recordAudit(
      { propertyId, userId, action: 'plan.import', entityType: 'file', entityId: null, detail: { sourceFile: fileName, format: plan.format, fenceLines: fenceLineIds.length, paddocks: paddockIds.length } },
      trx,
    );
    return { fenceLineIds, paddockIds };
  });
  if (stored.fenceLineIds.length) await analyseCrossings(propertyId, stored.fenceLineIds);
  return {
    format: plan.format,
    fenceLines: stored.fenceLineIds.length,
    paddocks: stored.paddockIds.length,
    fenceLineIds: stored.fenceLineIds,
    paddockIds: stored.paddockIds,
    /** Crossings and layout points in the file, worked out again instead of read. */
    derivedSkipped: plan.derived,
    unrecognised: plan.unrecognised,
  };
}
