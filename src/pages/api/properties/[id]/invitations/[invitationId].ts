import type { APIRoute } from 'astro';
import { requireRole } from '../../../../../lib/server/auth';
import { parseId } from '../../../../../lib/server/http';
import { revokeInvitation } from '../../../../../lib/server/repos/invitations';

/** Revokes a pending invitation: its link stops working. */
export const DELETE: APIRoute = async ({ locals, params }) => {
  const { propertyId, user } = await requireRole(locals, params.id, 'manager');
  await revokeInvitation(propertyId, parseId(params.invitationId, 'invitation'), user.id);
  return new Response(null, { status: 204 });
};
