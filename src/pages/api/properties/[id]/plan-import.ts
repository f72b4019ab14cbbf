import type { APIRoute } from 'astro';
import { z } from 'zod';
import { requireRole } from '../../../../lib/server/auth';
import { parseWith } from '../../../../lib/server/http';
import { importPlanFile } from '../../../../lib/server/plan-import';

/** Imports a plan export (GeoJSON or KML, the body; `?name=` its file name): its fence lines and paddocks, all or nothing. */
export const POST: APIRoute = async ({ locals, params, request, url }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const { name } = parseWith(z.object({ name: z.string().trim().min(1, 'Give the file name (name=…).').max(200) }), Object.fromEntries(url.searchParams));
  return Response.json({ imported: await importPlanFile(propertyId, user.id, name, request) }, { status: 201 });
};
