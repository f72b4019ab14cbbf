import { decode as decodeWithAuthJs, type JWT, type JWTDecodeParams, type JWTEncodeParams } from '@auth/core/jwt';
import { hkdf } from '@panva/hkdf';
import { EncryptJWT, base64url, calculateJwkThumbprint, decodeProtectedHeader, jwtDecrypt } from 'jose';

/**
 * Session tokens in Auth.js's own format, made and read with the same library calls as its
 * `encode`/`decode` (@auth/core/jwt): a JWE, `dir` + A256CBC-HS512, whose key is derived by HKDF
 * from the secret and the cookie name, with the key's JWK thumbprint as its id. The one change is
 * that the key and its thumbprint are derived once per secret and cookie name rather than for
 * every token: both are thread-pool round trips, and under load each round trip waits its turn in
 * the event loop (a sign-in took about twice as long as a wrong password). Tokens of another
 * encryption go to Auth.js's own `decode`.
 */
const ENC = 'A256CBC-HS512';
const DEFAULT_MAX_AGE_S = 30 * 24 * 60 * 60;

const derived = new Map<string, Promise<{ key: Uint8Array; kid: string }>>();

function keyFor(secret: string, salt: string): Promise<{ key: Uint8Array; kid: string }> {
  const id = `${salt}\u0000${secret}`;
  let known = derived.get(id);
  if (!known) {
    known = (async () => {
      const key = await hkdf('sha256', secret, salt, `Auth.js Generated Encryption Key (${salt})`, 64);
      return { key, kid: await calculateJwkThumbprint({ kty: 'oct', k: base64url.encode(key) }, 'sha512') };
    })();
    known.catch(() => derived.delete(id));
    derived.set(id, known);
  }
  return known;
}

export async function encodeSession({ token = {}, secret, maxAge = DEFAULT_MAX_AGE_S, salt }: JWTEncodeParams): Promise<string> {
  const { key, kid } = await keyFor(Array.isArray(secret) ? secret[0]! : secret, salt);
  return new EncryptJWT(token)
    .setProtectedHeader({ alg: 'dir', enc: ENC, kid })
    .setIssuedAt()
    .setExpirationTime(Math.floor(Date.now() / 1000) + maxAge)
    .setJti(crypto.randomUUID())
    .encrypt(key);
}

export async function decodeSession(params: JWTDecodeParams): Promise<JWT | null> {
  const { token, secret, salt } = params;
  if (!token) return null;
  if (decodeProtectedHeader(token).enc !== ENC) return decodeWithAuthJs(params);
  const secrets = Array.isArray(secret) ? secret : [secret];
  const { payload } = await jwtDecrypt(
    token,
    async ({ kid }) => {
      for (const candidate of secrets) {
        const { key, kid: ownKid } = await keyFor(candidate, salt);
        if (kid === undefined || kid === ownKid) return key;
      }
      throw new Error('no matching decryption secret');
    },
    { clockTolerance: 15, keyManagementAlgorithms: ['dir'], contentEncryptionAlgorithms: [ENC] },
  );
  return payload as JWT;
}
