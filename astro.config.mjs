// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwindcss from '@tailwindcss/vite';
import auth from 'auth-astro';

// Hosts the server answers to. Astro's origin check (CSRF) compares a form post's Origin with the
// request URL; without the host listed here the request URL loses its port behind the node
// adapter and both the origin check and Auth.js's callback URLs go wrong.
const publicHosts = (process.env.PUBLIC_HOSTS ?? '')
  .split(',')
  .map((host) => host.trim())
  .filter(Boolean)
  .map((hostname) => ({ hostname }));

export default defineConfig({
  output: 'server',
  // Middleware mode: src/serve.ts is the server (it sends the client's files itself, see http-server.ts).
  adapter: node({ mode: 'middleware' }),
  integrations: [react(), auth()],
  security: {
    checkOrigin: true,
    allowedDomains: [{ hostname: 'localhost' }, { hostname: '127.0.0.1' }, ...publicHosts],
  },
  server: { host: '127.0.0.1', port: 4321 },
  vite: {
    plugins: [tailwindcss()],
    ssr: { external: ['better-sqlite3', '@node-rs/argon2', 'knex'] },
    build: {
      rollupOptions: {
        // MapLibre in a chunk of its own: cached apart from the app's code, which changes more often.
        output: { manualChunks: (id) => (id.includes('/node_modules/maplibre-gl/') ? 'maplibre-gl' : undefined) },
      },
    },
  },
});
