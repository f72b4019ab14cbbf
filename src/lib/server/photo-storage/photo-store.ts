/**
 * Where inspection photos are kept. A key is a relative name like `photos/12/ab12….jpg`; the
 * database stores keys, never paths or URLs, so a store can be swapped.
 */
export interface PhotoStore {
  readonly kind: 'local-disk' | 's3';
  /** Writes an object; resolves once it is durable (on disk and synced, or acknowledged by S3). */
  put(key: string, bytes: Uint8Array, contentType: string): Promise<void>;
  /** The object's bytes, or null when there is none under the key. */
  get(key: string): Promise<Uint8Array | null>;
  /** Removes an object; removing a missing one is not an error. */
  remove(key: string): Promise<void>;
}

/** Keys are made by the server; anything else (a folder climb, an absolute path) is refused. */
export function checkPhotoKey(key: string): string {
  if (!/^photos\/\d{1,12}\/[a-z0-9-]{8,64}\.(jpg|png|webp)$/.test(key)) throw new Error(`not a photo key: ${key}`);
  return key;
}
