import type { APIRoute } from 'astro';
import { roundUpdateSchema } from '../../../../../../lib/schemas/inspection';
import { requireRole } from '../../../../../../lib/server/auth';
import { parseId, readJson } from '../../../../../../lib/server/http';
import { getRound, updateRound } from '../../../../../../lib/server/repos/inspections';

/** A round with its rain event and its checks in order, each with its statuses, guide and photos. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return Response.json({ round: await getRound(propertyId, parseId(params.roundId, 'inspection round')) });
};

/** Closes or reopens a round (owner or manager), with the version read: 409 when stale. */
export const PATCH: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const roundId = parseId(params.roundId, 'inspection round');
  const input = await readJson(request, roundUpdateSchema);
  return Response.json({ round: await updateRound(propertyId, roundId, input, user.id) });
};
