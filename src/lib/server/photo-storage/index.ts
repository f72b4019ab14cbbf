import { getConfig } from '../config';
import { localDiskStore } from './local-disk';
import type { PhotoStore } from './photo-store';
import { s3Store } from './s3';

export type { PhotoStore } from './photo-store';

let store: PhotoStore | undefined;

/** The configured photo store: S3 when PHOTO_S3_BUCKET is set, else files under DATA_DIR. */
export function photoStore(): PhotoStore {
  if (store) return store;
  const config = getConfig();
  store = config.photoS3 ? s3Store(config.photoS3) : localDiskStore(config.dataDir);
  return store;
}
