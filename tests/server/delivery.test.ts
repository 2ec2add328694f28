import { randomUUID } from 'node:crypto';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertStaff } from '../factories/accounts';
import { startTestApp, type TestApp } from '../setup/test-app';
import { debianPortrait, placePortrait } from '../support/debian-portrait';
import { runQueuedJobs } from './booking-jobs';
import { binaryBody, signedInAgent } from './helpers';
import { setUpProofsDay } from './proofs-day';
import { createUpload, patchUpload } from './tus-client';

// From picks to a delivered set on the real database: finals holding a real face (the Debian
// archive's public-domain portrait), the eyes found, three renditions rendered, the set
// released with names from the template, HR's ZIP read back by Info-ZIP, the sitters' links.
let t: TestApp;
let ready: Awaited<ReturnType<typeof setUpProofsDay>>;
let admin: request.Agent;
let coordinator: request.Agent;
let coordinatorEmail: string;
const pickIds: string[] = [];

async function sendFinal(pickId: string, fileName: string, bytes: Buffer) {
  const created = await createUpload(
    ready.session,
    { purpose: 'final', dayId: ready.day.dayId, pickId, cardPath: fileName },
    bytes.length,
  );
  expect(created.status, created.body).toBe(201);
  expect((await patchUpload(ready.session, created.url!, 0, bytes)).status).toBe(204);
}

const set = async () =>
  (await ready.studio.get(`/api/days/${ready.day.dayId}/set`).expect(200)).body;

beforeAll(async () => {
  t = await startTestApp();
  ready = await setUpProofsDay(t, 2);
  admin = await signedInAgent(t, (await insertStaff(t.db, { role: 'studio_admin' })).email);
  coordinatorEmail = (await insertStaff(t.db, { role: 'coordinator', clientId: ready.client.id }))
    .email;
  coordinator = await signedInAgent(t, coordinatorEmail);
  for (const sitter of ready.sitters) {
    const proofs = (await sitter.agent.get(`/api/proofs/${ready.day.dayId}`).expect(200)).body;
    await sitter.agent
      .put(`/api/proofs/${ready.day.dayId}/picks`)
      .send({ picks: [{ frameId: proofs.frames[0].id }] })
      .expect(200);
  }
  const picks = await t.db.selectFrom('picks').select(['id', 'personId']).execute();
  for (const sitter of ready.sitters)
    pickIds.push(picks.find((pick) => pick.personId === sitter.id)!.id);
  const { presets } = (await admin.get(`/api/clients/${ready.client.id}/look`).expect(200)).body;
  await admin
    .put(`/api/clients/${ready.client.id}/look`)
    .send({
      name: 'Staff directory',
      renditions: presets.map((preset: { rendition: unknown }) => preset.rendition),
      fileNameTemplate: '{employee_id}_{family}_{rendition}',
    })
    .expect(200);
  const portrait = await debianPortrait();
  for (const [index, pickId] of pickIds.entries()) {
    const placed = await placePortrait(portrait, {
      // Large enough that the eyes are over 200 px apart: no rendition has to enlarge.
      frameWidth: 4000,
      frameHeight: 5000,
      left: 700 + index * 90,
      top: 1200 + index * 60,
      scale: 5,
      // The portrait's own head is tilted about 3°: the rolls stay inside the 5° levelling limit.
      rollDeg: index === 0 ? 0.5 : -1.5,
    });
    await sendFinal(pickId, `HPE_012${index}-Edit.jpg`, placed.frame);
  }
  await ready.studio.post(`/api/days/${ready.day.dayId}/set/prepare`).expect(202);
  await runQueuedJobs(t);
}, 240_000);

afterAll(async () => {
  await ready?.session.close();
  await t?.close();
});

describe('the delivery set', () => {
  it('finds the eyes in each final and renders every rendition at its size', async () => {
    const body = await set();
    expect(body.renditions.map((rendition: { name: string }) => rendition.name)).toHaveLength(3);
    for (const sitter of body.sitters) {
      expect(sitter.eyes.status).toBe('found');
      expect(sitter.needsAHand).toBe(false);
      expect(sitter.renditions.map((rendition: { status: string }) => rendition.status)).toEqual([
        'rendered',
        'rendered',
        'rendered',
      ]);
    }
    for (const rendition of body.renditions) {
      const image = await ready.studio
        .get(`/api/picks/${pickIds[0]}/renditions/${encodeURIComponent(rendition.name)}`)
        .buffer(true)
        .parse(binaryBody)
        .expect(200);
      const meta = await sharp(image.body as Buffer).metadata();
      expect([meta.width, meta.height]).toEqual([rendition.width, rendition.height]);
    }
  });

  it('releases the set, and HR downloads it with a manifest and the list of who is missing', async () => {
    const second = await insertStaff(t.db, { role: 'coordinator', clientId: ready.client.id });
    const released = await ready.studio
      .post(`/api/days/${ready.day.dayId}/delivery/release`)
      .expect(201);
    expect(released.body).toMatchObject({ release: 1, files: 6, changed: 6, people: 2 });
    // HR hears of it by mail, with the way to the day.
    await runQueuedJobs(t);
    const told = await t.mail.waitFor(coordinatorEmail, { subjectIncludes: 'Portraits ready' });
    expect(told.text).toContain(`/days/${ready.day.dayId}`);
    // Every coordinator of the client, once each (one job each).
    const hrMails = t.mail.list().filter((mail) => mail.subject.startsWith('Portraits ready'));
    expect(hrMails.map((mail) => mail.to).sort()).toEqual(
      [[coordinatorEmail], [second.email]].sort(),
    );
    const zip = await coordinator
      .get(`/api/days/${ready.day.dayId}/delivery.zip`)
      .buffer(true)
      .parse(binaryBody)
      .expect(200);
    const folder = mkdtempSync(path.join(os.tmpdir(), 'likeness-set-'));
    try {
      const file = path.join(folder, 'set.zip');
      writeFileSync(file, zip.body as Buffer);
      // Info-ZIP's unzip, an independent reader, checks every entry's CRC-32.
      expect(execFileSync('unzip', ['-t', file], { encoding: 'utf8' })).toMatch(
        /No errors detected/,
      );
      const names = execFileSync('unzip', ['-Z1', file], { encoding: 'utf8' }).trim().split('\n');
      expect(names.slice(0, 2)).toEqual(['manifest.csv', 'missing.csv']);
      expect(names.slice(2)).toHaveLength(6);
      for (const name of names.slice(2))
        expect(name).toMatch(/^E-[0-9a-f]+_Sample-[0-9a-f]+_[A-Za-z0-9-]+\.jpg$/);
      const manifest = execFileSync('unzip', ['-p', file, 'manifest.csv'], { encoding: 'utf8' });
      expect(manifest.replace(/^\uFEFF/, '').split('\r\n')[0]).toBe(
        'Employee id,E-mail,Given name,Family name,Preferred name,Office,Department,Rendition,File name,Bytes,Changed in this release',
      );
      expect(manifest.trim().split('\r\n')).toHaveLength(7);
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
  });

  it('mails each sitter a personal link that lists only their files, and can be withdrawn', async () => {
    await runQueuedJobs(t);
    const mail = await t.mail.waitFor(ready.sitters[0]!.email, {
      subjectIncludes: 'portraits are ready',
    });
    const token = /\/portraits\/([A-Za-z0-9_-]{43})/.exec(mail.text)![1]!;
    const files = (await request(t.app).get(`/api/portraits/${token}`).expect(200)).body.files;
    expect(files).toHaveLength(3);
    const download = await request(t.app)
      .get(`/api/portraits/${token}/files/${files[0].id}`)
      .buffer(true)
      .parse(binaryBody)
      .expect(200);
    expect((await sharp(download.body as Buffer).metadata()).format).toBe('jpeg');
    // Another sitter's file is not reachable through this link.
    const others = (
      await ready.sitters[1]!.agent.get(`/api/my-portraits/${ready.day.dayId}`).expect(200)
    ).body.files;
    await request(t.app).get(`/api/portraits/${token}/files/${others[0].id}`).expect(404);
    await ready.studio
      .delete(`/api/days/${ready.day.dayId}/delivery/links/${ready.sitters[0]!.id}`)
      .expect(200);
    await request(t.app).get(`/api/portraits/${token}`).expect(410);
  });

  it('serves the stored archive of the release with byte ranges, so a broken download resumes (RFC 9110)', async () => {
    // The release's job has written the whole set to storage (run with the mail above).
    const url = `/api/days/${ready.day.dayId}/delivery.zip`;
    const whole = await coordinator.get(url).buffer(true).parse(binaryBody).expect(200);
    expect(whole.headers['accept-ranges']).toBe('bytes');
    expect(whole.headers.etag).toBe('"release-1"');
    const bytes = whole.body as Buffer;
    // A download cut off after the first 1,000 bytes asks for the rest.
    const rest = await coordinator
      .get(url)
      .set('Range', 'bytes=1000-')
      .set('If-Range', '"release-1"')
      .buffer(true)
      .parse(binaryBody)
      .expect(206);
    expect(rest.headers['content-range']).toBe(`bytes 1000-${bytes.length - 1}/${bytes.length}`);
    expect(Buffer.concat([bytes.subarray(0, 1000), rest.body as Buffer]).equals(bytes)).toBe(true);
    const tail = await coordinator
      .get(url)
      .set('Range', 'bytes=-50')
      .buffer(true)
      .parse(binaryBody)
      .expect(206);
    expect((tail.body as Buffer).equals(bytes.subarray(bytes.length - 50))).toBe(true);
    await coordinator
      .get(url)
      .set('Range', `bytes=${bytes.length + 10}-`)
      .expect(416);
    // A range asked against an older release gets the whole current file instead.
    await coordinator.get(url).set('Range', 'bytes=0-9').set('If-Range', '"release-0"').expect(200);
  });

  it('takes the photographer’s eye marks over detection, and a re-release says what changed', async () => {
    const eyesOf = async (pickId: string) =>
      (await set()).sitters.find((sitter: { pickId: string }) => sitter.pickId === pickId).eyes;
    const before = await eyesOf(pickIds[0]!);
    const marks = {
      leftEye: { x: before.left.x - 6, y: before.left.y + 4 },
      rightEye: { x: before.right.x + 6, y: before.right.y + 4 },
    };
    await ready.studio.put(`/api/picks/${pickIds[0]}/eyes`).send(marks).expect(200);
    await ready.studio
      .put(`/api/picks/${pickIds[0]}/eyes`)
      .send({ leftEye: { x: -5, y: 10 }, rightEye: { x: 100, y: 10 } })
      .expect(400);
    await runQueuedJobs(t);
    const after = await eyesOf(pickIds[0]!);
    expect(after).toMatchObject({ status: 'marked', left: marks.leftEye, right: marks.rightEye });
    const again = await ready.studio
      .post(`/api/days/${ready.day.dayId}/delivery/release`)
      .expect(201);
    expect(again.body).toMatchObject({ release: 2, files: 6, changed: 3 });
  });

  it('will not release while a new final is not rendered yet, then releases its renditions', async () => {
    const placed = await placePortrait(await debianPortrait(), {
      frameWidth: 4000,
      frameHeight: 5000,
      left: 760,
      top: 1240,
      scale: 5,
      rollDeg: 0.5,
    });
    await sendFinal(pickIds[0]!, 'HPE_0120-Edit2.jpg', placed.frame);
    await runQueuedJobs(t);
    const refused = await ready.studio
      .post(`/api/days/${ready.day.dayId}/delivery/release`)
      .expect(409);
    expect(refused.body.error.code).toBe('set_not_rendered');
    const [first] = await t.db
      .selectFrom('people')
      .select(['givenName', 'familyName'])
      .where('id', '=', ready.sitters[0]!.id)
      .execute();
    expect(refused.body.error.message).toContain(`${first!.givenName} ${first!.familyName}`);
    // The status says the same before anyone presses release, and clears once it can go.
    const waiting = await ready.studio.get(`/api/days/${ready.day.dayId}/delivery`).expect(200);
    expect(waiting.body.releaseBlocker).toBe(refused.body.error.message);
    await ready.studio.post(`/api/days/${ready.day.dayId}/set/prepare`).expect(202);
    await runQueuedJobs(t);
    const cleared = await ready.studio.get(`/api/days/${ready.day.dayId}/delivery`).expect(200);
    expect(cleared.body.releaseBlocker).toBeNull();
    // A double click: two requests at once make one release, and both answer with it.
    const both = await Promise.all(
      [1, 2].map(() =>
        ready.studio.post(`/api/days/${ready.day.dayId}/delivery/release`).expect(201),
      ),
    );
    expect(both.map((answer) => answer.body.release)).toEqual([3, 3]);
    const made = both.find((answer) => !answer.body.unchanged);
    expect(made?.body).toMatchObject({ release: 3, files: 6, changed: 3 });
    const again = await ready.studio
      .post(`/api/days/${ready.day.dayId}/delivery/release`)
      .expect(201);
    expect(again.body).toMatchObject({ release: 3, unchanged: true, changed: 0 });
    expect(
      await t.db
        .selectFrom('deliveries')
        .select('release')
        .where('dayId', '=', ready.day.dayId)
        .execute(),
    ).toHaveLength(3);
  });

  it('lists on missing.csv a sitter in the set whose later choice is not released yet', async () => {
    const sitter = ready.sitters[0]!;
    const frame = await t.db
      .selectFrom('frames')
      .where('dayId', '=', ready.day.dayId)
      .where('slateToken', 'is', null)
      .where('id', 'not in', t.db.selectFrom('picks').select('frameId'))
      .select('id')
      .executeTakeFirstOrThrow();
    const later = await t.db
      .insertInto('picks')
      .values({
        id: randomUUID(),
        dayId: ready.day.dayId,
        personId: sitter.id,
        frameId: frame.id,
        chosenBy: 'sitter',
        position: 2,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    try {
      const zip = await coordinator
        .get(`/api/days/${ready.day.dayId}/delivery.zip`)
        .buffer(true)
        .parse(binaryBody)
        .expect(200);
      const folder = mkdtempSync(path.join(os.tmpdir(), 'likeness-set-'));
      try {
        const file = path.join(folder, 'set.zip');
        writeFileSync(file, zip.body as Buffer);
        // Read back by Info-ZIP's unzip, an independent reader.
        const missing = execFileSync('unzip', ['-p', file, 'missing.csv'], { encoding: 'utf8' });
        const person = await t.db
          .selectFrom('people')
          .select(['givenName', 'familyName'])
          .where('id', '=', sitter.id)
          .executeTakeFirstOrThrow();
        const line = missing.split('\r\n').find((each) => each.includes(person.familyName));
        expect(line).toContain(person.givenName);
        // The reason holds a comma, so RFC 4180 quotes it.
        expect(line).toMatch(/,"In the set, but 1 of 2 chosen portraits is not released yet"$/);
      } finally {
        rmSync(folder, { recursive: true, force: true });
      }
    } finally {
      await t.db.deleteFrom('picks').where('id', '=', later.id).execute();
    }
  });

  it('keeps the set from those who may not have it', async () => {
    await ready.studio.get(`/api/days/${ready.day.dayId}/delivery.zip`).expect(403);
    const otherCoordinator = await signedInAgent(
      t,
      (
        await insertStaff(t.db, {
          role: 'coordinator',
          clientId: (
            await t.db
              .insertInto('clients')
              .values({ name: 'Other', slug: `other-${Date.now()}` })
              .returning('id')
              .executeTakeFirstOrThrow()
          ).id,
        })
      ).email,
    );
    await otherCoordinator.get(`/api/days/${ready.day.dayId}/delivery.zip`).expect(404);
    await coordinator.post(`/api/days/${ready.day.dayId}/delivery/release`).expect(403);
    await admin
      .put(`/api/clients/${ready.client.id}/look`)
      .send({ name: 'x', renditions: [], fileNameTemplate: '{surname}' })
      .expect(400);
  });
});
