import type { APIRoute } from 'astro';
import { updateWorkOrderSchema } from '../../../../../../lib/schemas/work-order';
import { requireRole } from '../../../../../../lib/server/auth';
import { parseId, readJson } from '../../../../../../lib/server/http';
import { deleteWorkOrder, getWorkOrder, updateWorkOrder } from '../../../../../../lib/server/repos/work-orders';
import { workOrderSheet } from '../../../../../../lib/server/work-orders/work-order-service';

/** One order with its materials, cautions and map (the crew view's data). */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId, role } = await requireRole(locals, params.id, 'viewer');
  const order = await getWorkOrder(propertyId, parseId(params.orderId, 'work order'));
  return Response.json({ workOrder: await workOrderSheet(propertyId, order, role) });
};

/** Changes, cancels (`status: 'cancelled'`) or withdraws the contractor link of an order; send the `version` you read (409 when stale). */
export const PATCH: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const changes = await readJson(request, updateWorkOrderSchema);
  return Response.json({ workOrder: await updateWorkOrder(propertyId, parseId(params.orderId, 'work order'), changes, user.id) });
};

/** Deletes a draft or cancelled order (409 for one that was sent). */
export const DELETE: APIRoute = async ({ locals, params }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  await deleteWorkOrder(propertyId, parseId(params.orderId, 'work order'), user.id);
  return new Response(null, { status: 204 });
};
