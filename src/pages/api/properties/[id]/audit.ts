import type { APIRoute } from 'astro';
import { requireRole } from '../../../../lib/server/auth';
import { listAuditForProperty } from '../../../../lib/server/repos/audit-log';

/** Who changed what and when; owners and managers only. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'manager');
  return Response.json({ entries: await listAuditForProperty(propertyId) });
};
