import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../../lib/server/auth';
import { parseId } from '../../../../../../lib/server/http';
import { getTerrainRun } from '../../../../../../lib/server/repos/terrain';

/** A terrain run's status, stage and percent (polled by the progress bar). */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  const run = await getTerrainRun(propertyId, parseId(params.runId, 'terrain run'));
  return Response.json({ run });
};
