import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import { createS3Storage, type S3StorageConfig } from '@/lib/storage';

/**
 * A local fake S3 server (s3rver) on 127.0.0.1 and a free port, with one
 * bucket, its files in a temporary directory. `stop()` closes it and removes them.
 */
export async function startFakeS3(bucket = 'trialbed-test') {
  const directory = mkdtempSync(path.join(os.tmpdir(), 'trialbed-s3-'));
  const server = new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory, configureBuckets: [{ name: bucket }] });
  const { port } = await server.run();
  const endpoint = `http://127.0.0.1:${port}`;
  // s3rver accepts these fixed credentials.
  const config: S3StorageConfig = { bucket, region: 'us-east-1', endpoint, accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER', forcePathStyle: true };
  return {
    endpoint,
    bucket,
    config,
    storage: createS3Storage(config),
    /** The variables that point the app at this server. */
    env: {
      STORAGE_DRIVER: 's3',
      S3_ENDPOINT: endpoint,
      S3_BUCKET: bucket,
      S3_REGION: 'us-east-1',
      S3_ACCESS_KEY_ID: 'S3RVER',
      S3_SECRET_ACCESS_KEY: 'S3RVER',
      S3_FORCE_PATH_STYLE: '1',
    },
    stop: async () => {
      server.httpServer?.closeAllConnections();
      await server.close();
      rmSync(directory, { recursive: true, force: true });
    },
  };
}
