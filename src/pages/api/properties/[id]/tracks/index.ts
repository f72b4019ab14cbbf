import type { APIRoute } from 'astro';
import { z } from 'zod';
import { requireRole } from '../../../../../lib/server/auth';
import { parseWith } from '../../../../../lib/server/http';
import { importTrackFile } from '../../../../../lib/server/import-file';
import { listTracks } from '../../../../../lib/server/repos/tracks';

export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return Response.json({ tracks: await listTracks(propertyId) });
};

/** Imports a GPX or KML file (the body; `?name=` its file name): lines become tracks, polygons paddocks. */
export const POST: APIRoute = async ({ locals, params, request, url }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  const { name } = parseWith(z.object({ name: z.string().trim().min(1, 'Give the file name (name=…).').max(200) }), Object.fromEntries(url.searchParams));
  return Response.json({ imported: await importTrackFile(propertyId, user.id, name, request) }, { status: 201 });
};
