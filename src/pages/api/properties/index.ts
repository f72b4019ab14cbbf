import type { APIRoute } from 'astro';
import { createPropertySchema } from '../../../lib/schemas/property';
import { requireUser } from '../../../lib/server/auth';
import { requireProjectedCrs } from '../../../lib/server/crs-registry';
import { readJson } from '../../../lib/server/http';
import { createProperty, listPropertiesForUser } from '../../../lib/server/repos/properties';

export const GET: APIRoute = async ({ locals }) => {
  const user = requireUser(locals);
  return Response.json({ properties: await listPropertiesForUser(user.id) });
};

/** Any signed-in person may create a property; they become its owner. */
export const POST: APIRoute = async ({ locals, request }) => {
  const user = requireUser(locals);
  const input = await readJson(request, createPropertySchema);
  requireProjectedCrs(input.crs);
  const property = await createProperty(input, user.id);
  return Response.json({ property }, { status: 201 });
};
