import { getSession } from 'auth-astro/server';
import type { SessionUser } from '../../env';
import { findUserById } from './repos/users';

/** The signed-in user behind a request, or null. A session whose account is gone counts as none. */
export async function loadSessionUser(request: Request): Promise<SessionUser | null> {
  const session = await getSession(request);
  const id = Number(session?.user?.id);
  if (!Number.isSafeInteger(id) || id < 1) return null;
  const user = await findUserById(id);
  return user ? { id: user.id, email: user.email, name: user.name } : null;
}
