import type { APIRoute } from 'astro';
import { setItemStateSchema } from '../../../../../../../lib/schemas/work-order';
import { requireRole } from '../../../../../../../lib/server/auth';
import { parseId, readJson } from '../../../../../../../lib/server/http';
import { setItemState } from '../../../../../../../lib/server/repos/work-orders';

/**
 * Marks a fence line or crossing of a sent order Started, Done or Blocked (with a note). Any crew
 * member of the property may, not only the assignee: a gang works an order together.
 */
export const PATCH: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'crew');
  const input = await readJson(request, setItemStateSchema);
  const result = await setItemState(propertyId, parseId(params.orderId, 'work order'), parseId(params.itemId, 'item'), input, user.id);
  return Response.json({ workOrder: result.order, fenceStatus: result.fenceStatus });
};
