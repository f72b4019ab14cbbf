import type { APIRoute } from 'astro';
import { z } from 'zod';
import { DEFAULT_DESIGN_SETTINGS, designSettingsSchema, ifdTableSchema } from '../../../../lib/schemas/crossing';
import { requireRole } from '../../../../lib/server/auth';
import { readJson } from '../../../../lib/server/http';
import { getPropertySettings, updatePropertySettings } from '../../../../lib/server/repos/property-settings';

const priceItemSchema = z.object({
  code: z.string().trim().min(1).max(60),
  description: z.string().trim().max(200).default(''),
  unit: z.enum(['each', 'm', 'roll', 'kg']),
  unitPriceCents: z.number().int().min(0).max(100_000_000),
  supplierNote: z.string().trim().max(200).default(''),
});

const changeSchema = z.object({
  version: z.number().int().min(0),
  designSettings: designSettingsSchema.optional(),
  ifdTable: ifdTableSchema.nullable().optional(),
  priceList: z.array(priceItemSchema).max(500).optional(),
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
