import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../../lib/server/auth';
import { parseId } from '../../../../../../lib/server/http';
import { deleteTrack } from '../../../../../../lib/server/repos/tracks';

/** Removes an imported track (fence lines made from it stay). */
export const DELETE: APIRoute = async ({ locals, params }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  await deleteTrack(propertyId, parseId(params.trackId, 'track'), user.id);
  return new Response(null, { status: 204 });
};
