import type { APIRoute } from 'astro';
import { requireUser } from '../../../lib/server/auth';
import { requireProjectedCrs } from '../../../lib/server/crs-registry';
import { parseWith } from '../../../lib/server/http';
import { crsSchema } from '../../../lib/schemas/property';

/** Names a projected CRS from the EPSG registry, so forms can confirm a code as it is typed. */
export const GET: APIRoute = ({ locals, params }) => {
  requireUser(locals);
  const code = parseWith(crsSchema, decodeURIComponent(params.code ?? ''));
  const { name, proj4, unit } = requireProjectedCrs(code);
  return Response.json({ code, name, unit, proj4 });
};
