import type { APIRoute } from 'astro';
import { fenceLineInputSchema } from '../../../../../lib/schemas/plan';
import { requireRole } from '../../../../../lib/server/auth';
import { readJson } from '../../../../../lib/server/http';
import { createFenceLine, listFenceLines } from '../../../../../lib/server/repos/fence-lines';

export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return Response.json({ fenceLines: await listFenceLines(propertyId) });
};

export const POST: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const input = await readJson(request, fenceLineInputSchema);
  return Response.json({ fenceLine: await createFenceLine(propertyId, input, user.id) }, { status: 201 });
};
