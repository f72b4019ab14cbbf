import type { APIRoute } from 'astro';

/** Liveness for scripts and load balancers: answers once the database is migrated. */
export const GET: APIRoute = () => Response.json({ ok: true });
