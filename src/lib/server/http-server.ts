import { existsSync, readdirSync, readFileSync } from 'node:fs';
import http, { type IncomingMessage, type ServerResponse } from 'node:http';
import https from 'node:https';
import send from 'send';
import { SECURITY_HEADERS } from './security-headers';

/** Astro's request handler (the node adapter in middleware mode): renders pages and endpoints. */
export type AppHandler = (request: IncomingMessage, response: ServerResponse) => unknown;

/**
 * The app's HTTP server: files of the built client (`dist/client`) are sent as files, every other
 * request goes straight to Astro. The node adapter's own standalone server first looks on disk for
 * every request, API calls included (a synchronous and an asynchronous `stat` each, and a thread
 * pool round trip that, under load, cost each answer a turn of the event loop); here only paths
 * under the client folder's own top-level names are looked up. Hashed bundles under `/_astro/` are
 * cached for a year, as the adapter does. HTTPS when `SERVER_CERT_PATH` and `SERVER_KEY_PATH` are set.
 */
export function createAppServer(app: AppHandler, clientDir: string, env: NodeJS.ProcessEnv = process.env): http.Server {
  const staticNames = new Set(existsSync(clientDir) ? readdirSync(clientDir) : []);
  const listener = (request: IncomingMessage, response: ServerResponse) => {
    const rawPath = (request.url ?? '/').split(/[?#]/, 1)[0]!;
    let pathname: string;
    try {
      pathname = decodeURI(rawPath);
    } catch {
      response.writeHead(400, { ...SECURITY_HEADERS, 'Content-Type': 'text/plain; charset=utf-8' });
      response.end('Bad request: the address is not valid.');
      return;
    }
    const [, first = ''] = pathname.split('/', 2);
    if (!staticNames.has(first) || (request.method !== 'GET' && request.method !== 'HEAD')) {
      void app(request, response);
      return;
    }
    // send decodes the path itself (and refuses one climbing out of the folder).
    const file = send(request, rawPath, { root: clientDir, dotfiles: 'deny', index: false });
    let found = false;
    file.on('file', () => (found = true));
    // A folder of the client is no page: Astro answers (send would redirect to its index).
    file.on('directory', () => void app(request, response));
    file.on('headers', (answer: ServerResponse) => {
      for (const [name, value] of Object.entries(SECURITY_HEADERS)) answer.setHeader(name, value);
      if (pathname.startsWith('/_astro/')) answer.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
    });
    file.on('error', (error: Error) => {
      // Not a file of the client: Astro answers (its 404 page, or a route of that name).
      if (!found) void app(request, response);
      else if (!response.headersSent) {
        console.error('[gullyline] sending a file failed:', error);
        response.writeHead(500);
        response.end();
      } else response.destroy();
    });
    file.pipe(response);
  };
  if (env.SERVER_CERT_PATH && env.SERVER_KEY_PATH) {
    return https.createServer({ cert: readFileSync(env.SERVER_CERT_PATH), key: readFileSync(env.SERVER_KEY_PATH) }, listener);
  }
  return http.createServer(listener);
}
