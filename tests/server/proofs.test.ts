import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../setup/test-app';
import { insertStaff } from '../factories/accounts';
import { runQueuedJobs } from './booking-jobs';
import { signedInAgent } from './helpers';
import { settlePicksNow, setUpProofsDay } from './proofs-day';
import type { TusSession } from './tus-client';

let t: TestApp;
let day: Awaited<ReturnType<typeof setUpProofsDay>>['day'];
let session: TusSession;
let studio: request.Agent;
let coordinator: request.Agent;
let clientId: string;
let sitters: Awaited<ReturnType<typeof setUpProofsDay>>['sitters'];

beforeAll(async () => {
  t = await startTestApp();
  const ready = await setUpProofsDay(t);
  ({ day, session, studio, sitters } = ready);
  clientId = ready.client.id;
  coordinator = await signedInAgent(
    t,
    (await insertStaff(t.db, { role: 'coordinator', clientId })).email,
  );
  for (const { mail } of sitters) {
    expect(mail.subject).toMatch(/portraits are ready to choose/);
    // The deadline in the mail is a week after the shoot, on the office's clock.
    expect(mail.text).toContain('Thursday, 11 March 2027 at 23:59 (Europe/London time)');
    expect(mail.text).toContain('portraits from 4 March 2027 are ready');
    expect(mail.text).toContain(`?next=${encodeURIComponent(`/proofs/${day.dayId}`)}`);
  }
}, 120_000);

afterAll(async () => {
  await session?.close();
  await t?.close();
});

const proofsOf = async (index: number) =>
  (await sitters[index]!.agent.get(`/api/proofs/${day.dayId}`).expect(200)).body;

// Two sitters photographed, their card uploaded and matched; then proofs are released, picked,
// reminded and settled, on the real database.
describe('proofs and picks', () => {
  it('shows each sitter only their own frames, never the slate, as marked web-sized proofs', async () => {
    const first = await proofsOf(0);
    const second = await proofsOf(1);
    expect(first.frames).toHaveLength(3);
    expect(second.frames).toHaveLength(3);
    const firstIds = new Set(first.frames.map((frame: { id: string }) => frame.id));
    expect(second.frames.some((frame: { id: string }) => firstIds.has(frame.id))).toBe(false);
    expect(first.package).toEqual({ included: 1, extraAllowed: 0, extraPriceCents: 0 });

    const image = await request(t.app).get(first.frames[0].url).buffer(true).expect(200);
    expect(image.headers['content-type']).toBe('image/jpeg');
    const meta = await sharp(image.body as Buffer).metadata();
    // Web-sized (the preview is 640 px here: never enlarged), and no EXIF carried over.
    expect(Math.max(meta.width!, meta.height!)).toBeLessThanOrEqual(1200);
    expect(meta.exif).toBeUndefined();

    // A changed signature, another person in the URL, or an expired link: refused.
    const tampered = first.frames[0].url.replace(
      /s=([^&]+)/,
      's=AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA',
    );
    await request(t.app).get(tampered).expect(403);
    const otherPerson = first.frames[0].url.replace(/p=[^&]+/, `p=${sitters[1]!.id}`);
    await request(t.app).get(otherPerson).expect(403);
    t.clock.advance(2 * 3_600_000);
    await request(t.app).get(first.frames[0].url).expect(403);
  });

  it('lets a sitter pick within the package, with a note, and change it', async () => {
    const proofs = await proofsOf(0);
    const [one, two] = proofs.frames as Array<{ id: string }>;
    const saved = await sitters[0]!.agent
      .put(`/api/proofs/${day.dayId}/picks`)
      .send({ picks: [{ frameId: one!.id, note: 'A stray hair on the left, please.' }] })
      .expect(200);
    expect(saved.body.picks).toEqual([
      { frameId: one!.id, note: 'A stray hair on the left, please.' },
    ]);
    expect(saved.body.standing).toBe('yours');
    await sitters[0]!.agent
      .put(`/api/proofs/${day.dayId}/picks`)
      .send({ picks: [{ frameId: two!.id }] })
      .expect(200);
    const picks = await t.db
      .selectFrom('picks')
      .where('personId', '=', sitters[0]!.id)
      .selectAll()
      .execute();
    expect(picks.map((pick) => pick.frameId)).toEqual([two!.id]);
    const audit = await t.db
      .selectFrom('auditEvents')
      .where('action', '=', 'proofs.picks_changed')
      .where('subjectId', '=', sitters[0]!.id)
      .select('id')
      .execute();
    expect(audit).toHaveLength(2);
  });

  it('refuses a pick over the package, another sitter’s frame or a bad note, and changes nothing', async () => {
    const mine = (await proofsOf(0)).frames as Array<{ id: string }>;
    const theirs = (await proofsOf(1)).frames as Array<{ id: string }>;
    const before = await t.db.selectFrom('picks').selectAll().execute();
    const cases: Array<[object, number, RegExp]> = [
      [
        { picks: [{ frameId: mine[0]!.id }, { frameId: mine[1]!.id }] },
        400,
        /package includes 1 portrait/,
      ],
      [{ picks: [{ frameId: theirs[0]!.id }] }, 400, /not one of your proofs/],
      [{ picks: [{ frameId: mine[0]!.id, note: 'x'.repeat(301) }] }, 400, /300 characters/],
      [{ picks: [{ frameId: mine[0]!.id, note: 'bell\u0007' }] }, 400, /control characters/],
      [{ picks: [{ frameId: mine[0]!.id }, { frameId: mine[0]!.id }] }, 400, /picked twice/],
      [{ picks: [{ frameId: 'nope' }] }, 400, /./],
      [{}, 400, /./],
    ];
    for (const [body, status, message] of cases) {
      const response = await sitters[0]!.agent.put(`/api/proofs/${day.dayId}/picks`).send(body);
      expect({ body, status: response.status }).toEqual({ body, status });
      expect(JSON.stringify(response.body.error)).toMatch(message);
    }
    expect(await t.db.selectFrom('picks').selectAll().execute()).toEqual(before);
    // The studio allows one extra: now two picks go through.
    const admin = await signedInAgent(t, (await insertStaff(t.db, { role: 'studio_admin' })).email);
    await admin
      .put(`/api/clients/${clientId}/proof-settings`)
      .send({
        picksIncluded: 1,
        extraPicksAllowed: 1,
        extraPickPriceCents: 2500,
        hrMayChoose: false,
      })
      .expect(200);
    await sitters[0]!.agent
      .put(`/api/proofs/${day.dayId}/picks`)
      .send({ picks: [{ frameId: mine[0]!.id }, { frameId: mine[1]!.id }] })
      .expect(200);
  });

  it('shows the coordinator counts, reminds only those who have not picked, and keeps proofs from HR', async () => {
    const progress = await coordinator.get(`/api/days/${day.dayId}/proofs`).expect(200);
    expect(progress.body).toMatchObject({ released: true, withProofs: 2, picked: 1, notPicked: 1 });
    // A double click reminds once: the second finds that person reminded a moment ago.
    const [first, second] = await Promise.all(
      [1, 2].map(() => coordinator.post(`/api/days/${day.dayId}/proofs/remind`).expect(201)),
    );
    expect([first!.body.queued, second!.body.queued].sort()).toEqual([0, 1]);
    await runQueuedJobs(t);
    const reminders = t.mail.list().filter((mail) => /Reminder: choose/.test(mail.subject));
    expect(reminders.map((mail) => mail.to)).toEqual([[sitters[1]!.email]]);
    const soon = await coordinator.post(`/api/days/${day.dayId}/proofs/remind`).expect(201);
    expect(soon.body).toMatchObject({ queued: 0, coolingDown: 1 });
    expect(Date.parse(soon.body.nextReminderAt)).toBeGreaterThan(t.clock.now().getTime());
    const hr = await coordinator.get(`/api/days/${day.dayId}/proofs/people/${sitters[1]!.id}`);
    expect(hr.status).toBe(409);
    expect(hr.body.error.code).toBe('hr_choice_off');
  });

  it('mails a moved deadline to the sitters sent their proofs, each move once, even just after a reminder', async () => {
    const newDates = () => t.mail.list().filter((mail) => /^New date to choose/.test(mail.subject));
    const moved = await studio
      .post(`/api/days/${day.dayId}/proofs/release`)
      .send({ picksCloseOn: '2027-03-18' })
      .expect(201);
    expect(moved.body).toMatchObject({ queued: 0, alreadySent: 2, toldOfNewDate: 2 });
    // The same date again is no news.
    const same = await studio
      .post(`/api/days/${day.dayId}/proofs/release`)
      .send({ picksCloseOn: '2027-03-18' })
      .expect(201);
    expect(same.body).toMatchObject({ queued: 0, toldOfNewDate: 0 });
    await runQueuedJobs(t);
    const told = newDates();
    expect(told.map((mail) => mail.to).sort()).toEqual(
      [[sitters[0]!.email], [sitters[1]!.email]].sort(),
    );
    for (const mail of told) {
      expect(mail.subject).toMatch(/^New date to choose your .* portrait$/);
      // A week later than the first deadline, on the office's clock.
      expect(mail.text).toContain('Thursday, 18 March 2027 at 23:59 (Europe/London time)');
    }
    // Moved once more, it is mailed once more.
    await studio
      .post(`/api/days/${day.dayId}/proofs/release`)
      .send({ picksCloseOn: '2027-03-19' })
      .expect(201)
      .expect((response) => expect(response.body.toldOfNewDate).toBe(2));
    await runQueuedJobs(t);
    expect(newDates()).toHaveLength(4);
  });

  it('after the deadline the studio’s pick stands for those who did not choose', async () => {
    const theirs = (await proofsOf(1)).frames as Array<{ id: string }>;
    await studio
      .put(`/api/days/${day.dayId}/proofs/studio-picks/${sitters[1]!.id}`)
      .send({ frameId: theirs[2]!.id })
      .expect(200);
    // The deadline passes (moved rather than the clock, so sessions stay valid).
    await t.db
      .updateTable('dayProofs')
      .set({ picksCloseAt: new Date(t.clock.now().getTime() - 60_000) })
      .where('dayId', '=', day.dayId)
      .execute();
    const late = await sitters[1]!.agent
      .put(`/api/proofs/${day.dayId}/picks`)
      .send({ picks: [{ frameId: theirs[0]!.id }] })
      .expect(409);
    expect(late.body.error.code).toBe('picks_closed');
    await settlePicksNow(t, day.dayId);
    const picks = await t.db
      .selectFrom('picks')
      .where('personId', '=', sitters[1]!.id)
      .selectAll()
      .execute();
    expect(picks).toMatchObject([{ frameId: theirs[2]!.id, chosenBy: 'studio' }]);
    const first = await t.db
      .selectFrom('picks')
      .where('personId', '=', sitters[0]!.id)
      .select('chosenBy')
      .execute();
    expect(first.every((pick) => pick.chosenBy === 'sitter')).toBe(true);
  });
});
