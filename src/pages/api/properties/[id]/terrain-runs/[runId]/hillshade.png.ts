import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../../lib/server/auth';
import { parseId } from '../../../../../../lib/server/http';
import { readRunFile } from '../../../../../../lib/server/terrain/terrain-runs';

/** The run's hillshade image, placed on the map at the run's `cornersWgs84`. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  const { body, contentType } = await readRunFile(propertyId, parseId(params.runId, 'terrain run'), 'hillshade.png');
  return new Response(new Uint8Array(body), { headers: { 'Content-Type': contentType, 'Cache-Control': 'private, max-age=31536000, immutable' } });
};
