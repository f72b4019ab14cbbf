import { hash, verify } from '@node-rs/argon2';

// argon2id with the library's defaults (19 MiB, 2 passes): the OWASP-recommended minimum.
export function hashPassword(password: string): Promise<string> {
  return hash(password);
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

// Verified against when the account does not exist, so a wrong e-mail takes as long as a wrong password.
let decoy: Promise<string> | undefined;
export async function verifyAgainstDecoy(password: string): Promise<false> {
  decoy ??= hash('decoy password that matches nothing');
  await verifyPassword(await decoy, password);
  return false;
}
