import { existsSync } from 'node:fs';
import { readFile, readdir, stat } from 'node:fs/promises';
import path from 'node:path';
import { getConfig } from '../config';
import { readEml, type CaughtMail } from './read-eml';

/** The local catcher's folder (see mail-catcher.ts). */
export function caughtMailFolder(): string {
  return path.join(getConfig().dataDir, 'mail');
}

/** The newest caught messages first, read from the catcher's .eml files. */
export async function listCaughtMail(folder = caughtMailFolder(), limit = 50): Promise<(CaughtMail & { file: string; caughtAt: string })[]> {
  if (!existsSync(folder)) return [];
  const files = (await readdir(folder)).filter((name) => name.endsWith('.eml'));
  const dated = await Promise.all(files.map(async (file) => ({ file, mtime: (await stat(path.join(folder, file))).mtime })));
  dated.sort((a, b) => b.mtime.getTime() - a.mtime.getTime() || b.file.localeCompare(a.file));
  return Promise.all(
    dated.slice(0, limit).map(async ({ file, mtime }) => ({
      ...readEml(await readFile(path.join(folder, file), 'utf8')),
      file,
      caughtAt: mtime.toISOString(),
    })),
  );
}
