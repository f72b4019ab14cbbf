import { defineMiddleware, sequence } from 'astro:middleware';
import { compressAnswer } from './lib/server/compress';
import { getConfig } from './lib/server/config';
import { ensureReady } from './lib/server/startup';
import { DomainError, PayloadTooLargeError, UnauthorizedError, errorResponse, internalErrorResponse } from './lib/server/http';
import { limitExpensiveRequests } from './lib/server/request-limit';
import { loadSessionUser, renewedSessionCookie } from './lib/server/session';
import { SECURITY_HEADERS } from './lib/server/security-headers';
import { throttleSignIn } from './lib/server/sign-in-throttle';

const isApi = (path: string) => path === '/api' || path.startsWith('/api/');

/** API routes open to anonymous callers; every other /api route answers 401 without a session. */
function isPublicApi(path: string, method: string): boolean {
  return (
    path.startsWith('/api/auth/') ||
    path === '/api/health' ||
    (path === '/api/accounts' && method === 'POST') ||
    // A contractor's read-only work order link: the token is the key.
    (path.startsWith('/api/work-order-links/') && method === 'GET')
  );
}

const prepareDatabase = defineMiddleware(async (_context, next) => {
  await ensureReady();
  return next();
});

/** Domain errors become their status with a JSON message; anything else a logged 500 with an id. */
const answerErrors = defineMiddleware(async (context, next) => {
  try {
    return await next();
  } catch (error) {
    if (error instanceof DomainError) {
      if (!isApi(context.url.pathname) && error.status === 404) return context.rewrite('/404');
      if (!isApi(context.url.pathname) && error.status === 403) {
        context.locals.refusal = error.message;
        return context.rewrite('/not-allowed');
      }
      return errorResponse(error);
    }
    return internalErrorResponse(error);
  }
});

/** Big text answers (drainage lines, plan exports) go gzip-compressed to clients that take it. */
const compressAnswers = defineMiddleware(async (context, next) => compressAnswer(context.request, await next()));

/** Headers every answer carries (security-headers.ts; http-server.ts sets them on the client's files). */
const setSecurityHeaders = defineMiddleware(async (_context, next) => {
  const response = await next();
  for (const [name, value] of Object.entries(SECURITY_HEADERS)) response.headers.set(name, value);
  return response;
});

/**
 * JSON bodies have a small limit, file uploads their own; both are checked before reading. Only
 * `application/json` (what `readJson` takes) counts as JSON: a GeoJSON plan file sent as
 * `application/geo+json` is an upload.
 */
const limitBodies = defineMiddleware((context, next) => {
  const declared = Number(context.request.headers.get('content-length') ?? 0);
  const isJson = /^application\/json\b/i.test(context.request.headers.get('content-type') ?? '');
  const { maxJsonBodyBytes, maxUploadBytes } = getConfig();
  const limit = isJson ? maxJsonBodyBytes : maxUploadBytes;
  if (isApi(context.url.pathname) && declared > limit) return errorResponse(new PayloadTooLargeError(limit));
  return next();
});

const loadUser = defineMiddleware(async (context, next) => {
  context.locals.user = await loadSessionUser(context.request);
  const response = await next();
  // A page opened by a signed-in person renews a day-old cookie: a session lasts from the last visit.
  if (context.locals.user && context.request.method === 'GET' && !isApi(context.url.pathname)) {
    const renewed = await renewedSessionCookie(context.request);
    if (renewed) response.headers.append('Set-Cookie', renewed);
  }
  return response;
});

/** Anonymous visitors of /app go to the sign-in page; anonymous API calls get 401 JSON. */
const guardRoutes = defineMiddleware((context, next) => {
  if (context.locals.user) return next();
  const path = context.url.pathname;
  if (path === '/app' || path.startsWith('/app/')) {
    const back = encodeURIComponent(path + context.url.search);
    return context.redirect(`/sign-in?callbackUrl=${back}`, 303);
  }
  if (isApi(path) && !isPublicApi(path, context.request.method)) return errorResponse(new UnauthorizedError());
  return next();
});

export const onRequest = sequence(setSecurityHeaders, compressAnswers, answerErrors, prepareDatabase, limitBodies, loadUser, throttleSignIn, guardRoutes, limitExpensiveRequests);
