import type { APIRoute } from 'astro';
import { elevationQuerySchema } from '../../../../lib/schemas/queries';
import { requireRole } from '../../../../lib/server/auth';
import { parseWith } from '../../../../lib/server/http';
import { elevationAt } from '../../../../lib/server/terrain/terrain-queries';

/**
 * Ground height at a point, `?lon=&lat=`, from the finest processed elevation model there
 * (bilinear between cell centres); `elevationM: null` off every model or on nodata. Cheap enough
 * to follow the map cursor: the model stays in memory between calls.
 */
export const GET: APIRoute = async ({ locals, params, url }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  const { lon, lat } = parseWith(elevationQuerySchema, Object.fromEntries(url.searchParams));
  return Response.json(await elevationAt(propertyId, [lon, lat]));
};
