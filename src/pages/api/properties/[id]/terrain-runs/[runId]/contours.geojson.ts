import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../../lib/server/auth';
import { parseId } from '../../../../../../lib/server/http';
import { readRunFile } from '../../../../../../lib/server/terrain/terrain-runs';

/** The run's contour lines, GeoJSON in WGS84 with `elevationM` on each level. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  const { body, contentType } = await readRunFile(propertyId, parseId(params.runId, 'terrain run'), 'contours.geojson');
  return new Response(new Uint8Array(body), { headers: { 'Content-Type': contentType, 'Cache-Control': 'private, max-age=31536000, immutable' } });
};
