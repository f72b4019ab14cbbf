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
  /**
   * Every photo key in the store, for the start-up cleanup. A local store also removes the
   * temporary files of writes a killed process never finished (no write runs at start-up).
   */
  keys(): Promise<string[]>;
}

/** Keys are made by the server; anything else (a folder climb, an absolute path) is refused. */
export function checkPhotoKey(key: string): string {
  if (!isPhotoKey(key)) throw new Error(`not a photo key: ${key}`);
  return key;
}

export function isPhotoKey(key: string): boolean {
  return /^photos\/\d{1,12}\/[a-z0-9-]{8,64}\.(jpg|png|webp)$/.test(key);
}
