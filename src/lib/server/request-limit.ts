import { defineMiddleware } from 'astro:middleware';
import { getConfig } from './config';
import { TooManyRequestsError, errorResponse } from './http';
import { FailureLimiter } from './rate-limit';

/**
 * Routes whose work is heavy (a terrain run, an upload, a crossing analysis, an import, an
 * export, a realignment search): each person may call them, together, a limited number of times
 * a minute. Listed here in one place, so endpoints stay free of it.
 */
const EXPENSIVE_ROUTES: { method: string; pattern: RegExp; what: string }[] = [
  { method: 'POST', pattern: /^\/api\/properties\/[^/]+\/terrain-runs\/?$/, what: 'terrain runs' },
  { method: 'POST', pattern: /^\/api\/properties\/[^/]+\/elevation-models\/?$/, what: 'elevation model uploads' },
  { method: 'POST', pattern: /^\/api\/properties\/[^/]+\/crossings\/analyse\/?$/, what: 'crossing analyses' },
  { method: 'POST', pattern: /^\/api\/properties\/[^/]+\/plan-import\/?$/, what: 'plan imports' },
  { method: 'GET', pattern: /^\/api\/properties\/[^/]+\/exports\/[^/]+$/, what: 'exports' },
  { method: 'GET', pattern: /^\/api\/properties\/[^/]+\/materials\.csv$/, what: 'exports' },
  { method: '*', pattern: /^\/api\/properties\/[^/]+\/crossings\/[^/]+\/realignment\/?$/, what: 'realignments' },
  // Each send builds the order's GPX and GeoJSON and queues an e-mail with them.
  { method: 'POST', pattern: /^\/api\/properties\/[^/]+\/work-orders\/[^/]+\/send\/?$/, what: 'work order sends' },
  { method: 'POST', pattern: /^\/api\/properties\/[^/]+\/photos\/?$/, what: 'photo uploads' },
];

/** What an expensive route does (for the message), or undefined for every other route. */
export function expensiveRouteOf(method: string, pathname: string): string | undefined {
  const route = EXPENSIVE_ROUTES.find((candidate) => (candidate.method === '*' || candidate.method === method) && candidate.pattern.test(pathname));
  return route?.what;
}

/** The message of a refused request, with the wait in words. */
export function tooManyRequestsMessage(what: string, perMinute: number, waitS: number): string {
  const seconds = Math.max(1, Math.ceil(waitS));
  return `Too many requests for ${what} and other heavy work: each person may make ${perMinute} a minute. Wait ${seconds} second${seconds === 1 ? '' : 's'} and try again.`;
}

let limiter: FailureLimiter | undefined;

/**
 * Refuses a signed-in person's expensive request with 429 and `Retry-After` once they have made
 * EXPENSIVE_REQUESTS_PER_MINUTE of them in the last minute. Runs after the session is loaded and
 * before the body is read, so a refused upload costs nothing.
 */
export const limitExpensiveRequests = defineMiddleware((context, next) => {
  const user = context.locals.user;
  if (!user) return next();
  const what = expensiveRouteOf(context.request.method, context.url.pathname);
  if (!what) return next();
  const perMinute = getConfig().expensiveRequestsPerMinute;
  limiter ??= new FailureLimiter(perMinute, 60_000);
  const waitS = limiter.take(`user:${user.id}`);
  if (waitS > 0) return errorResponse(new TooManyRequestsError(tooManyRequestsMessage(what, perMinute, waitS), waitS));
  return next();
});
