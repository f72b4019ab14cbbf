import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../../lib/server/auth';
import { parseId } from '../../../../../../lib/server/http';
import { getCrossing } from '../../../../../../lib/server/repos/crossings';
import { crossingInspections } from '../../../../../../lib/server/repos/inspections';

/** A crossing's inspection history (newest rain first) and its redesign flag, if any. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  const crossing = await getCrossing(propertyId, parseId(params.crossingId, 'crossing'));
  return Response.json({ inspections: await crossingInspections(propertyId, crossing.id, crossing.style) });
};
