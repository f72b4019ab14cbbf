import { decode, encode } from '@auth/core/jwt';
import { describe, expect, it } from 'vitest';
import { decodeSession, encodeSession } from '../../../src/lib/server/session-jwt';

// The reference is Auth.js's own token format: its `encode` and `decode` (@auth/core/jwt).
const secret = 'a-test-secret-that-is-long-enough-for-authjs-0123456789';
const salt = 'authjs.session-token';
const token = { sub: '42', sid: 'session-1', name: 'Tom Reilly' };

describe('session tokens (Auth.js format, key derived once)', () => {
  it('makes tokens Auth.js reads, and reads tokens Auth.js makes', async () => {
    const ours = await encodeSession({ token, secret, salt, maxAge: 3600 });
    expect(await decode({ token: ours, secret, salt })).toMatchObject(token);
    const theirs = await encode({ token, secret, salt, maxAge: 3600 });
    expect(await decodeSession({ token: theirs, secret, salt })).toMatchObject(token);
    // Same header as Auth.js writes: dir, A256CBC-HS512 and the key's thumbprint as its id.
    const header = (value: string) => JSON.parse(Buffer.from(value.split('.')[0]!, 'base64url').toString('utf8'));
    expect(header(ours)).toEqual(header(theirs));
  });

  it('refuses a token of another secret, of another cookie name, or past its expiry', async () => {
    const ours = await encodeSession({ token, secret, salt, maxAge: 3600 });
    await expect(decodeSession({ token: ours, secret: `${secret}-other`, salt })).rejects.toThrow();
    await expect(decodeSession({ token: ours, secret, salt: '__Secure-authjs.session-token' })).rejects.toThrow();
    const expired = await encodeSession({ token, secret, salt, maxAge: -60 });
    await expect(decodeSession({ token: expired, secret, salt })).rejects.toThrow(/exp/);
    expect(await decodeSession({ token: '', secret, salt })).toBeNull();
  });

  it('reads a token after the secret was rotated, with the old one listed second', async () => {
    const old = await encodeSession({ token, secret, salt, maxAge: 3600 });
    expect(await decodeSession({ token: old, secret: [`${secret}-new`, secret], salt })).toMatchObject(token);
  });
});
