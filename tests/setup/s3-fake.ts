import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import { createStorage } from '../../server/adapters/storage/create-storage';

export interface S3Fake {
  /** http://127.0.0.1:<port>, for S3_ENDPOINT (with path-style addressing). */
  endpoint: string;
  bucket: string;
  region: string;
  /** s3rver checks signatures against its one built-in account. */
  credentials: { accessKeyId: string; secretAccessKey: string };
  /** The fake's data folder, to look for leftovers. */
  directory: string;
  stop(): Promise<void>;
}

/** An S3-compatible server in this process, on a free port, storing into a temporary folder. */
export async function startS3Fake(bucket = 'likeness-test'): Promise<S3Fake> {
  const directory = await mkdtemp(path.join(os.tmpdir(), 'likeness-s3-'));
  const server = new S3rver({
    address: '127.0.0.1',
    port: 0,
    silent: true,
    directory,
    configureBuckets: [{ name: bucket }],
  });
  const address = await server.run();
  return {
    endpoint: `http://127.0.0.1:${address.port}`,
    bucket,
    region: 'us-east-1',
    credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
    directory,
    async stop() {
      await server.close();
      await rm(directory, { recursive: true, force: true });
    },
  };
}

/** The app's S3 storage pointed at a running fake. */
export function s3StorageFor(fake: S3Fake) {
  return createStorage(
    {
      kind: 's3',
      bucket: fake.bucket,
      region: fake.region,
      endpoint: fake.endpoint,
      forcePathStyle: true,
    },
    { credentials: fake.credentials },
  );
}
