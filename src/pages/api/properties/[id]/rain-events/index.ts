import type { APIRoute } from 'astro';
import { rainEventInputSchema } from '../../../../../lib/schemas/inspection';
import { requireRole } from '../../../../../lib/server/auth';
import { readJson } from '../../../../../lib/server/http';
import { recordRainEvent } from '../../../../../lib/server/inspections/record-rain-event';
import { getRound, listRainEvents } from '../../../../../lib/server/repos/inspections';

/** The property's rain events, newest first, each with its inspection round's progress. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return Response.json({ rainEvents: await listRainEvents(propertyId) });
};

/** Records a rain event (owner or manager): opens its round and e-mails the crew the link. */
export const POST: APIRoute = async ({ locals, params, request, url }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const input = await readJson(request, rainEventInputSchema);
  const { roundId } = await recordRainEvent(propertyId, input, user, url.origin);
  return Response.json({ round: await getRound(propertyId, roundId) }, { status: 201 });
};
