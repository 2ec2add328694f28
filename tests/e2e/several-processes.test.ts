import { execFileSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { existsSync, mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startMailCatcher, type MailCatcher } from '../../server/adapters/mail/mail-catcher';
import { proofFramesOf } from '../../server/modules/proofs/proofs.repository';
import { freePort } from '../../scripts/lib/postgres-cluster';
import {
  insertClient,
  insertOffice,
  insertPerson,
  insertStaff,
  TEST_PASSWORD,
} from '../factories/accounts';
import { insertDay } from '../factories/days';
import { action } from '../server/console-support';
import { linkTokenFrom } from '../server/helpers';
import { createUpload, patchUpload, uploadOffset, type TusSession } from '../server/tus-client';
import { startS3Fake, type S3Fake } from '../setup/s3-fake';
import { createTestDatabase, type TestDatabase } from '../setup/test-database';
import { startBuiltProcess, waitUntilReady, type BuiltProcess } from '../support/built-process';
import { debianPortrait, placePortrait } from '../support/debian-portrait';
import { cardFileBytes, planCard } from '../support/shoot-day-card';

// Two web processes and one worker from the build, on one PostgreSQL, the S3 fake and one
// shared upload folder, run a day between them: nothing a request needs lives in one process.

const root = path.resolve(import.meta.dirname, '../..');
let database: TestDatabase;
let s3: S3Fake;
let catcher: MailCatcher;
let scratch: string;
const processes: BuiltProcess[] = [];
let webA: string;
let webB: string;
let processB: BuiltProcess;

async function startProcess(role: 'web' | 'worker', port: number, healthPort?: number) {
  const started = startBuiltProcess({
    cwd: root,
    command: process.execPath,
    args: ['dist/server/main.js'],
    env: {
      PROCESS_ROLE: role,
      DATABASE_URL: database.url,
      SMTP_URL: catcher.smtpUrl,
      PUBLIC_URL: `http://127.0.0.1:${port}`,
      URL_SIGNING_SECRET: 'one-secret-shared-by-every-process-here',
      HOST: '127.0.0.1',
      PORT: String(port),
      ...(healthPort ? { HEALTH_PORT: String(healthPort) } : {}),
      STORAGE: 's3',
      S3_BUCKET: s3.bucket,
      S3_REGION: s3.region,
      S3_ENDPOINT: s3.endpoint,
      S3_FORCE_PATH_STYLE: 'true',
      AWS_ACCESS_KEY_ID: s3.credentials.accessKeyId,
      AWS_SECRET_ACCESS_KEY: s3.credentials.secretAccessKey,
      UPLOAD_SPOOL_DIR: path.join(scratch, 'shared-uploads'),
      LIKENESS_DATA_DIR: path.join(scratch, `data-${port}`),
      DRAIN_SECONDS: '20',
      LOG_LEVEL: 'warn',
    },
  });
  processes.push(started);
  await started.waitFor(/Running as a worker|is serving/);
  return started;
}

beforeAll(async () => {
  scratch = mkdtempSync(path.join(os.tmpdir(), 'likeness-processes-'));
  database = await createTestDatabase();
  s3 = await startS3Fake();
  catcher = await startMailCatcher(0);
  const [portA, portB, workerHealth] = [await freePort(), await freePort(), await freePort()];
  webA = `http://127.0.0.1:${portA}`;
  webB = `http://127.0.0.1:${portB}`;
  await startProcess('web', portA);
  processB = await startProcess('web', portB);
  await startProcess('worker', 0, workerHealth);
  await Promise.all([waitUntilReady(webA), waitUntilReady(webB)]);
  const worker = await fetch(`http://127.0.0.1:${workerHealth}/api/ready`);
  expect(await worker.json()).toMatchObject({ ready: true, queue: 'up', draining: false });
}, 120_000);

afterAll(async () => {
  for (const running of processes) running.kill();
  await catcher?.close();
  await s3?.stop();
  await database?.drop();
  rmSync(scratch, { recursive: true, force: true });
});

/** JSON over fetch as the browser app sends it: same-origin, with the session cookie. */
function client(base: string, cookie = '') {
  return async (method: string, url: string, body?: unknown) => {
    const response = await fetch(`${base}/api${url}`, {
      method,
      headers: {
        origin: base,
        cookie,
        ...(body === undefined ? {} : { 'content-type': 'application/json' }),
      },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const text = await response.text();
    return { status: response.status, body: text ? (JSON.parse(text) as never) : null, text };
  };
}

async function signIn(base: string, email: string): Promise<string> {
  const answer = await fetch(`${base}/api/session`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: base },
    body: JSON.stringify({ email, password: TEST_PASSWORD }),
  });
  expect(answer.status).toBe(201);
  return (answer.headers.get('set-cookie') ?? '').split(';')[0]!;
}

/** Reads a server-sent event stream until `event: <name>` arrives. */
async function openEvents(url: string, cookie: string) {
  const response = await fetch(url, { headers: { cookie } });
  expect(response.status).toBe(200);
  const reader = response.body!.getReader();
  let text = '';
  const decoder = new TextDecoder();
  const until = async (event: string) => {
    while (!text.includes(`event: ${event}`)) {
      const chunk = await reader.read();
      if (chunk.done) throw new Error(`the stream ended before "${event}"`);
      text += decoder.decode(chunk.value);
    }
  };
  return { until, close: () => reader.cancel() };
}

describe('two web processes and a worker serving one studio', () => {
  it('runs a day across them, from booking to the delivered set', async () => {
    const { db } = database;
    const clientRow = await insertClient(db, { name: 'Quillfield Mutual' });
    const office = await insertOffice(db, clientRow.id, 'Leeds', 'Europe/London');
    const photographer = await insertStaff(db, { role: 'photographer' });
    const admin = await insertStaff(db, { role: 'studio_admin' });
    const coordinator = await insertStaff(db, { role: 'coordinator', clientId: clientRow.id });
    const day = await insertDay(db, {
      clientId: clientRow.id,
      officeId: office.id,
      photographerIds: [photographer.id],
    });
    const stationId = day.stations[0]!.id;
    const sitter = await insertPerson(db, clientRow.id, { officeId: office.id });

    // Booked on A; the confirmation is mailed by the worker.
    const hr = client(webA, await signIn(webA, coordinator.email));
    const booked = await hr('POST', '/bookings', {
      dayId: day.id,
      personId: sitter.id,
      startsAt: '2030-03-14T09:00:00.000Z',
    });
    expect(booked.status, booked.text).toBe(201);
    await catcher.waitFor(sitter.email);

    // The photographer signs in on B; the same session works on A (sessions are in PostgreSQL).
    const photographerCookie = await signIn(webB, photographer.email);
    const onA = client(webA, photographerCookie);
    const onB = client(webB, photographerCookie);
    expect((await onA('GET', '/session')).status).toBe(200);

    // A tablet listens on A; the other tablet checks in and runs the sitting on B.
    const events = await openEvents(
      `${webA}/api/days/${day.id}/console/events?stationId=${stationId}`,
      photographerCookie,
    );
    await events.until('ready');
    const plan = planCard({
      firstSittingAt: new Date('2030-03-14T09:01:00Z'),
      sittings: 1,
      framesPerSitting: 2,
      clockOffsetMs: 0,
      firstNumber: 120,
    });
    const planned = plan.sittings[0]!;
    const checkInId = randomUUID();
    const sittingId = randomUUID();
    const checkedIn = await onB(
      'POST',
      `/days/${day.id}/console/actions`,
      action('check_in_person', { stationId, checkInId, personId: sitter.id }, planned.startedAt),
    );
    expect(checkedIn.status, checkedIn.text).toBe(201);
    await events.until('changed');
    await events.close();
    for (const step of [
      action(
        'start_sitting',
        {
          stationId,
          sittingId,
          checkInId,
          slateToken: planned.slateToken,
          firstFrame: planned.firstFrame,
        },
        planned.startedAt,
      ),
      action(
        'finish_sitting',
        { stationId, sittingId, lastFrame: planned.lastFrame },
        planned.finishedAt,
      ),
    ]) {
      const sent = await onB('POST', `/days/${day.id}/console/actions`, step);
      expect(sent.status, sent.text).toBe(201);
    }

    // The card goes up through A; the first file is cut halfway and resumed on B.
    const tusA: TusSession = { origin: webA, cookie: photographerCookie, close: async () => {} };
    const tusB: TusSession = { origin: webB, cookie: photographerCookie, close: async () => {} };
    for (const [index, file] of plan.files.entries()) {
      const bytes = await cardFileBytes(file);
      const created = await createUpload(
        tusA,
        { dayId: day.id, stationId, cardPath: file.cardPath },
        bytes.length,
      );
      expect(created.status, created.body).toBe(201);
      const url = created.url!;
      if (index === 0) {
        const half = Math.floor(bytes.length / 2);
        expect((await patchUpload(tusA, url, 0, bytes.subarray(0, half))).status).toBe(204);
        const onOther = url.replace(webA, webB);
        expect((await uploadOffset(tusB, onOther)).offset).toBe(half);
        const rest = await patchUpload(tusB, onOther, half, bytes.subarray(half));
        expect(rest.status, rest.body).toBe(204);
        expect(rest.headers.get('likeness-upload-outcome')).toBe('stored');
      } else {
        expect((await patchUpload(tusA, url, 0, bytes)).status).toBe(204);
      }
    }

    // The worker reads every frame and matches the sitting's frames to the sitter.
    const matchedFrames = () => proofFramesOf(db, day.id, sitter.id);
    await expect
      .poll(async () => (await matchedFrames()).length, { timeout: 60_000, interval: 500 })
      .toBe(plan.files.filter((file) => file.sitting === 0 && !file.slate).length);

    // Proofs are released on A and mailed by the worker; the sitter opens the mail's link on B
    // and chooses there.
    const released = await onA('POST', `/days/${day.id}/proofs/release`, {});
    expect(released.status, released.text).toBe(201);
    const proofsMail = await catcher.waitFor(sitter.email, { subjectIncludes: 'ready to choose' });
    const redeemed = await fetch(`${webB}/api/sign-in-links/redeem`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: webB },
      body: JSON.stringify({ token: linkTokenFrom(proofsMail.text, 'link') }),
    });
    expect(redeemed.status).toBe(201);
    const asSitter = client(webB, (redeemed.headers.get('set-cookie') ?? '').split(';')[0]!);
    const frame = (await matchedFrames()).find((row) => row.cardPath === plan.files[2]!.cardPath);
    const picked = await asSitter('PUT', `/proofs/${day.id}/picks`, {
      picks: [{ frameId: frame!.id, note: null }],
    });
    expect(picked.status, picked.text).toBe(200);
    const pick = await db
      .selectFrom('picks')
      .select('id')
      .where('personId', '=', sitter.id)
      .executeTakeFirstOrThrow();

    // The retouched final (a real face) goes up on B; the look is set on A.
    const studio = client(webA, await signIn(webA, admin.email));
    const look = await studio('GET', `/clients/${clientRow.id}/look`);
    const presets = (look.body as unknown as { presets: Array<{ rendition: unknown }> }).presets;
    const saved = await studio('PUT', `/clients/${clientRow.id}/look`, {
      name: 'Staff directory',
      renditions: presets.map((preset) => preset.rendition),
      fileNameTemplate: '{employee_id}_{family}_{rendition}',
    });
    expect(saved.status, saved.text).toBe(200);
    const final = await placePortrait(await debianPortrait(), {
      frameWidth: 4000,
      frameHeight: 5000,
      left: 700,
      top: 1200,
      scale: 5,
      rollDeg: 0.5,
    });
    const finalUpload = await createUpload(
      tusB,
      { purpose: 'final', dayId: day.id, pickId: pick.id, cardPath: 'HPE_0122-Edit.jpg' },
      final.frame.length,
    );
    expect(finalUpload.status, finalUpload.body).toBe(201);
    expect((await patchUpload(tusB, finalUpload.url!, 0, final.frame)).status).toBe(204);

    // The worker finds the eyes and renders; the set is released on A, HR downloads it from B.
    expect((await onA('POST', `/days/${day.id}/set/prepare`)).status).toBe(202);
    await expect
      .poll(
        async () => {
          const set = await onB('GET', `/days/${day.id}/set`);
          const sitters = (
            set.body as unknown as { sitters: Array<{ renditions: Array<{ status: string }> }> }
          ).sitters;
          return sitters.flatMap((row) => row.renditions.map((rendition) => rendition.status));
        },
        { timeout: 120_000, interval: 1000 },
      )
      .toEqual(['rendered', 'rendered', 'rendered']);
    const delivered = await onA('POST', `/days/${day.id}/delivery/release`);
    expect(delivered.status, delivered.text).toBe(201);
    const zip = await fetch(`${webB}/api/days/${day.id}/delivery.zip`, {
      headers: { cookie: await signIn(webB, coordinator.email) },
    });
    expect(zip.status).toBe(200);
    const file = path.join(scratch, 'set.zip');
    writeFileSync(file, Buffer.from(await zip.arrayBuffer()));
    // Info-ZIP's unzip, an independent reader, checks every entry's CRC-32.
    expect(execFileSync('unzip', ['-t', file], { encoding: 'utf8' })).toMatch(/No errors detected/);
    const names = execFileSync('unzip', ['-Z1', file], { encoding: 'utf8' }).trim().split('\n');
    expect(names.filter((name) => name.endsWith('.jpg'))).toHaveLength(3);
  }, 300_000);

  it('drains when told to stop: an upload in flight finishes, new connections go elsewhere, the other process goes on', async () => {
    const { db } = database;
    const day = await db.selectFrom('shootDays').select('id').executeTakeFirstOrThrow();
    const station = await db
      .selectFrom('stations')
      .select('id')
      .where('dayId', '=', day.id)
      .executeTakeFirstOrThrow();
    const photographer = await db
      .selectFrom('users')
      .select('email')
      .where('role', '=', 'photographer')
      .executeTakeFirstOrThrow();
    const cookie = await signIn(webB, photographer.email);
    const tusB: TusSession = { origin: webB, cookie, close: async () => {} };
    const [file] = planCard({
      firstSittingAt: new Date('2030-03-14T11:00:00Z'),
      sittings: 1,
      framesPerSitting: 1,
      clockOffsetMs: 0,
      firstNumber: 500,
    }).files;
    const bytes = await cardFileBytes(file!);
    const created = await createUpload(
      tusB,
      { dayId: day.id, stationId: station.id, cardPath: file!.cardPath },
      bytes.length,
    );
    expect(created.status).toBe(201);

    // The PATCH's body arrives in two parts; B is told to stop between them.
    let sendRest: () => void = () => undefined;
    const body = new ReadableStream<Uint8Array>({
      start(controller) {
        controller.enqueue(new Uint8Array(bytes.subarray(0, 1000)));
        sendRest = () => {
          controller.enqueue(new Uint8Array(bytes.subarray(1000)));
          controller.close();
        };
      },
    });
    const inFlight = fetch(created.url!, {
      method: 'PATCH',
      headers: {
        cookie,
        'Tus-Resumable': '1.0.0',
        'Upload-Offset': '0',
        'Content-Type': 'application/offset+octet-stream',
        'Content-Length': String(bytes.length),
      },
      body,
      duplex: 'half',
    } as RequestInit);
    // Its first part is on disk (asking tus for the offset would take the upload's lock).
    const spooled = path.join(
      scratch,
      'shared-uploads',
      new URL(created.url!).pathname.split('/').pop()!,
    );
    await expect.poll(() => (existsSync(spooled) ? statSync(spooled).size : 0)).toBe(1000);
    const exited = processB.stop('SIGTERM');
    await processB.waitFor(/SIGTERM: shutting down/);
    // No new connection reaches B once it drains; A still serves.
    await expect
      .poll(async () =>
        fetch(`${webB}/api/ready`).then(
          (r) => r.status,
          () => 'refused',
        ),
      )
      .toBe('refused');
    expect((await fetch(`${webA}/api/ready`)).status).toBe(200);
    sendRest();
    const answer = await inFlight;
    expect(answer.status).toBe(204);
    expect(answer.headers.get('likeness-upload-outcome')).toBe('stored');
    expect(await exited).toBe(0);
    expect(processB.output()).toMatch(/stopped cleanly/);
  }, 120_000);
});
