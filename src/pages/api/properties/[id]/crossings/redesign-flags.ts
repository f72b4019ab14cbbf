import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../lib/server/auth';
import { listCrossings } from '../../../../../lib/server/repos/crossings';
import { redesignFlags } from '../../../../../lib/server/repos/inspections';

/** The crossings flagged for redesign by their inspection history, with the suggested style and the reason. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  const styles = new Map((await listCrossings(propertyId)).map((crossing) => [crossing.id, crossing.style]));
  const flags = await redesignFlags(propertyId, styles);
  return Response.json({ flags: [...flags].map(([crossingId, flag]) => ({ crossingId, ...flag })) });
};
