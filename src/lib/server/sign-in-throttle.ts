import { defineMiddleware } from 'astro:middleware';
import { getConfig } from './config';
import { TooManyRequestsError, errorResponse } from './http';
import { FailureLimiter } from './rate-limit';

const SIGN_IN_PATH = '/api/auth/callback/credentials';

let limiters: { byEmail: FailureLimiter; byIp: FailureLimiter } | undefined;

function getLimiters() {
  const { maxFailuresPerEmail, maxFailuresPerIp, windowMs } = getConfig().signIn;
  limiters ??= { byEmail: new FailureLimiter(maxFailuresPerEmail, windowMs), byIp: new FailureLimiter(maxFailuresPerIp, windowMs) };
  return limiters;
}

/**
 * Slows down password guessing: after too many failed sign-ins for one e-mail address, or from
 * one network address, further attempts are refused with 429 until the window has passed.
 * Auth.js answers a failed sign-in with a redirect (or, for script callers, a JSON `url`)
 * carrying `error=`; that is what counts as a failure.
 */
export const throttleSignIn = defineMiddleware(async (context, next) => {
  if (context.url.pathname !== SIGN_IN_PATH || context.request.method !== 'POST') return next();
  const form = await context.request.clone().formData().catch(() => undefined);
  const email = String(form?.get('email') ?? '').trim().toLowerCase();
  const ip = clientAddress(context);
  const { byEmail, byIp } = getLimiters();
  const waitS = Math.max(byEmail.retryAfterS(`email:${email}`), byIp.retryAfterS(`ip:${ip}`));
  if (waitS > 0) {
    const minutes = Math.ceil(waitS / 60);
    return errorResponse(
      new TooManyRequestsError(`Too many failed sign-ins. Wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again, or reset your password.`, waitS),
    );
  }
  const response = await next();
  if (!(await isFailedSignIn(response))) {
    byEmail.reset(`email:${email}`);
  } else {
    byEmail.recordFailure(`email:${email}`);
    byIp.recordFailure(`ip:${ip}`);
  }
  return response;
});

function clientAddress(context: { clientAddress: string }): string {
  try {
    return context.clientAddress;
  } catch {
    return 'unknown';
  }
}

async function isFailedSignIn(response: Response): Promise<boolean> {
  if (response.status >= 400) return true;
  let target = response.headers.get('location');
  if (!target && response.headers.get('content-type')?.includes('json')) {
    target = ((await response.clone().json().catch(() => ({}))) as { url?: string }).url ?? null;
  }
  return !target || /[?&]error=/.test(target);
}
