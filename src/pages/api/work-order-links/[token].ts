import type { APIRoute } from 'astro';
import { workOrderByLink } from '../../../lib/server/work-orders/work-order-service';

/** The order a contractor's link opens, read-only and without signing in: 404 unknown or withdrawn, 410 expired. */
export const GET: APIRoute = async ({ params }) => Response.json({ workOrder: await workOrderByLink(params.token) });
