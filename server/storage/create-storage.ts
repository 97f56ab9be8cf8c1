import { join } from 'node:path';
import type { Env } from '../env';
import { projectRoot } from '../paths';
import { createLocalStorage } from './local-storage';
import { createS3Storage } from './s3-storage';
import type { ObjectStorage } from './storage';

/** The capture storage the environment asks for (STORAGE=local|s3; README "Capture storage"). */
export function createStorage(env: Env): ObjectStorage {
  if (env.STORAGE === 's3') {
    return createS3Storage({
      bucket: env.S3_BUCKET!, endpoint: env.S3_ENDPOINT, region: env.S3_REGION,
      accessKeyId: env.S3_ACCESS_KEY_ID!, secretAccessKey: env.S3_SECRET_ACCESS_KEY!, prefix: env.S3_PREFIX,
    });
  }
  return createLocalStorage(env.STORAGE_DIR ?? join(projectRoot(), '.data', 'captures'));
}
