// The built app's entry point (bundled to dist/server/serve.mjs beside Astro's entry.mjs):
//   HOST=127.0.0.1 PORT=4321 node dist/server/serve.mjs
import { fileURLToPath } from 'node:url';
import { createAppServer, type AppHandler } from './lib/server/http-server';

const { handler } = (await import(new URL('./entry.mjs', import.meta.url).href)) as { handler: AppHandler };
const host = process.env.HOST ?? '127.0.0.1';
const port = Number(process.env.PORT ?? 4321);
const server = createAppServer(handler, fileURLToPath(new URL('../client/', import.meta.url)));
server.listen(port, host, () => console.log(`Gullyline is listening on ${process.env.SERVER_CERT_PATH ? 'https' : 'http'}://${host}:${port}`));
