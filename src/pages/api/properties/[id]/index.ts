import type { APIRoute } from 'astro';
import { updatePropertySchema } from '../../../../lib/schemas/property';
import { requireRole } from '../../../../lib/server/auth';
import { requireProjectedCrs } from '../../../../lib/server/crs-registry';
import { readJson } from '../../../../lib/server/http';
import { getProperty, updateProperty } from '../../../../lib/server/repos/properties';

export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId, role } = await requireRole(locals, params.id, 'viewer');
  return Response.json({ property: await getProperty(propertyId, role) });
};

/** Renames or re-describes a property; send the `version` you read (409 when it is stale). */
export const PATCH: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, role, user } = await requireRole(locals, params.id, 'manager');
  const input = await readJson(request, updatePropertySchema);
  if (input.crs) requireProjectedCrs(input.crs);
  return Response.json({ property: await updateProperty(propertyId, input, user.id, role) });
};
