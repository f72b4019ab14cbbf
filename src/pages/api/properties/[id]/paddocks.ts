import type { APIRoute } from 'astro';
import { requireRole } from '../../../../lib/server/auth';
import { listPaddocks } from '../../../../lib/server/repos/paddocks';

export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return Response.json({ paddocks: await listPaddocks(propertyId) });
};
