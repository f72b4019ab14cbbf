import type { APIRoute } from 'astro';
import { createWorkOrderSchema } from '../../../../../lib/schemas/work-order';
import { requireRole } from '../../../../../lib/server/auth';
import { readJson } from '../../../../../lib/server/http';
import { createWorkOrder, listWorkOrders } from '../../../../../lib/server/repos/work-orders';

/** The property's work orders with their items and progress; every member reads them. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return Response.json({ workOrders: await listWorkOrders(propertyId) });
};

/** A new draft order of fence lines and crossings for a crew member or a contractor. */
export const POST: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const input = await readJson(request, createWorkOrderSchema);
  return Response.json({ workOrder: await createWorkOrder(propertyId, input, user.id) }, { status: 201 });
};
