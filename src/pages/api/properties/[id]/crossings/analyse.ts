import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../lib/server/auth';
import { analyseCrossings } from '../../../../../lib/server/crossings/analyse-crossings';

/** Finds and designs every crossing of the property again (after settings or the IFD table changed). */
export const POST: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'manager');
  return Response.json({ analysis: await analyseCrossings(propertyId) });
};
