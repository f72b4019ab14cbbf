import { describe, expect, it } from 'vitest';
import { TestClient, newAccount } from '../helpers/api-client';

describe('sign-in through Auth.js', () => {
  it('signs in with the right password and gets an HttpOnly, SameSite=Lax session cookie', async () => {
    const client = new TestClient();
    const account = newAccount('signin');
    await client.signUp(account);
    const csrf = await client.json<{ csrfToken: string }>('GET', '/api/auth/csrf');
    const response = await client.request(
      'POST',
      '/api/auth/callback/credentials',
      new URLSearchParams({ email: account.email, password: account.password, csrfToken: csrf.body.csrfToken }).toString(),
      { 'Content-Type': 'application/x-www-form-urlencoded', 'X-Auth-Return-Redirect': '1' },
    );
    const session = response.headers.getSetCookie().find((cookie) => cookie.startsWith('authjs.session-token='));
    expect(session).toMatch(/HttpOnly/i);
    expect(session).toMatch(/SameSite=Lax/i);
    const me = await client.json<{ user: { email: string } }>('GET', '/api/me');
    expect(me.body.user.email).toBe(account.email);
  });

  it('refuses a wrong password without a session', async () => {
    const client = new TestClient();
    const account = newAccount('wrong');
    await client.signUp(account);
    const result = await client.signIn(account.email, 'not the password');
    expect(result.url).toMatch(/error=CredentialsSignin/);
    expect(client.signedIn).toBe(false);
    expect((await client.request('GET', '/api/me')).status).toBe(401);
  });

  it('slows down repeated failures for one e-mail: the 6th attempt in the window gets 429, even with the right password', async () => {
    const client = new TestClient();
    const account = newAccount('throttle');
    await client.signUp(account);
    for (let attempt = 1; attempt <= 5; attempt += 1) {
      const result = await client.signIn(account.email, `guess ${attempt}`);
      expect(result.status).toBe(200);
    }
    const locked = await client.signIn(account.email, account.password);
    expect(locked.status).toBe(429);
    expect(locked.error).toMatch(/Too many failed sign-ins/);
    expect(client.signedIn).toBe(false);
    // Another address from the same network is not locked by this one's failures.
    const other = newAccount('unlocked');
    await client.signUp(other);
    await client.signIn(other.email, other.password);
    expect(client.signedIn).toBe(true);
  });

  it('refuses a form post from another site (Astro origin check)', async () => {
    const client = new TestClient();
    const response = await client.request('POST', '/api/auth/callback/credentials', 'email=a%40b.example&password=x', {
      'Content-Type': 'application/x-www-form-urlencoded',
      Origin: 'https://elsewhere.example',
    });
    expect(response.status).toBe(403);
  });

  it('signs out: the session cookie is cleared', async () => {
    const client = new TestClient();
    const account = newAccount('signout');
    await client.signUp(account);
    await client.signIn(account.email, account.password);
    expect(client.signedIn).toBe(true);
    const csrf = await client.json<{ csrfToken: string }>('GET', '/api/auth/csrf');
    await client.request('POST', '/api/auth/signout', new URLSearchParams({ csrfToken: csrf.body.csrfToken }).toString(), {
      'Content-Type': 'application/x-www-form-urlencoded',
      'X-Auth-Return-Redirect': '1',
    });
    expect(client.signedIn).toBe(false);
    expect((await client.request('GET', '/api/me')).status).toBe(401);
  });
});
