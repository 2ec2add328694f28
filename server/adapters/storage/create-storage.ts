import type { StorageSettings } from '../../config';
import { LocalStorage } from './local-storage';
import { S3Storage, type S3StorageOptions } from './s3-storage';
import type { ObjectStorage } from './storage';

/**
 * The storage the settings ask for: `createStorage(config.storage)`. `s3Overrides` is for tests
 * against a fake (its credentials); production leaves credentials to the SDK's default chain.
 */
export function createStorage(
  settings: StorageSettings,
  s3Overrides: Pick<S3StorageOptions, 'credentials' | 'partSize'> = {},
): ObjectStorage {
  switch (settings.kind) {
    case 'local':
      return new LocalStorage(settings.root);
    case 's3':
      return new S3Storage({ ...settings, ...s3Overrides });
  }
}
