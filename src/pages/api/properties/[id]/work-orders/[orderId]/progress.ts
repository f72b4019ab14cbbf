import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../../lib/server/auth';
import { parseId } from '../../../../../../lib/server/http';
import { getWorkOrder } from '../../../../../../lib/server/repos/work-orders';

/** One order's progress: counts by state and the share done. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  const order = await getWorkOrder(propertyId, parseId(params.orderId, 'work order'));
  return Response.json({ id: order.id, status: order.status, progress: order.progress });
};
