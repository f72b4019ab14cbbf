import type { APIRoute } from 'astro';
import { profileRequestSchema } from '../../../../lib/schemas/queries';
import { requireRole } from '../../../../lib/server/auth';
import { readJson } from '../../../../lib/server/http';
import { profileAlong } from '../../../../lib/server/terrain/terrain-queries';

/** Ground profile along a line: `{ line: [[lon, lat], …], spacingM? }`. */
export const POST: APIRoute = async ({ locals, params, request }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  const { line, spacingM } = await readJson(request, profileRequestSchema);
  return Response.json({ profile: await profileAlong(propertyId, line, spacingM) });
};
