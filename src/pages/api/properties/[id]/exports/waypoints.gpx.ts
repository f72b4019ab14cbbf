import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../lib/server/auth';
import { planDownload } from '../../../../../lib/server/plan-export';

/** The strainers, posts and breakaway ties of the property's designed crossings as GPX 1.1 waypoints, as a download. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId, role } = await requireRole(locals, params.id, 'viewer');
  return planDownload(propertyId, role, 'gpx');
};
