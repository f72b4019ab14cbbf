import type { APIRoute } from 'astro';
import { acceptInvitationSchema } from '../../../lib/schemas/invitation';
import { requireUser } from '../../../lib/server/auth';
import { readJson } from '../../../lib/server/http';
import { acceptInvitation } from '../../../lib/server/repos/invitations';

/** The signed-in user accepts an invitation sent to their e-mail address and becomes a member. */
export const POST: APIRoute = async ({ locals, request }) => {
  const user = requireUser(locals);
  const { token } = await readJson(request, acceptInvitationSchema);
  return Response.json({ membership: await acceptInvitation(token, user) });
};
