import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../lib/server/auth';
import { listCrossings } from '../../../../../lib/server/repos/crossings';

/** The property's crossings as a GeoJSON FeatureCollection (RFC 7946), one Point each with its summary. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  const crossings = await listCrossings(propertyId);
  return Response.json(
    {
      type: 'FeatureCollection',
      features: crossings.map(({ position, ...properties }) => ({ type: 'Feature', id: properties.id, properties, geometry: { type: 'Point', coordinates: position } })),
    },
    { headers: { 'Content-Type': 'application/geo+json' } },
  );
};
