import type { APIRoute } from 'astro';
import { uploadQuerySchema } from '../../../../../lib/schemas/terrain';
import { requireRole } from '../../../../../lib/server/auth';
import { parseWith } from '../../../../../lib/server/http';
import { keptJsonAnswer } from '../../../../../lib/server/read-cache';
import { listElevationModels } from '../../../../../lib/server/repos/terrain';
import { acceptElevationModel } from '../../../../../lib/server/terrain/accept-elevation-model';

export const GET: APIRoute = async ({ locals, params, request }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return keptJsonAnswer(request, 'elevation-models', propertyId, 'terrain', 'application/json', async () => ({ elevationModels: await listElevationModels(propertyId) }));
};

/**
 * Uploads an elevation model: the GeoTIFF's bytes as the body, `?name=` its file name, optional
 * `&crs=EPSG:…` for a file without one and `&thresholdHa=`. Answers 201 with the queued terrain run.
 */
export const POST: APIRoute = async ({ locals, params, request, url }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const query = parseWith(uploadQuerySchema, Object.fromEntries(url.searchParams));
  const accepted = await acceptElevationModel({
    propertyId,
    userId: user.id,
    ...query,
    body: request.body,
    declaredBytes: Number(request.headers.get('content-length') ?? 0),
  });
  return Response.json(accepted, { status: 201 });
};
