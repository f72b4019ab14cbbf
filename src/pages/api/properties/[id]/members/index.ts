import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../lib/server/auth';
import { listMembers } from '../../../../../lib/server/repos/memberships';

export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return Response.json({ members: await listMembers(propertyId) });
};
