import type { APIRoute } from 'astro';
import { NotFoundError } from '../../lib/server/http';

/** Unknown API paths answer 404 JSON rather than the HTML not-found page. */
export const ALL: APIRoute = () => {
  throw new NotFoundError('route', 'There is no API route at this address. Check the path and method.');
};
