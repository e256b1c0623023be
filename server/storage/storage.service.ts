/** The `storage` service: the driver named by STORAGE_DRIVER, built once at boot. */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Config } from '../config';
import { createDiskStorage } from './disk-storage';
import { createS3Storage } from './s3-storage';
import type { Storage } from './storage';

const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

/** Default folder of the disk driver: the git-ignored .data/storage of the checkout. */
const defaultStorageDir = path.join(projectRoot, '.data', 'storage');

/** Build the configured storage driver. */
export function createStorageFromConfig(config: Pick<Config, 'env'>): Storage {
  const env = config.env;
  if (env.STORAGE_DRIVER === 's3') {
    if (!env.S3_BUCKET) throw new Error('Configuration error: STORAGE_DRIVER=s3 needs S3_BUCKET (and usually S3_ENDPOINT and keys).');
    return createS3Storage({
      endpoint: env.S3_ENDPOINT,
      bucket: env.S3_BUCKET,
      region: env.S3_REGION,
      accessKeyId: env.S3_ACCESS_KEY_ID,
      secretAccessKey: env.S3_SECRET_ACCESS_KEY,
      forcePathStyle: true,
    });
  }
  return createDiskStorage(env.STORAGE_DIR ? path.resolve(env.STORAGE_DIR) : defaultStorageDir);
}
