import { decode, encode } from '@auth/core/jwt';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getConfig } from '../../../src/lib/server/config';
import { closeDb, ensureMigrated } from '../../../src/lib/server/db';
import { createUser } from '../../../src/lib/server/repos/users';
import { loadSessionUser, renewedSessionCookie, revokeSession, SESSION_MAX_AGE_S } from '../../../src/lib/server/session';

const COOKIE = 'authjs.session-token';
let userId = 0;

beforeAll(async () => {
  await ensureMigrated();
  userId = (await createUser({ email: 'session@test.example', name: 'Sam Session', passwordHash: 'hash' })).id;
});
afterAll(closeDb);

async function requestWith(token: Record<string, unknown>, secret = getConfig().authSecret): Promise<Request> {
  const value = await encode({ token, secret, salt: COOKIE, maxAge: SESSION_MAX_AGE_S });
  return new Request('http://127.0.0.1/app', { headers: { cookie: `${COOKIE}=${value}` } });
}

describe('sessions read from the cookie', () => {
  it('finds the person of a live session, and nobody for a signed-out, foreign or damaged one', async () => {
    const live = await requestWith({ sub: String(userId), sid: 'live-session' });
    expect(await loadSessionUser(live)).toEqual({ id: userId, email: 'session@test.example', name: 'Sam Session' });

    await revokeSession({ sid: 'gone-session', sub: String(userId) });
    expect(await loadSessionUser(await requestWith({ sub: String(userId), sid: 'gone-session' }))).toBeNull();
    // Cookies signed before sessions had ids carry none: signed out.
    expect(await loadSessionUser(await requestWith({ sub: String(userId) }))).toBeNull();
    expect(await loadSessionUser(await requestWith({ sub: String(userId), sid: 'other-secret' }, 'another-secret-that-is-long-enough-0123456789'))).toBeNull();
    const damaged = (await requestWith({ sub: String(userId), sid: 'damaged' })).headers.get('cookie')!.replace(/.$/, (c) => (c === 'A' ? 'B' : 'A'));
    expect(await loadSessionUser(new Request('http://127.0.0.1/app', { headers: { cookie: damaged } }))).toBeNull();
    expect(await loadSessionUser(new Request('http://127.0.0.1/app'))).toBeNull();
  });

  it('renews a cookie more than a day old with the same session, and leaves a fresh one alone', async () => {
    const request = await requestWith({ sub: String(userId), sid: 'rolling-session', name: 'Sam Session' });
    expect(await renewedSessionCookie(request)).toBeNull();
    const renewed = await renewedSessionCookie(request, Date.now() + 25 * 3_600_000);
    expect(renewed).toMatch(new RegExp(`^${COOKIE}=[^;]+; Path=/; Max-Age=${SESSION_MAX_AGE_S}; HttpOnly; SameSite=Lax$`));
    const value = /=([^;]+);/.exec(renewed!)![1]!;
    const before = await decode({ token: /=(.+)$/.exec(request.headers.get('cookie')!)![1]!, secret: getConfig().authSecret, salt: COOKIE });
    const after = await decode({ token: value, secret: getConfig().authSecret, salt: COOKIE });
    expect(after).toMatchObject({ sub: String(userId), sid: 'rolling-session', name: 'Sam Session' });
    expect(after!.jti).not.toBe(before!.jti);
    expect(after!.exp! - after!.iat!).toBe(SESSION_MAX_AGE_S);
  });
});
