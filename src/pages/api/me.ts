import type { APIRoute } from 'astro';
import { requireUser } from '../../lib/server/auth';

export const GET: APIRoute = ({ locals }) => Response.json({ user: requireUser(locals) });
