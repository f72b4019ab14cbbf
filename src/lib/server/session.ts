import { randomUUID } from 'node:crypto';
import { getToken } from '@auth/core/jwt';
import type { Knex } from 'knex';
import type { SessionUser } from '../../env';
import { getConfig } from './config';
import { db } from './db';
import { decodeSession, encodeSession } from './session-jwt';

const SECURE_COOKIE = '__Secure-authjs.session-token';
const PLAIN_COOKIE = 'authjs.session-token';

/** How long a session lasts from the last page a person opened. */
export const SESSION_MAX_AGE_S = 14 * 24 * 60 * 60;
/** A cookie older than this is issued again when a page is opened, so an active session rolls on. */
const RENEW_AFTER_S = 24 * 60 * 60;

/**
 * The signed-in user behind a request, or null: the session cookie decrypted and checked (expiry,
 * not signed out, the account still there). This reads the cookie directly (Auth.js's `getToken`,
 * then `decodeSession`, in its format) rather than running the whole Auth.js session handler on
 * every request.
 */
export async function loadSessionUser(request: Request): Promise<SessionUser | null> {
  const token = await sessionTokenOf(request);
  if (!token || typeof token.sid !== 'string' || token.sid === '') return null;
  const id = Number(token.sub);
  if (!Number.isSafeInteger(id) || id < 1) return null;
  // One query on every request: the account, unless this session was signed out (isSessionLive).
  const sid = token.sid;
  const user = (await db()('users')
    .where({ id })
    .whereNotExists((revoked) => revoked.select('session_id').from('revoked_sessions').where({ session_id: sid }))
    .first('id', 'email', 'name')) as SessionUser | undefined;
  return user ? { id: user.id, email: user.email, name: user.name } : null;
}

// Decrypted cookies, briefly: an island's burst of requests decrypts its cookie once. Signing out
// is still seen at once, since every request looks its session up among those signed out.
const DECODED_FOR_MS = 60_000;
const MAX_DECODED = 2_000;
const decoded = new Map<string, { token: SessionToken; until: number }>();

async function sessionTokenOf(request: Request): Promise<SessionToken | null> {
  const secret = getConfig().authSecret;
  const secureCookie = (request.headers.get('cookie') ?? '').includes(SECURE_COOKIE);
  const raw = await getToken({ req: request, secret, secureCookie, raw: true }).catch(() => null);
  if (!raw) return null;
  const now = Date.now();
  const known = decoded.get(raw);
  if (known && known.until > now) return tokenStillValid(known.token, now) ? known.token : null;
  let token: SessionToken | null;
  try {
    token = (await decodeSession({ token: raw, secret, salt: secureCookie ? SECURE_COOKIE : PLAIN_COOKIE })) as SessionToken | null;
  } catch {
    token = null; // tampered, signed with another secret, or expired: signed out
  }
  if (!token) return null;
  if (decoded.size >= MAX_DECODED) decoded.delete(decoded.keys().next().value!);
  decoded.set(raw, { token, until: now + DECODED_FOR_MS });
  return token;
}

/**
 * A fresh session cookie for a signed-in person whose cookie was issued more than a day ago, or
 * null: the same session (id and person), a new expiry 14 days on. The middleware sends it with
 * pages, not API answers, which is enough to keep a person who uses the app signed in.
 */
export async function renewedSessionCookie(request: Request, now = Date.now()): Promise<string | null> {
  const token = await sessionTokenOf(request);
  if (!token || typeof token.iat !== 'number' || now / 1000 - token.iat < RENEW_AFTER_S) return null;
  const secureCookie = (request.headers.get('cookie') ?? '').includes(SECURE_COOKIE);
  const name = secureCookie ? SECURE_COOKIE : PLAIN_COOKIE;
  const { iat: _iat, exp: _exp, jti: _jti, ...kept } = token as Record<string, unknown>;
  const value = await encodeSession({ token: kept, secret: getConfig().authSecret, salt: name, maxAge: SESSION_MAX_AGE_S });
  return `${name}=${value}; Path=/; Max-Age=${SESSION_MAX_AGE_S}; HttpOnly; SameSite=Lax${secureCookie ? '; Secure' : ''}`;
}

function tokenStillValid(token: SessionToken, now: number): boolean {
  return typeof token.exp !== 'number' || token.exp * 1000 > now;
}

/** The parts of the session token these checks read (Auth.js carries `sid` through every re-signing). */
export type SessionToken = { sid?: unknown; sub?: unknown; exp?: unknown; iat?: unknown };

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
