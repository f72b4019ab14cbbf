import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../../../../../lib/server/auth';
import { parseId } from '../../../../../../../../../lib/server/http';
import { drainageTile, parseTileCoords } from '../../../../../../../../../lib/server/terrain/drainage-tiles';

// A run's lines never change under its id: the browser may keep a tile for good.
const CACHE = 'private, max-age=31536000, immutable';

/** A vector tile (Mapbox Vector Tile) of the run's drainage lines, layer `drainage`; 204 where none crosses the tile. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  const runId = parseId(params.runId, 'terrain run');
  const tile = await drainageTile(propertyId, runId, parseTileCoords(params));
  if (!tile) return new Response(null, { status: 204, headers: { 'Cache-Control': CACHE } });
  return new Response(new Uint8Array(tile), { headers: { 'Content-Type': 'application/x-protobuf', 'Cache-Control': CACHE } });
};
