import type { APIRoute } from 'astro';
import { z } from 'zod';
import { requireRole } from '../../../../../../lib/server/auth';
import { acceptRealignment, realignmentFor } from '../../../../../../lib/server/crossings/crossing-service';
import { parseId, readJson } from '../../../../../../lib/server/http';

/** The suggested dog-leg that squares this crossing to the flow, to preview. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return Response.json({ realignment: await realignmentFor(propertyId, parseId(params.crossingId, 'crossing')) });
};

/** Accepts the suggestion: send the fence line's `version` from the preview. */
export const POST: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const { version } = await readJson(request, z.object({ version: z.number().int().positive() }));
  return Response.json({ fenceLine: await acceptRealignment(propertyId, parseId(params.crossingId, 'crossing'), version, user.id) });
};
