import type { APIRoute } from 'astro';
import { paddocksFromFencesSchema } from '../../../../../lib/schemas/paddock';
import { requireRole } from '../../../../../lib/server/auth';
import { readOptionalJson } from '../../../../../lib/server/http';
import { createPaddocksFromFences } from '../../../../../lib/server/repos/paddocks';

/**
 * Makes a paddock of every area the fence lines close off and no paddock holds yet:
 * `{ fenceLineIds? }` or no body, by default every fence line that is not retired.
 */
export const POST: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const { fenceLineIds } = await readOptionalJson(request, paddocksFromFencesSchema);
  return Response.json(await createPaddocksFromFences(propertyId, fenceLineIds, user.id), { status: 201 });
};
