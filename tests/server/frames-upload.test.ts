import { createHash } from 'node:crypto';
import { readdirSync } from 'node:fs';
import { buffer as streamToBuffer } from 'node:stream/consumers';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createLogger } from '../../server/lib/logger';
import { frameTasks } from '../../server/modules/frames/frame-tasks';
import { INGEST_FRAME_TASK } from '../../server/modules/frames/frames.service';
import { insertClient, insertOffice, insertStaff } from '../factories/accounts';
import { insertDayWithStations } from '../factories/shoot-days';
import { startTestApp, type TestApp } from '../setup/test-app';
import {
  cameraJpeg,
  cameraRaw,
  decompressionBomb,
  dcfName,
  pngImage,
  truncated,
} from '../support/camera-cards';
import { runQueuedJobs } from './booking-jobs';
import { signedInAgent } from './helpers';
import {
  createUpload,
  openTusSession,
  patchAndDrop,
  patchUpload,
  uploadOffset,
  type TusSession,
} from './tus-client';

const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');

let t: TestApp;
let day: Awaited<ReturnType<typeof insertDayWithStations>>;
let photographer: TusSession;
let stranger: TusSession;
let coordinator: TusSession;
let strangerEmail: string;

beforeAll(async () => {
  t = await startTestApp();
  const client = await insertClient(t.db);
  const office = await insertOffice(t.db, client.id);
  const assigned = await insertStaff(t.db, { role: 'photographer' });
  const other = await insertStaff(t.db, { role: 'photographer' });
  strangerEmail = other.email;
  day = await insertDayWithStations(t.db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [assigned.id, null],
  });
  photographer = await openTusSession(t, assigned.email);
  stranger = await openTusSession(t, other.email);
  coordinator = await openTusSession(
    t,
    (await insertStaff(t.db, { role: 'coordinator', clientId: client.id })).email,
  );
});
afterAll(async () => {
  await photographer?.close();
  await stranger?.close();
  await coordinator?.close();
  await t?.close();
});

const stationId = () => day.stations[0]!.id;
const metadataFor = (cardPath: string, extra: Record<string, string> = {}) => ({
  dayId: day.dayId,
  stationId: stationId(),
  cardPath,
  ...extra,
});

async function uploadWhole(session: TusSession, cardPath: string, bytes: Buffer) {
  const created = await createUpload(session, metadataFor(cardPath), bytes.length);
  expect(created.status, created.body).toBe(201);
  return patchUpload(session, created.url!, 0, bytes);
}

const frameRows = () =>
  t.db.selectFrom('frames').selectAll().where('dayId', '=', day.dayId).execute();

describe('uploading a card over tus (tus 1.0 resumable upload protocol)', () => {
  it('stores a frame, reads its capture data and slate in the job, and serves its thumbnail', async () => {
    const token = 'KQ2ZL7MXR4TB6NVP3HWJ5DYC2A';
    const bytes = await cameraJpeg({
      width: 3000,
      height: 2000,
      slateToken: token,
      dateTimeOriginal: '2027:03:04 09:15:02',
      subSecTimeOriginal: '13',
      offsetTimeOriginal: '+00:00',
      serial: 'CV-000123',
    });
    const cardPath = dcfName(100, 1);
    const finished = await uploadWhole(photographer, cardPath, bytes);
    expect(finished.status).toBe(204);
    expect(finished.headers.get('likeness-upload-outcome')).toBe('stored');

    const [frame] = (await frameRows()).filter((row) => row.cardPath === cardPath);
    expect(frame).toMatchObject({
      contentSha256: sha256(bytes),
      format: 'jpeg',
      dcfFolder: 100,
      dcfNumber: 1,
      dcfStem: 'HPE_',
      ingestStatus: 'waiting',
    });
    // The original is kept byte for byte.
    const stored = await streamToBuffer(await t.storage.read(frame!.originalKey));
    expect(sha256(stored)).toBe(sha256(bytes));
    // tus's in-flight copy is gone once the original is stored.
    expect(readdirSync(t.uploadFolder)).toEqual([]);

    await runQueuedJobs(t);
    const read = await t.db
      .selectFrom('frames')
      .selectAll()
      .where('id', '=', frame!.id)
      .executeTakeFirstOrThrow();
    expect(read).toMatchObject({
      ingestStatus: 'read',
      // The camera's wall clock as written (Exif DateTimeOriginal + SubSecTimeOriginal "13" = 0.13 s).
      capturedLocal: '2027-03-04 09:15:02.13',
      captureOffset: '+00:00',
      cameraSerial: 'CV-000123',
      cameraMake: 'Corvane',
      pixelWidth: 3000,
      pixelHeight: 2000,
      slateToken: token,
    });

    const admin = await signedInAgent(t, (await insertStaff(t.db)).email);
    const thumbnail = await admin.get(`/api/frames/${frame!.id}/thumbnail`).expect(200);
    expect(thumbnail.headers['content-type']).toBe('image/jpeg');
    const listed = await admin.get(`/api/days/${day.dayId}/frames`).expect(200);
    expect(listed.body.frames[0]).toMatchObject({
      cardPath,
      capturedLocal: '2027-03-04T09:15:02.130',
      slateToken: token,
    });
    // Coordinators and unassigned photographers see no frames.
    const outsider = await signedInAgent(t, strangerEmail);
    await outsider.get(`/api/frames/${frame!.id}/thumbnail`).expect(403);
    await outsider.get(`/api/days/${day.dayId}/frames`).expect(403);
  });

  it('resumes a transfer cut off midway and keeps the exact bytes (SHA-256)', async () => {
    const bytes = await cameraJpeg({ width: 2400, height: 1600, shade: 90 });
    const cardPath = dcfName(100, 2);
    const created = await createUpload(photographer, metadataFor(cardPath), bytes.length);
    expect(created.status).toBe(201);
    await patchAndDrop(photographer, created.url!, 0, bytes, Math.floor(bytes.length * 0.4));
    const { offset } = await uploadOffset(photographer, created.url!);
    expect(offset).toBeGreaterThan(0);
    expect(offset).toBeLessThan(bytes.length);
    const rest = await patchUpload(photographer, created.url!, offset, bytes.subarray(offset));
    expect(rest.status).toBe(204);
    const frame = (await frameRows()).find((row) => row.cardPath === cardPath);
    const stored = await streamToBuffer(await t.storage.read(frame!.originalKey));
    expect(sha256(stored)).toBe(sha256(bytes));
  });

  it('recognises the same file from the same card path and keeps it once', async () => {
    const bytes = await cameraJpeg({ shade: 60 });
    const cardPath = dcfName(101, 5);
    await uploadWhole(photographer, cardPath, bytes);
    const again = await uploadWhole(photographer, cardPath, bytes);
    expect(again.status).toBe(204);
    expect(again.headers.get('likeness-upload-outcome')).toBe('duplicate');
    expect((await frameRows()).filter((row) => row.cardPath === cardPath)).toHaveLength(1);
    // The same name after a card reset is another frame: different content, kept.
    await uploadWhole(photographer, cardPath, await cameraJpeg({ shade: 61 }));
    expect((await frameRows()).filter((row) => row.cardPath === cardPath)).toHaveLength(2);
    // The same bytes chosen again under another name ("Choose files" gives the bare file
    // name): the same photo, kept once, and the upload page's pre-check knows it too.
    const renamed = await uploadWhole(photographer, 'HPE_0005.JPG', bytes);
    expect(renamed.headers.get('likeness-upload-outcome')).toBe('duplicate');
    expect((await frameRows()).filter((row) => row.cardPath === 'HPE_0005.JPG')).toEqual([]);
    const known = await fetch(`${photographer.origin}/api/days/${day.dayId}/frames/known`, {
      method: 'POST',
      headers: { cookie: photographer.cookie, 'Content-Type': 'application/json' },
      body: JSON.stringify({ files: [{ cardPath: 'copy/HPE_0005.JPG', sha256: sha256(bytes) }] }),
    });
    expect(known.status).toBe(200);
    expect((await known.json()).known).toEqual([
      { cardPath: 'copy/HPE_0005.JPG', sha256: sha256(bytes) },
    ]);
  });

  it('pairs a raw file with the JPEG of the same name and number (DCF, JEITA CP-3461)', async () => {
    const spec = { dateTimeOriginal: '2027:03:04 10:00:00', serial: 'CV-000123', shade: 150 };
    await uploadWhole(photographer, dcfName(102, 7, 'HPE_', 'JPG'), await cameraJpeg(spec));
    const raw = await uploadWhole(
      photographer,
      dcfName(102, 7, 'HPE_', 'DNG'),
      await cameraRaw(spec),
    );
    expect(raw.status).toBe(204);
    const rows = (await frameRows()).filter((row) => row.dcfFolder === 102);
    const jpeg = rows.find((row) => row.format === 'jpeg');
    const rawRow = rows.find((row) => row.format === 'raw');
    expect(rawRow?.pairedWithFrameId).toBe(jpeg?.id);
    await runQueuedJobs(t);
    const readRaw = await t.db
      .selectFrom('frames')
      .selectAll()
      .where('id', '=', rawRow!.id)
      .executeTakeFirstOrThrow();
    // The raw file's own EXIF gives its capture data; its embedded JPEG gives the preview.
    expect(readRaw).toMatchObject({
      ingestStatus: 'read',
      capturedLocal: '2027-03-04 10:00:00',
      cameraSerial: 'CV-000123',
      noPreview: false,
    });
    const alone = await uploadWhole(
      photographer,
      dcfName(102, 9, 'HPE_', 'DNG'),
      await cameraRaw(spec, false),
    );
    expect(alone.status).toBe(204);
    await runQueuedJobs(t);
    const lonely = (await frameRows()).find((row) => row.dcfNumber === 9 && row.dcfFolder === 102);
    expect(lonely).toMatchObject({
      ingestStatus: 'read',
      noPreview: true,
      pairedWithFrameId: null,
    });
  });

  it('accepts a HEIF frame (ISO/IEC 23008-12, AV1-coded: what sharp reads here)', async () => {
    const bytes = await sharp(await cameraJpeg({ shade: 170 }))
      .heif({ compression: 'av1' })
      .toBuffer();
    const cardPath = dcfName(104, 1, 'HPE_', 'HIF');
    expect((await uploadWhole(photographer, cardPath, bytes)).status).toBe(204);
    await runQueuedJobs(t);
    const frame = (await frameRows()).find((row) => row.cardPath === cardPath);
    expect(frame).toMatchObject({ format: 'heif', ingestStatus: 'read', noPreview: false });
  });

  it('reads a frame once however often its job runs (a retry after a crash)', async () => {
    const bytes = await cameraJpeg({ shade: 33, serial: 'CV-RETRY' });
    const cardPath = dcfName(105, 1);
    await uploadWhole(photographer, cardPath, bytes);
    const frame = (await frameRows()).find((row) => row.cardPath === cardPath)!;
    const ingest = frameTasks({
      db: t.db,
      storage: t.storage,
      maxPixels: 100_000_000,
      logger: createLogger('silent'),
    })[INGEST_FRAME_TASK]!;
    // As if a worker died mid-read and the job came round again: both runs leave one good row.
    await t.db
      .updateTable('frames')
      .set({ ingestStatus: 'reading' })
      .where('id', '=', frame.id)
      .execute();
    await ingest({ frameId: frame.id }, { lastAttempt: false });
    await ingest({ frameId: frame.id }, { lastAttempt: false });
    await runQueuedJobs(t);
    const rows = (await frameRows()).filter((row) => row.cardPath === cardPath);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ ingestStatus: 'read', cameraSerial: 'CV-RETRY' });
  });

  it.each([
    ['a PNG renamed .JPG', () => pngImage(), /not a camera frame/],
    ['a truncated JPEG', async () => truncated(await cameraJpeg({ shade: 40 })), /truncated/],
    [
      'a decompression bomb',
      () => decompressionBomb(),
      /20000 × 20000 pixels .* over the 100 MP limit/,
    ],
  ])('refuses %s with a clear message and stores nothing', async (_label, make, message) => {
    const bytes = await make();
    const cardPath = `DCIM/103HPENG/BAD_${String(bytes.length % 9999).padStart(4, '0')}.JPG`;
    const before = (await frameRows()).length;
    const answer = await uploadWhole(photographer, cardPath, bytes);
    expect(answer.status).toBe(422);
    expect(JSON.parse(answer.body).error.message).toMatch(message);
    expect((await frameRows()).length).toBe(before);
    expect(readdirSync(t.uploadFolder)).toEqual([]);
  });

  it('refuses a file over the size limit before any byte is sent', async () => {
    const created = await createUpload(
      photographer,
      metadataFor('DCIM/100HPENG/BIG_0001.JPG'),
      250_000_000,
    );
    expect(created.status).toBe(413);
    expect(JSON.parse(created.body).error.message).toMatch(/over the 200 MB limit/);
  });

  it('lets only the studio admin and the day’s photographers upload, from this site', async () => {
    const path = 'DCIM/100HPENG/WHO_0001.JPG';
    expect((await createUpload(stranger, metadataFor(path), 100)).status).toBe(403);
    expect((await createUpload(coordinator, metadataFor(path), 100)).status).toBe(403);
    const anonymous = { ...photographer, cookie: '' };
    expect((await createUpload(anonymous, metadataFor(path), 100)).status).toBe(401);
    const foreign = await createUpload(photographer, metadataFor(path), 100, {
      Origin: 'https://elsewhere.example',
    });
    expect(foreign.status).toBe(403);
    // Someone else's upload cannot be continued, nor even found.
    const mine = await createUpload(photographer, metadataFor(path), 10);
    expect(mine.status).toBe(201);
    const hijack = await patchUpload(photographer, mine.url!, 0, Buffer.alloc(10), stranger.cookie);
    expect(hijack.status).toBe(404);
    expect((await uploadOffset(stranger, mine.url!)).status).toBe(404);
  });

  it.each([
    ['a control character in the path', 'DCIM/100HPENG/A\u0000B_0001.JPG'],
    ['a path that climbs out of the card', 'DCIM/../../etc/passwd'],
    ['an empty path', ''],
  ])('refuses %s with 400', async (_label, cardPath) => {
    const created = await createUpload(photographer, metadataFor(cardPath), 100);
    expect(created.status).toBe(400);
    expect(JSON.parse(created.body).error.code).toBe('invalid_input');
  });

  it('refuses bad input to the frames routes with a 4xx', async () => {
    const admin = await signedInAgent(t, (await insertStaff(t.db)).email);
    const known = `/api/days/${day.dayId}/frames/known`;
    const sha = 'a'.repeat(64);
    for (const body of [
      { files: [{ cardPath: 'DCIM/100HPENG/A\u0000B_0001.JPG', sha256: sha }] },
      { files: [{ cardPath: 'x'.repeat(5000), sha256: sha }] },
      { files: [{ cardPath: 'DCIM/100HPENG/HPE_0001.JPG', sha256: 'not hex' }] },
      { files: 'everything' },
      { files: [{ cardPath: 42, sha256: sha }] },
    ]) {
      await admin.post(known).send(body).expect(400);
    }
    for (const query of ['page=0', 'page=abc', 'pageSize=100000', 'stationId=%00', 'status=lost']) {
      await admin.get(`/api/days/${day.dayId}/frames?${query}`).expect(400);
    }
    await admin.get('/api/days/not-a-day/frames').expect(404);
    await admin.get('/api/frames/not-a-frame/original').expect(404);
  });

  it('keeps the JSON-only guard for the rest of the API', async () => {
    await request(t.app)
      .post('/api/session')
      .set('Content-Type', 'application/offset+octet-stream')
      .send(Buffer.from('x'))
      .expect(415);
  });
});
