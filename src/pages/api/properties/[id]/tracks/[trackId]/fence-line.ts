import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../../lib/server/auth';
import { parseId, parseWith } from '../../../../../../lib/server/http';
import { analyseCrossings } from '../../../../../../lib/server/crossings/analyse-crossings';
import { createFenceLine, serverFenceLineSchemas } from '../../../../../../lib/server/repos/fence-lines';
import { getTrack } from '../../../../../../lib/server/repos/tracks';

/** Turns a track into a planned fence line in one step (the track stays as it was). */
export const POST: APIRoute = async ({ locals, params }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const track = await getTrack(propertyId, parseId(params.trackId, 'track'));
  const input = parseWith(serverFenceLineSchemas().input, { name: track.name.slice(0, 120), coordinates: track.coordinates });
  const fenceLine = await createFenceLine(propertyId, input, user.id);
  await analyseCrossings(propertyId, [fenceLine.id]);
  return Response.json({ fenceLine }, { status: 201 });
};
