import type { APIRoute } from 'astro';
import { signUpSchema } from '../../lib/schemas/account';
import { readJson } from '../../lib/server/http';
import { hashPassword } from '../../lib/server/passwords';
import { recordAudit } from '../../lib/server/repos/audit-log';
import { createUser } from '../../lib/server/repos/users';
import { db } from '../../lib/server/db';

/** Sign-up: creates an account; the page then signs in through Auth.js. */
export const POST: APIRoute = async ({ request }) => {
  const input = await readJson(request, signUpSchema);
  const passwordHash = await hashPassword(input.password);
  const user = await db().transaction(async (trx) => {
    const created = await createUser({ email: input.email, name: input.name, passwordHash }, trx);
    await recordAudit({ userId: created.id, action: 'user.sign_up', entityType: 'user', entityId: created.id }, trx);
    return created;
  });
  return Response.json({ user }, { status: 201 });
};
