import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../lib/server/auth';
import { parseId } from '../../../../../lib/server/http';
import { deleteElevationModel } from '../../../../../lib/server/terrain/terrain-runs';

/** Deletes an elevation model, its terrain runs, drainage lines and files. */
export const DELETE: APIRoute = async ({ locals, params }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  await deleteElevationModel(propertyId, parseId(params.modelId, 'elevation model'), user.id);
  return new Response(null, { status: 204 });
};
