import { promisify } from 'node:util';
import { gzip } from 'node:zlib';

const gzipAsync = promisify(gzip);

/** Answers at least this big are worth compressing; smaller ones cost more in CPU than they save. */
const MIN_BYTES = 8 * 1024;
const TEXT_TYPES = /^(application\/(json|geo\+json|vnd\.google-earth\.kml\+xml|gpx\+xml|xml)|text\/(csv|plain))/i;

/**
 * The same answer gzip-compressed when the client takes gzip and the body is text of some size
 * (drainage lines of a big station are megabytes of JSON; on a phone link that is most of a load).
 * Compression runs on libuv's thread pool, off the request thread, at zlib's fastest level: these
 * answers are made anew for each request, and on two cores level 6 took CPU the requests needed for
 * about a tenth less size (answers kept between requests are compressed once, harder: read-cache.ts).
 * Pages, images and answers already encoded pass unchanged.
 */
export async function compressAnswer(request: Request, response: Response): Promise<Response> {
  const type = response.headers.get('Content-Type') ?? '';
  if (!response.body || response.headers.has('Content-Encoding') || !TEXT_TYPES.test(type) || !/\bgzip\b/i.test(request.headers.get('Accept-Encoding') ?? '')) {
    return response;
  }
  const body = Buffer.from(await response.arrayBuffer());
  const headers = new Headers(response.headers);
  headers.append('Vary', 'Accept-Encoding');
  if (body.byteLength < MIN_BYTES) return new Response(body, { status: response.status, statusText: response.statusText, headers });
  headers.delete('Content-Length');
  headers.set('Content-Encoding', 'gzip');
  return new Response(await gzipAsync(body, { level: 1 }), { status: response.status, statusText: response.statusText, headers });
}
