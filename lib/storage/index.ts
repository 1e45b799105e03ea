import 'server-only';
import path from 'node:path';
import { getEnv } from '@/lib/env';
import { createLocalStorage } from './local';
import { createS3Storage } from './s3';
import type { Storage } from './types';

export type { Storage, StoredObject } from './types';
export { createLocalStorage } from './local';
export { createS3Storage, type S3StorageConfig } from './s3';
export { IMAGE_TYPES, assertStorageKey, contentTypeOfKey, isStorageKey, newPhotoKeys, type ImageFormat } from './keys';

let cached: Storage | null = null;

/**
 * The storage the app is configured for (lib/env.ts): the local disk under
 * DATA_DIR/uploads, or the S3-compatible bucket when STORAGE_DRIVER=s3.
 * Made once per process.
 */
export function getStorage(): Storage {
  if (cached) return cached;
  const env = getEnv();
  cached =
    env.STORAGE_DRIVER === 's3'
      ? createS3Storage({
          bucket: env.S3_BUCKET,
          region: env.S3_REGION,
          endpoint: env.S3_ENDPOINT || undefined,
          accessKeyId: env.S3_ACCESS_KEY_ID || undefined,
          secretAccessKey: env.S3_SECRET_ACCESS_KEY || undefined,
          forcePathStyle: env.S3_FORCE_PATH_STYLE === '1',
        })
      : createLocalStorage(path.join(path.resolve(env.DATA_DIR), 'uploads'));
  return cached;
}
