import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { s3StorageFor, startS3Fake, type S3Fake } from '../setup/s3-fake';
import { startTestApp, type TestApp } from '../setup/test-app';

// /api/ready tells a load balancer whether this process can work: database and storage both
// answer. Storage here is the S3 fake, stopped to play an unreachable bucket.

let fake: S3Fake;
let t: TestApp;

beforeAll(async () => {
  fake = await startS3Fake();
  t = await startTestApp({ storage: s3StorageFor(fake) });
});

afterAll(async () => {
  await t.close();
});

describe('readiness', () => {
  it('is ready while database and storage answer, and not while storage is unreachable', async () => {
    const ready = await request(t.app).get('/api/ready').expect(200);
    expect(ready.body).toEqual({
      ready: true,
      database: 'up',
      storage: 'up',
      queue: 'off',
      draining: false,
    });
    expect(ready.headers['cache-control']).toBe('no-store');

    await fake.stop();
    const notReady = await request(t.app).get('/api/ready').expect(503);
    expect(notReady.body).toEqual({
      ready: false,
      database: 'up',
      storage: 'down',
      queue: 'off',
      draining: false,
    });
    expect(notReady.headers['retry-after']).toBe('5');
    // Liveness stays about the process and its database.
    await request(t.app).get('/api/health').expect(200);
  });
});
