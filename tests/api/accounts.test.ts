import { afterAll, describe, expect, it } from 'vitest';
import { TestClient, closeServerDb, newAccount, rowCounts } from '../helpers/api-client';

afterAll(closeServerDb);

describe('sign-up (POST /api/accounts)', () => {
  it('creates an account and stores no password in the clear', async () => {
    const client = new TestClient();
    const account = newAccount('signup');
    const { status, body } = await client.json<{ user: { id: number; email: string } }>('POST', '/api/accounts', {
      ...account,
      email: `  ${account.email.toUpperCase()} `,
    });
    expect(status).toBe(201);
    expect(body.user.email).toBe(account.email);
    expect(JSON.stringify(body)).not.toContain(account.password);
  });

  const bad: [string, Record<string, unknown>, string, RegExp][] = [
    ['a malformed e-mail', { ...newAccount('bad'), email: 'not-an-address' }, 'email', /valid e-mail/],
    ['a too-short password', { ...newAccount('bad'), password: 'short' }, 'password', /at least 10 characters/],
    ['a missing name', { ...newAccount('bad'), name: '   ' }, 'name', /Enter your name/],
  ];
  it.each(bad)('refuses %s with 422 naming the field, and stores nothing', async (_label, input, field, message) => {
    const before = await rowCounts('users', 'audit_log');
    const { status, body } = await new TestClient().json<{ error: string; fields: Record<string, string> }>('POST', '/api/accounts', input);
    expect(status).toBe(422);
    expect(body.fields[field]).toMatch(message);
    expect(await rowCounts('users', 'audit_log')).toEqual(before);
  });

  it('refuses a duplicate e-mail with 409, and stores nothing', async () => {
    const account = newAccount('dup');
    await new TestClient().signUp(account);
    const before = await rowCounts('users', 'audit_log');
    const { status, body } = await new TestClient().json<{ error: string; fields: Record<string, string> }>('POST', '/api/accounts', {
      ...account,
      email: account.email.toUpperCase(),
    });
    expect(status).toBe(409);
    expect(body.error).toMatch(/already exists/);
    expect(body.fields.email).toBeTruthy();
    expect(await rowCounts('users', 'audit_log')).toEqual(before);
  });

  it('refuses an oversized JSON body with 413, and stores nothing', async () => {
    const before = await rowCounts('users');
    const huge = { ...newAccount('huge'), name: 'x'.repeat(400 * 1024) };
    const response = await new TestClient().request('POST', '/api/accounts', huge);
    expect(response.status).toBe(413);
    expect(((await response.json()) as { error: string }).error).toMatch(/too large/);
    expect(await rowCounts('users')).toEqual(before);
  });

  it('refuses a body that is not JSON with 400 or 415', async () => {
    const client = new TestClient();
    const broken = await client.request('POST', '/api/accounts', '{"email":', { 'Content-Type': 'application/json' });
    expect(broken.status).toBe(400);
    expect(((await broken.json()) as { error: string }).error).toMatch(/not valid JSON/);
    const plain = await client.request('POST', '/api/accounts', 'email=a', { 'Content-Type': 'text/plain' });
    // Astro's origin check answers a cross-site-capable content type before the endpoint does.
    expect([403, 415]).toContain(plain.status);
  });
});
