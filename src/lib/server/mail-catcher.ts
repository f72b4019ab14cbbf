import { mkdirSync, writeFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';

export type MailCatcher = { url: string; folder: string; close: () => Promise<void> };

/**
 * A local SMTP server for development and tests: accepts every message on loopback and keeps it
 * as an .eml file in DATA_DIR/mail, so nothing leaves the machine.
 */
export async function startMailCatcher(options: { dataDir: string; port?: number }): Promise<MailCatcher> {
  const folder = path.join(options.dataDir, 'mail');
  mkdirSync(folder, { recursive: true });
  let count = 0;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        count += 1;
        const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${count}.eml`;
        writeFileSync(path.join(folder, name), Buffer.concat(chunks));
        callback();
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, '127.0.0.1', () => resolve());
  });
  const { port } = server.server.address() as AddressInfo;
  return {
    url: `smtp://127.0.0.1:${port}`,
    folder,
    close: () => new Promise((resolve) => server.close(() => resolve())),
  };
}
