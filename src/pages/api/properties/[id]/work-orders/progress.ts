import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../lib/server/auth';
import { propertyProgress } from '../../../../../lib/server/repos/work-orders';

/** Progress of each work order of the property, and of its live orders together. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return Response.json(await propertyProgress(propertyId));
};
