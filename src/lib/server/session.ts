import { randomUUID } from 'node:crypto';
import { getSession } from 'auth-astro/server';
import type { Knex } from 'knex';
import type { SessionUser } from '../../env';
import { db } from './db';
import { findUserById } from './repos/users';

/** The signed-in user behind a request, or null. A session whose account is gone counts as none. */
export async function loadSessionUser(request: Request): Promise<SessionUser | null> {
  const session = await getSession(request);
  const id = Number(session?.user?.id);
  if (!Number.isSafeInteger(id) || id < 1) return null;
  const user = await findUserById(id);
  return user ? { id: user.id, email: user.email, name: user.name } : null;
}

/** The parts of the session token these checks read (Auth.js carries `sid` through every re-signing). */
export type SessionToken = { sid?: unknown; sub?: unknown; exp?: unknown };

/** A new session id for a sign-in: it stays the same while the cookie is re-signed on each visit. */
export function newSessionId(): string {
  return randomUUID();
}

/**
 * Whether a session may still be used: it has a session id (cookies signed before ids were given
 * carry none) and that id was not signed out. One lookup by primary key.
 */
export async function isSessionLive(token: SessionToken, trx: Knex = db()): Promise<boolean> {
  if (typeof token.sid !== 'string' || token.sid === '') return false;
  const revoked = await trx('revoked_sessions').where({ session_id: token.sid }).first('session_id');
  return !revoked;
}

/**
 * Signs a session out on the server: its id is kept until the cookie would have expired, so a
 * copy of the cookie is refused too. Rows past their expiry are removed on the way.
 */
export async function revokeSession(token: SessionToken, trx: Knex = db()): Promise<void> {
  if (typeof token.sid !== 'string' || token.sid === '') return;
  const now = new Date();
  const expires = typeof token.exp === 'number' && Number.isFinite(token.exp) ? new Date(token.exp * 1000) : new Date(now.getTime() + 31 * 86_400_000);
  const userId = Number(token.sub);
  await trx.transaction(async (inner) => {
    await inner('revoked_sessions').where('expires_at', '<', now.toISOString()).delete();
    await inner('revoked_sessions')
      .insert({ session_id: token.sid, user_id: Number.isSafeInteger(userId) && userId > 0 ? userId : null, expires_at: expires.toISOString(), revoked_at: now.toISOString() })
      .onConflict('session_id')
      .ignore();
  });
}
