import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../../lib/server/auth';
import { parseId } from '../../../../../../lib/server/http';
import { stopTerrainRun } from '../../../../../../lib/server/terrain/terrain-runs';

export const POST: APIRoute = async ({ locals, params }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const run = await stopTerrainRun(propertyId, parseId(params.runId, 'terrain run'), user.id);
  return Response.json({ run });
};
