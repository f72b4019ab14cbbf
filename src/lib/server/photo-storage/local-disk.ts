import { randomUUID } from 'node:crypto';
import { open, readdir, readFile, rename, rm, mkdir } from 'node:fs/promises';
import path from 'node:path';
import { checkPhotoKey, isPhotoKey, type PhotoStore } from './photo-store';

/**
 * Photos as files under a root folder (DATA_DIR). A write goes to a temporary file that is
 * synced and then renamed into place, and the folder is synced too, so a power cut leaves the
 * whole photo or none of it.
 */
export function localDiskStore(root: string): PhotoStore {
  const fileOf = (key: string) => path.join(root, ...checkPhotoKey(key).split('/'));
  return {
    kind: 'local-disk',
    async put(key, bytes) {
      const target = fileOf(key);
      const folder = path.dirname(target);
      await mkdir(folder, { recursive: true });
      const temp = path.join(folder, `.${randomUUID()}.part`);
      try {
        const handle = await open(temp, 'wx');
        try {
          await handle.writeFile(bytes);
          await handle.sync();
        } finally {
          await handle.close();
        }
        await rename(temp, target);
      } catch (error) {
        await rm(temp, { force: true }).catch(() => undefined);
        throw error;
      }
      const dir = await open(folder, 'r');
      try {
        await dir.sync();
      } finally {
        await dir.close();
      }
    },
    async get(key) {
      try {
        return new Uint8Array(await readFile(fileOf(key)));
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null;
        throw error;
      }
    },
    async remove(key) {
      await rm(fileOf(key), { force: true });
    },
    async keys() {
      const keys: string[] = [];
      for (const property of await namesIn(path.join(root, 'photos'))) {
        for (const name of await namesIn(path.join(root, 'photos', property))) {
          const key = `photos/${property}/${name}`;
          if (isPhotoKey(key)) keys.push(key);
          else if (name.endsWith('.part')) await rm(path.join(root, 'photos', property, name), { force: true });
        }
      }
      return keys;
    },
  };
}

async function namesIn(folder: string): Promise<string[]> {
  try {
    return await readdir(folder);
  } catch {
    return [];
  }
}
