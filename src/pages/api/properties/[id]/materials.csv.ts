import type { APIRoute } from 'astro';
import { requireRole } from '../../../../lib/server/auth';
import { materialsCsv, propertyCosts } from '../../../../lib/server/crossings/costs';

/** The materials list of every fence line as CSV. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return new Response(materialsCsv(await propertyCosts(propertyId)), {
    headers: { 'Content-Type': 'text/csv; charset=utf-8', 'Content-Disposition': `attachment; filename="materials-property-${propertyId}.csv"` },
  });
};
