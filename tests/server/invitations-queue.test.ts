import { mailIdentity } from '../../server/config';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createSmtpMailer } from '../../server/adapters/mail/mailer';
import { runDayJobsOnce } from '../../server/jobs/day-jobs';
import { createLogger } from '../../server/lib/logger';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { startTestApp, type TestApp } from '../setup/test-app';
import { linkTokenFrom, signedInAgent } from './helpers';
import { NO_FLASH_WORDING } from '../../server/schemas/sitter-wording';

let t: TestApp;
let mailer: ReturnType<typeof createSmtpMailer>;
const runJobs = () =>
  runDayJobsOnce({
    db: t.db,
    databaseUrl: t.database.url,
    clock: t.clock,
    mailer,
    config: t.config,
    logger: createLogger('silent'),
  });

beforeAll(async () => {
  t = await startTestApp({ env: { RATE_LIMIT_PER_ADDRESS: '10000' } });
  mailer = createSmtpMailer({ smtpUrl: t.mail.smtpUrl, ...mailIdentity(t.config) });
});
afterAll(async () => {
  mailer.close();
  await t.close();
});

describe('invitations, reminders and day-before mail through the job queue', () => {
  it('invites the office once, logs each person, and the link signs the sitter in to book', async () => {
    const client = await insertClient(t.db, { name: 'Halvorsen & Pike Engineering' });
    const leeds = await insertOffice(t.db, client.id, 'Leeds', 'Europe/London');
    const porto = await insertOffice(t.db, client.id, 'Porto', 'Europe/Lisbon');
    const photographer = await insertStaff(t.db, { role: 'photographer' });
    const day = await insertDay(t.db, {
      clientId: client.id,
      officeId: leeds.id,
      photographerIds: [photographer.id],
    });
    const invited = await Promise.all(
      [1, 2, 3].map(() => insertPerson(t.db, client.id, { officeId: leeds.id })),
    );
    const elsewhere = await insertPerson(t.db, client.id, { officeId: porto.id });
    const coordinatorAccount = await insertStaff(t.db, {
      role: 'coordinator',
      clientId: client.id,
    });
    const coordinator = await signedInAgent(t, coordinatorAccount.email);

    const first = await coordinator.post(`/api/days/${day.id}/invitations`).expect(202);
    expect(first.body).toEqual({ queued: 3, alreadyQueued: 0 });
    const second = await coordinator.post(`/api/days/${day.id}/invitations`).expect(202);
    expect(second.body).toEqual({ queued: 0, alreadyQueued: 3 });
    const queuedLog = await coordinator.get(`/api/days/${day.id}/mailings`).expect(200);
    expect(queuedLog.body.counts).toEqual({ queued: 3, sent: 0, failed: 0 });

    // Someone leaves before the queue runs: their entry fails with a reason, nothing is sent.
    await t.db
      .updateTable('people')
      .set({ active: false })
      .where('id', '=', invited[2]!.id)
      .execute();
    t.mail.clear();
    expect(await runJobs()).toBe(3);
    expect(await runJobs()).toBe(0); // running again sends nothing twice
    const log = await coordinator.get(`/api/days/${day.id}/mailings`).expect(200);
    expect(log.body.counts).toEqual({ queued: 0, sent: 2, failed: 1 });
    expect(
      log.body.entries.find((e: { personId: string }) => e.personId === invited[2]!.id).reason,
    ).toMatch(/roster/);
    expect(t.mail.list()).toHaveLength(2);
    expect(t.mail.list().some((m) => m.to.includes(elsewhere.email.toLowerCase()))).toBe(false);

    const mail = await t.mail.waitFor(invited[0]!.email, { subjectIncludes: 'Book your portrait' });
    expect(mail.subject).toContain('Halvorsen & Pike Engineering');
    expect(mail.text).toContain('09:00 to 12:00 (Europe/London, UTC+00:00)');
    expect(mail.html).toContain('Pick my slot');
    const sitter = request.agent(t.app);
    await sitter
      .post('/api/sign-in-links/redeem')
      .send({ token: linkTokenFrom(mail.text, 'link') })
      .expect(201);
    const days = await sitter.get('/api/sitters/me/days').expect(200);
    expect(days.body.days.map((d: { id: string }) => d.id)).toEqual([day.id]);
    await sitter
      .post('/api/bookings')
      .send({ dayId: day.id, startsAt: `${day.date}T09:00:00.000Z` })
      .expect(201);
    await runJobs();
    await t.mail.waitFor(invited[0]!.email, { subjectIncludes: 'is booked' });

    // Reminders go only to the unbooked (the person who left is no longer invited).
    const remind = await coordinator.post(`/api/days/${day.id}/reminders`).expect(202);
    expect(remind.body.queued).toBe(1);
    t.mail.clear();
    await runJobs();
    expect(t.mail.list().map((m) => m.to[0])).toEqual([invited[1]!.email.toLowerCase()]);
    expect(t.mail.list()[0]!.subject).toMatch(/^Reminder/);

    const progress = await coordinator.get(`/api/days/${day.id}/progress`).expect(200);
    expect(progress.body).toMatchObject({ invited: 2, booked: 1, unbooked: 1 });
    expect(progress.body.unbookedPeople.map((p: { id: string }) => p.id)).toEqual([invited[1]!.id]);
    const overview = await coordinator.get(`/api/clients/${client.id}/progress`).expect(200);
    expect(overview.body).toMatchObject({ invited: 2, booked: 1 });
    expect(overview.body.days[0]).toMatchObject({ dayId: day.id, label: `Leeds · ${day.date}` });
    expect(overview.body.byOffice).toEqual([
      { label: 'Leeds', invited: 2, booked: 1, checkedIn: 0, photographed: 0, noShow: 0 },
    ]);
    const departments = overview.body.byDepartment as Array<{ invited: number; booked: number }>;
    expect(departments.reduce((sum, group) => sum + group.invited, 0)).toBe(2);
    expect(departments.reduce((sum, group) => sum + group.booked, 0)).toBe(1);

    // The day before: booked sitters get their pass and what-to-wear advice, once.
    const dayStart = Date.parse(`${day.date}T09:00:00Z`);
    t.clock.advance(dayStart - 20 * 3_600_000 - t.clock.now().getTime());
    t.mail.clear();
    await runJobs();
    await runJobs();
    const tomorrow = t.mail.list();
    expect(tomorrow).toHaveLength(1);
    expect(tomorrow[0]!.subject).toMatch(/^Tomorrow/);
    expect(tomorrow[0]!.text).toContain('Solid, mid-tone colours');
    expect(tomorrow[0]!.attachments.some((a) => a.contentType === 'image/png')).toBe(true);

    // Once booking has closed (at the start of the day's date here) no reminder to book goes out.
    t.clock.advance(Date.parse(`${day.date}T00:00:00Z`) + 60_000 - t.clock.now().getTime());
    const later = await signedInAgent(t, coordinatorAccount.email);
    const closed = await later.post(`/api/days/${day.id}/reminders`).expect(409);
    expect(closed.body.error.code).toBe('booking_closed');
    const state = await later.get(`/api/days/${day.id}/mailings`).expect(200);
    expect(state.body.reminders).toMatchObject({ bookingClosed: true, dueNow: 0 });

    // Another client's coordinator sees nothing of this day.
    const otherClient = await insertClient(t.db);
    const stranger = await insertStaff(t.db, { role: 'coordinator', clientId: otherClient.id });
    const strangerAgent = await signedInAgent(t, stranger.email);
    await strangerAgent.post(`/api/days/${day.id}/invitations`).expect(404);
    await strangerAgent.get(`/api/days/${day.id}/mailings`).expect(404);
    await strangerAgent.get(`/api/days/${day.id}/progress`).expect(404);
    await strangerAgent.get(`/api/clients/${client.id}/progress`).expect(404);
  });

  it('exports the schedule as injection-safe CSV', async () => {
    const client = await insertClient(t.db);
    const office = await insertOffice(t.db, client.id, 'Leeds', 'Europe/London');
    const photographer = await insertStaff(t.db, { role: 'photographer' });
    const day = await insertDay(t.db, {
      clientId: client.id,
      officeId: office.id,
      photographerIds: [photographer.id],
    });
    const person = await insertPerson(t.db, client.id, { officeId: office.id });
    const admin = await signedInAgent(t, (await insertStaff(t.db)).email);
    await admin
      .post('/api/bookings')
      .send({
        dayId: day.id,
        personId: person.id,
        startsAt: `${day.date}T10:00:00.000Z`,
        preferredName: '=HYPERLINK("x")',
        flashSensitive: true,
      })
      .expect(201);
    const csv = await admin.get(`/api/days/${day.id}/schedule.csv`).expect(200);
    expect(csv.headers['content-type']).toContain('text/csv');
    const lines = csv.text.replace(/^\uFEFF/, '').split('\r\n');
    // OWASP CSV Injection: a leading = is neutralised with an apostrophe; RFC 4180 doubles quotes.
    expect(lines[1]).toContain(`"'=HYPERLINK(""x"")"`);
    expect(lines[1]).toContain('10:00');
    expect(lines[1]).toContain(`yes: ${NO_FLASH_WORDING}`);
    const photographerAgent = await signedInAgent(t, photographer.email);
    const sheet = await photographerAgent.get(`/api/days/${day.id}/schedule`).expect(200);
    expect(sheet.body.stations[0].entries[0]).toMatchObject({
      localTime: '10:00',
      flashSensitive: true,
    });
  });
});
