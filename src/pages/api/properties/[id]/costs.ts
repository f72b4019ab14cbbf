import type { APIRoute } from 'astro';
import { requireRole } from '../../../../lib/server/auth';
import { propertyCosts } from '../../../../lib/server/crossings/costs';

/** Materials and cost per fence line (its crossings included) and for the property, from its price list. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return Response.json({ costs: await propertyCosts(propertyId) });
};
