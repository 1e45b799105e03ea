import { DeleteObjectCommand, GetObjectCommand, NoSuchKey, PutObjectCommand, S3Client, S3ServiceException } from '@aws-sdk/client-s3';
import { assertStorageKey, contentTypeOfKey } from './keys';
import type { Storage } from './types';

/** Settings of an S3-compatible bucket (from lib/env.ts in the app, explicit in tests). */
export interface S3StorageConfig {
  bucket: string;
  region: string;
  /** Empty or undefined: AWS itself. */
  endpoint?: string;
  accessKeyId?: string;
  secretAccessKey?: string;
  forcePathStyle?: boolean;
}

/** Photos as objects in an S3-compatible bucket (AWS S3, MinIO, Garage, Ceph …). */
export function createS3Storage(config: S3StorageConfig): Storage {
  const client = new S3Client({
    region: config.region,
    ...(config.endpoint ? { endpoint: config.endpoint } : {}),
    forcePathStyle: config.forcePathStyle ?? false,
    ...(config.accessKeyId && config.secretAccessKey
      ? { credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey } }
      : {}),
  });
  const Bucket = config.bucket;
  return {
    driver: 's3',
    async put(key, body, contentType) {
      assertStorageKey(key);
      await client.send(new PutObjectCommand({ Bucket, Key: key, Body: body, ContentType: contentType, ContentLength: body.length }));
    },
    async get(key) {
      assertStorageKey(key);
      try {
        const res = await client.send(new GetObjectCommand({ Bucket, Key: key }));
        if (!res.Body) return null;
        const bytes = await res.Body.transformToByteArray();
        return { body: Buffer.from(bytes), contentType: res.ContentType || contentTypeOfKey(key) };
      } catch (err) {
        if (err instanceof NoSuchKey) return null;
        if (err instanceof S3ServiceException && (err.name === 'NoSuchKey' || err.$metadata?.httpStatusCode === 404)) return null;
        throw err;
      }
    },
    async delete(key) {
      assertStorageKey(key);
      await client.send(new DeleteObjectCommand({ Bucket, Key: key }));
    },
  };
}
