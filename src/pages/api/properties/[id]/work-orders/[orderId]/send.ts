import type { APIRoute } from 'astro';
import { sendWorkOrderSchema } from '../../../../../../lib/schemas/work-order';
import { requireRole } from '../../../../../../lib/server/auth';
import { parseId, readJson } from '../../../../../../lib/server/http';
import { sendWorkOrder } from '../../../../../../lib/server/work-orders/work-order-service';

/** Sends (or sends again) an order by e-mail with its files; send the `version` you read. */
export const POST: APIRoute = async ({ locals, params, request, url }) => {
  const { propertyId, user, role } = await requireRole(locals, params.id, 'manager');
  const { version } = await readJson(request, sendWorkOrderSchema);
  const workOrder = await sendWorkOrder({ propertyId, orderId: parseId(params.orderId, 'work order'), version, user: { id: user.id, name: user.name }, role, origin: url.origin });
  return Response.json({ workOrder });
};
