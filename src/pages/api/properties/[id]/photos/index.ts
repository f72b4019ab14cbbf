import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../lib/server/auth';
import { addPhoto, readPhotoUpload } from '../../../../../lib/server/inspections/inspection-photos';

/** Adds a photo to a check (crew and up): multipart `photo`, `checkId`, `keepLocation`. */
export const POST: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'crew');
  const upload = await readPhotoUpload(request);
  return Response.json({ photo: await addPhoto(propertyId, upload, user.id) }, { status: 201 });
};
