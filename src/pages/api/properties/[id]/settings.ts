import type { APIRoute } from 'astro';
import { z } from 'zod';
import { DEFAULT_DESIGN_SETTINGS, designSettingsSchema, ifdTableSchema } from '../../../../lib/schemas/crossing';
import { priceListSchema } from '../../../../lib/schemas/price-list';
import { requireRole } from '../../../../lib/server/auth';
import { readJson } from '../../../../lib/server/http';
import { getPropertySettings, updatePropertySettings } from '../../../../lib/server/repos/property-settings';

const changeSchema = z.object({
  version: z.number().int().min(0),
  designSettings: designSettingsSchema.optional(),
  ifdTable: ifdTableSchema.nullable().optional(),
  priceList: priceListSchema.optional(),
});

/** Design settings (with defaults), the IFD table and the price list of the property. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return Response.json({ settings: await getPropertySettings(propertyId), defaults: DEFAULT_DESIGN_SETTINGS });
};

/** Changes the settings; send the `version` you read. Crossings are not redesigned until asked (POST …/crossings/analyse). */
export const PATCH: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const { version, ...changes } = await readJson(request, changeSchema);
  return Response.json({ settings: await updatePropertySettings(propertyId, changes, version, user.id) });
};
