// Browser-side sign-in and sign-out against Auth.js's endpoints. Kept small and our own so that
// the sign-in page can tell a wrong password from a throttled one (429) and show each clearly.

const PREFIX = '/api/auth';

async function csrfToken(): Promise<string> {
  const response = await fetch(`${PREFIX}/csrf`, { credentials: 'same-origin' });
  const { csrfToken: token } = (await response.json()) as { csrfToken: string };
  return token;
}

export type SignInResult = { ok: true; url: string } | { ok: false; message: string };

export async function signIn(email: string, password: string, callbackUrl: string): Promise<SignInResult> {
  const response = await fetch(`${PREFIX}/callback/credentials`, {
    method: 'POST',
    credentials: 'same-origin',
    headers: { 'Content-Type': 'application/x-www-form-urlencoded', 'X-Auth-Return-Redirect': '1' },
    body: new URLSearchParams({ email, password, csrfToken: await csrfToken(), callbackUrl }),
  });
  const body = (await response.json().catch(() => ({}))) as { url?: string; error?: string };
  if (response.status === 429) return { ok: false, message: body.error ?? 'Too many failed sign-ins. Wait a while and try again.' };
  if (!response.ok || !body.url) return { ok: false, message: 'Sign-in failed on our side. Try again in a moment.' };
  if (new URL(body.url, location.origin).searchParams.has('error')) {
    return { ok: false, message: 'That e-mail and password do not match an account. Check both and try again.' };
  }
  return { ok: true, url: body.url };
}

export async function signOut(): Promise<void> {
  await fetch(`${PREFIX}/signout`, {
    method: 'POST',
    credentials: 'same-origin',
    headers: { 'Content-Type': 'application/x-www-form-urlencoded', 'X-Auth-Return-Redirect': '1' },
    body: new URLSearchParams({ csrfToken: await csrfToken(), callbackUrl: '/' }),
  });
  location.assign('/');
}

/** Only same-site paths are followed after sign-in, never another host. */
export function safeCallbackUrl(raw: string | null): string {
  return raw && raw.startsWith('/') && !raw.startsWith('//') ? raw : '/app';
}
