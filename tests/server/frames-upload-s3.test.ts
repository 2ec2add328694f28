import { createHash } from 'node:crypto';
import { buffer as streamToBuffer } from 'node:stream/consumers';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertStaff } from '../factories/accounts';
import { insertDayWithStations } from '../factories/shoot-days';
import { s3StorageFor, startS3Fake, type S3Fake } from '../setup/s3-fake';
import { startTestApp, type TestApp } from '../setup/test-app';
import { cameraJpeg, dcfName } from '../support/camera-cards';
import { runQueuedJobs } from './booking-jobs';
import { signedInAgent } from './helpers';
import { createUpload, openTusSession, patchUpload, type TusSession } from './tus-client';

// The same upload and ingest path as frames-upload.test.ts, with originals and previews in an
// S3 bucket (the s3rver fake) instead of on local disk.
let fake: S3Fake;
let t: TestApp;
let session: TusSession;
let day: Awaited<ReturnType<typeof insertDayWithStations>>;
let photographerEmail: string;

beforeAll(async () => {
  fake = await startS3Fake();
  const storage = s3StorageFor(fake);
  t = await startTestApp({ storage });
  const client = await insertClient(t.db);
  const office = await insertOffice(t.db, client.id);
  const photographer = await insertStaff(t.db, { role: 'photographer' });
  photographerEmail = photographer.email;
  day = await insertDayWithStations(t.db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [photographer.id],
  });
  session = await openTusSession(t, photographer.email);
});
afterAll(async () => {
  await session?.close();
  await t?.storage.close();
  await t?.close();
  await fake?.stop();
});

describe('frames on S3-compatible storage', () => {
  it('stores the original byte for byte, reads it in the job and serves the preview', async () => {
    const bytes = await cameraJpeg({
      width: 2000,
      height: 1500,
      serial: 'CV-S3',
      dateTimeOriginal: '2027:03:04 11:00:00',
    });
    const created = await createUpload(
      session,
      { dayId: day.dayId, stationId: day.stations[0]!.id, cardPath: dcfName(100, 1) },
      bytes.length,
    );
    expect(created.status).toBe(201);
    expect((await patchUpload(session, created.url!, 0, bytes)).status).toBe(204);
    const frame = await t.db.selectFrom('frames').selectAll().executeTakeFirstOrThrow();
    const stored = await streamToBuffer(await t.storage.read(frame.originalKey));
    expect(createHash('sha256').update(stored).digest('hex')).toBe(frame.contentSha256);

    await runQueuedJobs(t);
    const read = await t.db.selectFrom('frames').selectAll().executeTakeFirstOrThrow();
    expect(read).toMatchObject({ ingestStatus: 'read', cameraSerial: 'CV-S3' });
    expect(await t.storage.stat(read.previewKey!)).not.toBeNull();
    const agent = await signedInAgent(t, photographerEmail);
    const preview = await agent.get(`/api/frames/${read.id}/preview`).expect(200);
    expect(preview.headers['content-type']).toBe('image/jpeg');
  });
});
