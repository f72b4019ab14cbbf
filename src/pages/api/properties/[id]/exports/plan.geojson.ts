import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../lib/server/auth';
import { planDownload } from '../../../../../lib/server/plan-export';

/** The property's plan as GeoJSON (RFC 7946), as a download. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId, role } = await requireRole(locals, params.id, 'viewer');
  return planDownload(propertyId, role, 'geojson');
};
