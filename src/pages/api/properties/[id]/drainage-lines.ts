import type { APIRoute } from 'astro';
import { requireRole } from '../../../../lib/server/auth';
import { drainageLinesGeoJsonText } from '../../../../lib/server/repos/drainage-lines';

/** The property's drainage lines, a GeoJSON FeatureCollection in WGS84 (RFC 7946). */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return new Response(await drainageLinesGeoJsonText(propertyId), { headers: { 'Content-Type': 'application/geo+json' } });
};
