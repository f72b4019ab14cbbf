import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../lib/server/auth';
import { readJson } from '../../../../../lib/server/http';
import { keptJsonAnswer } from '../../../../../lib/server/read-cache';
import { analyseCrossings } from '../../../../../lib/server/crossings/analyse-crossings';
import { createFenceLine, listFenceLines, serverFenceLineSchemas } from '../../../../../lib/server/repos/fence-lines';

export const GET: APIRoute = async ({ locals, params, request }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return keptJsonAnswer(request, 'fence-lines', propertyId, 'plan', 'application/json', async () => ({ fenceLines: await listFenceLines(propertyId) }));
};

export const POST: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const input = await readJson(request, serverFenceLineSchemas().input);
  const fenceLine = await createFenceLine(propertyId, input, user.id);
  await analyseCrossings(propertyId, [fenceLine.id]);
  return Response.json({ fenceLine }, { status: 201 });
};
