import type { APIRoute } from 'astro';
import { paddockUpdateSchema } from '../../../../../lib/schemas/paddock';
import { requireRole } from '../../../../../lib/server/auth';
import { parseId, parseWith, readJson } from '../../../../../lib/server/http';
import { deleteVersionQuerySchema } from '../../../../../lib/schemas/queries';
import { deletePaddock, getPaddock, updatePaddock } from '../../../../../lib/server/repos/paddocks';

export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return Response.json({ paddock: await getPaddock(propertyId, parseId(params.paddockId, 'paddock')) });
};

/** Renames a paddock or redraws its boundary; send the `version` you read (409 when someone changed it meanwhile). */
export const PATCH: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const changes = await readJson(request, paddockUpdateSchema);
  return Response.json({ paddock: await updatePaddock(propertyId, parseId(params.paddockId, 'paddock'), changes, user.id) });
};

/** Deletes the paddock; `?version=` (the one you read) refuses it with 409 when someone changed it meanwhile. */
export const DELETE: APIRoute = async ({ locals, params, url }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const { version } = parseWith(deleteVersionQuerySchema, Object.fromEntries(url.searchParams));
  await deletePaddock(propertyId, parseId(params.paddockId, 'paddock'), user.id, version);
  return new Response(null, { status: 204 });
};
