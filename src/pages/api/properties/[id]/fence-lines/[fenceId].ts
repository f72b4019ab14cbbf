import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../lib/server/auth';
import { parseId, parseWith, readJson } from '../../../../../lib/server/http';
import { deleteVersionQuerySchema } from '../../../../../lib/schemas/queries';
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

/** Deletes the fence line; `?version=` (the one you read) refuses it with 409 when someone changed it meanwhile. */
export const DELETE: APIRoute = async ({ locals, params, url }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const { version } = parseWith(deleteVersionQuerySchema, Object.fromEntries(url.searchParams));
  await deleteFenceLine(propertyId, parseId(params.fenceId, 'fence line'), user.id, version);
  return new Response(null, { status: 204 });
};
