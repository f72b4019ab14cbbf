import { z } from 'zod';
import { ROLES, type Role } from './roles';

export const roleSchema = z.enum(ROLES);

const name = z
  .string({ required_error: 'Give the property a name.' })
  .trim()
  .min(1, 'Give the property a name.')
  .max(120, 'Keep the name under 120 characters.');

const region = z.string().trim().max(120, 'Keep the state or region under 120 characters.');

/** A projected CRS as an EPSG code; checked against the EPSG registry on the server. */
export const crsSchema = z
  .string({ required_error: 'Choose the projected coordinate system (an EPSG code).' })
  .trim()
  .toUpperCase()
  .regex(/^EPSG:\d{4,6}$/, 'Write the coordinate system as an EPSG code, like EPSG:7854.');

export const createPropertySchema = z.object({ name, region: region.default(''), crs: crsSchema });
export type CreatePropertyInput = z.infer<typeof createPropertySchema>;

export const updatePropertySchema = z
  .object({ name, region, crs: crsSchema, version: z.number().int().positive() })
  .partial({ name: true, region: true, crs: true });
export type UpdatePropertyInput = z.infer<typeof updatePropertySchema>;

export const changeRoleSchema = z.object({ role: roleSchema });

export type PropertySummary = {
  id: number;
  name: string;
  region: string;
  crs: string;
  extentWgs84: [number, number, number, number] | null;
  version: number;
  role: Role;
  createdAt: string;
  updatedAt: string;
};

export type Member = {
  userId: number;
  email: string;
  name: string;
  role: Role;
  since: string;
};
