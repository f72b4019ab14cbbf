// One contract for every photo store: the local disk store and the S3 store against s3rver, the
// local S3 fake (s3rver 3.7.1, started here on a free loopback port over a temporary folder).
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort } from '../../../../scripts/local-process';
import { localDiskStore } from '../../../../src/lib/server/photo-storage/local-disk';
import type { PhotoStore } from '../../../../src/lib/server/photo-storage/photo-store';
import { s3Store } from '../../../../src/lib/server/photo-storage/s3';

const folders: string[] = [];
const tempFolder = () => {
  const folder = mkdtempSync(path.join(tmpdir(), 'gullyline-photos-'));
  folders.push(folder);
  return folder;
};

let s3rver: S3rver | undefined;
let s3Endpoint = '';
const BUCKET = 'gullyline-photos';

beforeAll(async () => {
  const port = await freePort();
  s3rver = new S3rver({ address: '127.0.0.1', port, silent: true, directory: tempFolder(), configureBuckets: [{ name: BUCKET, configs: [] }] });
  await s3rver.run();
  s3Endpoint = `http://127.0.0.1:${port}`;
});

afterAll(async () => {
  await s3rver?.close();
  for (const folder of folders) rmSync(folder, { recursive: true, force: true });
});

const stores: [string, () => PhotoStore][] = [
  ['local disk', () => localDiskStore(tempFolder())],
  ['S3 (s3rver)', () => s3Store({ bucket: BUCKET, endpoint: s3Endpoint, region: 'us-east-1', accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER', forcePathStyle: true })],
];

describe.each(stores)('photo store: %s', (_name, make) => {
  it('gives back exactly the bytes put, and null once removed', async () => {
    const store = make();
    const bytes = new Uint8Array(256 * 1024).map((_, i) => (i * 31) % 251);
    const key = 'photos/7/0f9c1d2e-aaaa-bbbb-cccc-1234567890ab.jpg';
    await store.put(key, bytes, 'image/jpeg');
    expect(Buffer.from((await store.get(key))!).equals(Buffer.from(bytes))).toBe(true);
    await store.remove(key);
    expect(await store.get(key)).toBeNull();
  });

  it('answers null for a key never written, and removing it is no error', async () => {
    const store = make();
    expect(await store.get('photos/7/never-written-0000.png')).toBeNull();
    await expect(store.remove('photos/7/never-written-0000.png')).resolves.toBeUndefined();
  });

  it('replaces an object written twice under one key', async () => {
    const store = make();
    const key = 'photos/8/replaced-1111-2222.webp';
    await store.put(key, new Uint8Array([1, 2, 3]), 'image/webp');
    await store.put(key, new Uint8Array([4, 5]), 'image/webp');
    expect([...(await store.get(key))!]).toEqual([4, 5]);
  });

  it('lists the photo keys it holds (the start-up cleanup compares them with the rows)', async () => {
    const store = make();
    const keys = ['photos/21/listed-aaaa-0001.jpg', 'photos/22/listed-aaaa-0002.png'];
    for (const key of keys) await store.put(key, new Uint8Array([1]), 'image/jpeg');
    expect(await store.keys()).toEqual(expect.arrayContaining(keys));
    await store.remove(keys[0]!);
    expect(await store.keys()).not.toContain(keys[0]);
  });

  it('refuses keys it did not make: folder climbs, absolute paths, other extensions', async () => {
    const store = make();
    for (const key of ['../../etc/passwd', '/tmp/x.jpg', 'photos/1/../../x.jpg', 'photos/1/abcdefgh.exe', 'photos/x/abcdefgh.jpg']) {
      await expect(store.put(key, new Uint8Array([1]), 'image/jpeg'), key).rejects.toThrow(/not a photo key/);
      await expect(store.get(key), key).rejects.toThrow(/not a photo key/);
    }
  });
});

describe('local disk store', () => {
  it('leaves no temporary file beside the photo once a write is done', async () => {
    const root = tempFolder();
    const store = localDiskStore(root);
    await store.put('photos/3/tidy-0000-1111.jpg', new Uint8Array([9, 9, 9]), 'image/jpeg');
    expect(readdirSync(path.join(root, 'photos', '3'))).toEqual(['tidy-0000-1111.jpg']);
  });

  it('removes, when listing at start-up, the temporary file of a write a killed process never finished', async () => {
    const root = tempFolder();
    const store = localDiskStore(root);
    await store.put('photos/3/whole-0000-1111.jpg', new Uint8Array([9]), 'image/jpeg');
    writeFileSync(path.join(root, 'photos', '3', '.5b0e2c1a-half.part'), 'half a photo');
    expect(await store.keys()).toEqual(['photos/3/whole-0000-1111.jpg']);
    expect(readdirSync(path.join(root, 'photos', '3'))).toEqual(['whole-0000-1111.jpg']);
  });
});
