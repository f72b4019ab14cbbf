import type { APIRoute } from 'astro';
import { changeRoleSchema } from '../../../../../lib/schemas/property';
import { requireRole } from '../../../../../lib/server/auth';
import { parseId, readJson } from '../../../../../lib/server/http';
import { changeRole, removeMember } from '../../../../../lib/server/repos/memberships';

/** Owners change a member's role; the last owner stays an owner (409). */
export const PATCH: APIRoute = async ({ locals, params, request }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'owner');
  const memberId = parseId(params.userId, 'member');
  const { role } = await readJson(request, changeRoleSchema);
  return Response.json({ member: await changeRole(propertyId, memberId, role, user.id) });
};

export const DELETE: APIRoute = async ({ locals, params }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'owner');
  await removeMember(propertyId, parseId(params.userId, 'member'), user.id);
  return new Response(null, { status: 204 });
};
