import { createServer } from 'node:net';

/** A TCP port free on loopback right now, for a server started by a test or a benchmark. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      probe.close(() => (typeof address === 'object' && address ? resolve(address.port) : reject(new Error('no port'))));
    });
  });
}

/**
 * Flags for Debian's Chromium in a closed network (STACK.md): no background calls home, WebGL 2
 * through SwiftShader so MapLibre renders without a GPU. Shared by the browser tests and bench:map.
 */
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--use-angle=swiftshader',
  '--enable-unsafe-swiftshader',
];
