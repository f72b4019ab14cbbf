import type { APIRoute } from 'astro';
import { changeLogQuerySchema, CHANGES_PAGE_SIZE } from '../../../../lib/schemas/audit-log';
import { requireRole } from '../../../../lib/server/auth';
import { parseWith } from '../../../../lib/server/http';
import { listAuditForProperty } from '../../../../lib/server/repos/audit-log';

/** Who changed what and when, newest first, a page at a time; owners and managers only. */
export const GET: APIRoute = async ({ locals, params, url }) => {
  const { propertyId } = await requireRole(locals, params.id, 'manager');
  const query = parseWith(changeLogQuerySchema, Object.fromEntries(url.searchParams));
  const entries = await listAuditForProperty(propertyId, { group: query.what, userId: query.who, beforeId: query.before, limit: CHANGES_PAGE_SIZE });
  return Response.json({ entries, older: entries.length === CHANGES_PAGE_SIZE ? (entries.at(-1)?.id ?? null) : null });
};
