import type { APIRoute } from 'astro';
import { rerunSchema } from '../../../../../lib/schemas/terrain';
import { requireRole } from '../../../../../lib/server/auth';
import { readJson } from '../../../../../lib/server/http';
import { startTerrainRun } from '../../../../../lib/server/terrain/terrain-runs';

/** Starts a terrain run again over an elevation model (after a failure, or with a new threshold). */
export const POST: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const { elevationModelId, thresholdHa } = await readJson(request, rerunSchema);
  return Response.json({ run: await startTerrainRun(propertyId, elevationModelId, thresholdHa, user.id) }, { status: 201 });
};
