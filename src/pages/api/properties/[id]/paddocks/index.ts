import type { APIRoute } from 'astro';
import { paddockInputSchema } from '../../../../../lib/schemas/paddock';
import { requireRole } from '../../../../../lib/server/auth';
import { readJson } from '../../../../../lib/server/http';
import { createPaddock, listPaddocks } from '../../../../../lib/server/repos/paddocks';

export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return Response.json({ paddocks: await listPaddocks(propertyId) });
};

/** Draws a paddock: `{ name, rings: [[[lon, lat], …], …] }`, the outer ring first, closed or not. */
export const POST: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const input = await readJson(request, paddockInputSchema);
  return Response.json({ paddock: await createPaddock(propertyId, input, user.id) }, { status: 201 });
};
