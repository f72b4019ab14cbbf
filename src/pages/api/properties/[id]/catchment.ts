import type { APIRoute } from 'astro';
import { catchmentQuerySchema } from '../../../../lib/schemas/queries';
import { requireRole } from '../../../../lib/server/auth';
import { parseWith } from '../../../../lib/server/http';
import { catchmentAt } from '../../../../lib/server/terrain/terrain-queries';

/** The catchment draining to a point: `?lon=&lat=&snapM=` (snapped to the channel within snapM metres). */
export const GET: APIRoute = async ({ locals, params, url }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  const { lon, lat, snapM } = parseWith(catchmentQuerySchema, Object.fromEntries(url.searchParams));
  return Response.json({ catchment: await catchmentAt(propertyId, [lon, lat], snapM) });
};
