import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../lib/server/auth';
import { parseId, readJson } from '../../../../../lib/server/http';
import { analyseCrossings } from '../../../../../lib/server/crossings/analyse-crossings';
import { deleteFenceLine, getFenceLine, serverFenceLineSchemas, updateFenceLine } from '../../../../../lib/server/repos/fence-lines';

export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return Response.json({ fenceLine: await getFenceLine(propertyId, parseId(params.fenceId, 'fence line')) });
};

/** Changes a fence line; send the `version` you read (409 when someone changed it meanwhile). */
export const PATCH: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const changes = await readJson(request, serverFenceLineSchemas().update);
  const fenceLine = await updateFenceLine(propertyId, parseId(params.fenceId, 'fence line'), changes, user.id);
  await analyseCrossings(propertyId, [fenceLine.id]);
  return Response.json({ fenceLine });
};

export const DELETE: APIRoute = async ({ locals, params }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  await deleteFenceLine(propertyId, parseId(params.fenceId, 'fence line'), user.id);
  return new Response(null, { status: 204 });
};
