import type { APIRoute } from 'astro';
import { checkUpdateSchema } from '../../../../../../../lib/schemas/inspection';
import { requireRole } from '../../../../../../../lib/server/auth';
import { parseId, readJson } from '../../../../../../../lib/server/http';
import { updateCheck } from '../../../../../../../lib/server/repos/inspections';

/** Records a crossing's status and note in a round (crew and up), with the version read: 409 when stale. */
export const PATCH: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'crew');
  const roundId = parseId(params.roundId, 'inspection round');
  const checkId = parseId(params.checkId, 'check');
  const input = await readJson(request, checkUpdateSchema);
  return Response.json({ check: await updateCheck(propertyId, roundId, checkId, input, user.id) });
};
