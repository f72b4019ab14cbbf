import type { APIRoute } from 'astro';
import { z } from 'zod';
import { requireRole } from '../../../../../../lib/server/auth';
import { changeCrossingInputs, crossingDetail } from '../../../../../../lib/server/crossings/crossing-service';
import { parseId, readJson } from '../../../../../../lib/server/http';
import { keptJsonAnswerAt } from '../../../../../../lib/server/read-cache';
import { crossingStamp } from '../../../../../../lib/server/repos/crossings';

/** One crossing's full design: profile, floods, layout with reasons, wire check, loads, materials, both styles compared and priced, cautions. */
export const GET: APIRoute = async ({ locals, params, request }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  const crossingId = parseId(params.crossingId, 'crossing');
  // Kept until the crossing, its fence line or the property's prices change (read-cache.ts).
  const stamp = await crossingStamp(propertyId, crossingId);
  return keptJsonAnswerAt(request, `crossing:${propertyId}:${crossingId}`, stamp, 'application/json', async () => ({ crossing: await crossingDetail(propertyId, crossingId) }));
};

/** Sets the crossing's inputs (flood mark, n, C, AEP, freeboard, style; null to clear) and designs it again. */
export const PATCH: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const changes = await readJson(request, z.record(z.unknown()));
  return Response.json({ crossing: await changeCrossingInputs(propertyId, parseId(params.crossingId, 'crossing'), changes, user.id) });
};
