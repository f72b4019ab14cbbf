import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../lib/server/auth';
import { parseId } from '../../../../../lib/server/http';
import { readPhoto, removePhoto } from '../../../../../lib/server/inspections/inspection-photos';

/** A photo (`?size=thumbnail` for its thumbnail), to members of its property only. */
export const GET: APIRoute = async ({ locals, params, url }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  const photo = await readPhoto(propertyId, parseId(params.photoId, 'photo'), url.searchParams.get('size') === 'thumbnail');
  return new Response(new Uint8Array(photo.bytes), {
    headers: { 'Content-Type': photo.contentType, 'Cache-Control': 'private, max-age=86400', 'X-Content-Type-Options': 'nosniff' },
  });
};

/** Removes a photo: its sender, an owner or a manager, while the round is open. */
export const DELETE: APIRoute = async ({ locals, params }) => {
  const { propertyId, user, role } = await requireRole(locals, params.id, 'crew');
  await removePhoto(propertyId, parseId(params.photoId, 'photo'), { id: user.id, role });
  return new Response(null, { status: 204 });
};
