import type { APIRoute } from 'astro';
import { createInvitationSchema } from '../../../../../lib/schemas/invitation';
import { requireRole } from '../../../../../lib/server/auth';
import { readJson } from '../../../../../lib/server/http';
import { createInvitation, listPendingInvitations } from '../../../../../lib/server/repos/invitations';

/** Pending invitations (not accepted or revoked) for owners and managers. */
export const GET: APIRoute = async ({ locals, params }) => {
  const { propertyId } = await requireRole(locals, params.id, 'manager');
  return Response.json({ invitations: await listPendingInvitations(propertyId) });
};

/** Invites a person by e-mail with a role; the e-mail with the accept link is queued. Managers cannot invite owners (403). */
export const POST: APIRoute = async ({ locals, params, request, url }) => {
  const { propertyId, user, role } = await requireRole(locals, params.id, 'manager');
  const input = await readJson(request, createInvitationSchema);
  const { invitation } = await createInvitation({ propertyId, ...input, invitedBy: { id: user.id, name: user.name, role }, origin: url.origin });
  return Response.json({ invitation }, { status: 201 });
};
