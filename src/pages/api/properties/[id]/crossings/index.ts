import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../lib/server/auth';
import { listCrossings } from '../../../../../lib/server/repos/crossings';
import { redesignFlags } from '../../../../../lib/server/repos/inspections';
import { keptJsonAnswer } from '../../../../../lib/server/read-cache';

/** The property's crossings as a GeoJSON FeatureCollection (RFC 7946), one Point each with its summary and
 * whether its inspection history flags it for redesign. */
export const GET: APIRoute = async ({ locals, params, request }) => {
  const { propertyId } = await requireRole(locals, params.id, 'viewer');
  return keptJsonAnswer(request, 'crossings', propertyId, 'plan', 'application/geo+json', async () => {
    const crossings = await listCrossings(propertyId);
    const flags = await redesignFlags(propertyId, new Map(crossings.map((crossing) => [crossing.id, crossing.style])));
    return {
      type: 'FeatureCollection',
      features: crossings.map(({ position, ...summary }) => ({ type: 'Feature', id: summary.id, properties: { ...summary, redesign: flags.has(summary.id) }, geometry: { type: 'Point', coordinates: position } })),
    };
  });
};
