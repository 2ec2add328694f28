import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseEnvironment, toAppConfig } from '../../server/config';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { insertSitting } from '../factories/sittings';
import { startTestApp, type TestApp } from '../setup/test-app';
import { runQueuedJobs } from './booking-jobs';
import { signedInAgent } from './helpers';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ env: { RATE_LIMIT_PER_ADDRESS: '10000' } });
});
afterAll(() => t.close());

async function officeDay(people = 3) {
  const client = await insertClient(t.db);
  const office = await insertOffice(t.db, client.id, 'Leeds', 'Europe/London');
  const photographer = await insertStaff(t.db, { role: 'photographer' });
  const day = await insertDay(t.db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [photographer.id],
  });
  const invited = [];
  for (let i = 0; i < people; i += 1) {
    invited.push(await insertPerson(t.db, client.id, { officeId: office.id }));
  }
  const coordinatorAccount = await insertStaff(t.db, { role: 'coordinator', clientId: client.id });
  return { client, office, photographer, day, invited, coordinatorAccount };
}

describe('slots that have begun', () => {
  it('are not offered to staff booking for someone, and a refusal says when the slot began', async () => {
    const { day, invited, coordinatorAccount } = await officeDay(1);
    const before = t.clock.now().getTime();
    t.clock.advance(Date.parse('2030-03-14T09:07:00Z') - before);
    try {
      const coordinator = await signedInAgent(t, coordinatorAccount.email);
      const slots = await coordinator.get(`/api/days/${day.id}/slots`).expect(200);
      const times = slots.body.slots.map((slot: { localTime: string }) => slot.localTime);
      // 09:00 and 09:05 have begun at 09:07; the first slot offered is 09:10.
      expect(times[0]).toBe('09:10');
      const refused = await coordinator
        .post('/api/bookings')
        .send({ dayId: day.id, personId: invited[0]!.id, startsAt: '2030-03-14T09:05:00.000Z' })
        .expect(409);
      expect(refused.body.error).toMatchObject({ code: 'slot_past' });
      expect(refused.body.error.message).toContain('began at 09:05 (Europe/London)');
    } finally {
      t.clock.advance(before - t.clock.now().getTime());
    }
  });
});

describe('the invited count', () => {
  it('counts only people actually mailed, not the list nor the queue', async () => {
    const { day, coordinatorAccount } = await officeDay(6);
    const coordinator = await signedInAgent(t, coordinatorAccount.email);
    const untouched = await coordinator.get(`/api/days/${day.id}/progress`).expect(200);
    expect(untouched.body).toMatchObject({ listed: 6, invited: 0, unbooked: 6 });
    await coordinator.post(`/api/days/${day.id}/invitations`).expect(202);
    const queued = await coordinator.get(`/api/days/${day.id}/progress`).expect(200);
    expect(queued.body.invited).toBe(0);
    await runQueuedJobs(t);
    const sent = await coordinator.get(`/api/days/${day.id}/progress`).expect(200);
    expect(sent.body).toMatchObject({ listed: 6, invited: 6 });
  });
});

describe('reminders', () => {
  it('never ask someone who already sat (checked in without a booking) to book', async () => {
    const { day, invited, coordinatorAccount } = await officeDay(2);
    await insertSitting(t.db, {
      dayId: day.id,
      stationId: day.stations[0]!.id,
      personId: invited[0]!.id,
      startedAt: t.clock.now(),
      firstFrame: 1,
    });
    const coordinator = await signedInAgent(t, coordinatorAccount.email);
    const sent = await coordinator.post(`/api/days/${day.id}/reminders`).expect(202);
    expect(sent.body).toMatchObject({ queued: 1 });
    const log = await coordinator.get(`/api/days/${day.id}/mailings`).expect(200);
    const reminded = log.body.entries
      .filter((entry: { kind: string }) => entry.kind === 'reminder')
      .map((entry: { personId: string }) => entry.personId);
    expect(reminded).toEqual([invited[1]!.id]);
  });

  it('go once per person and day within the cool-down; the log says when the next is possible', async () => {
    const { day, invited, coordinatorAccount } = await officeDay(2);
    const coordinator = await signedInAgent(t, coordinatorAccount.email);
    const first = await coordinator.post(`/api/days/${day.id}/reminders`).expect(202);
    const remindedAt = t.clock.now().getTime();
    expect(first.body).toMatchObject({ queued: 2, coolingDown: 0 });
    expect(first.body.nextReminderAt).toBe(new Date(remindedAt + 24 * 3_600_000).toISOString());
    await runQueuedJobs(t);
    t.mail.clear();

    // A second press an hour later mails nobody and issues no new link.
    t.clock.advance(3_600_000);
    const second = await coordinator.post(`/api/days/${day.id}/reminders`).expect(202);
    expect(second.body).toMatchObject({ queued: 0, coolingDown: 2 });
    expect(second.body.nextReminderAt).toBe(first.body.nextReminderAt);
    await runQueuedJobs(t);
    expect(t.mail.list()).toHaveLength(0);
    const log = await coordinator.get(`/api/days/${day.id}/mailings`).expect(200);
    expect(log.body.reminders).toEqual({
      cooldownHours: 24,
      bookingClosed: false,
      dueNow: 0,
      coolingDown: 2,
      nextAt: first.body.nextReminderAt,
    });
    const reminders = log.body.entries.filter((e: { kind: string }) => e.kind === 'reminder');
    expect(reminders).toHaveLength(2);
    expect(reminders[0].nextReminderAt).toBe(first.body.nextReminderAt);

    // After the cool-down, the still unbooked are due again.
    t.clock.advance(23 * 3_600_000);
    const third = await coordinator.post(`/api/days/${day.id}/reminders`).expect(202);
    expect(third.body.queued).toBe(2);
    await runQueuedJobs(t);
    expect(
      t.mail
        .list()
        .map((m) => m.to[0])
        .sort(),
    ).toEqual(invited.map((person) => person.email.toLowerCase()).sort());
  });

  it('promise no next reminder to someone who booked since, nor to anyone once booking closed', async () => {
    const { day, invited, coordinatorAccount } = await officeDay(2);
    const coordinator = await signedInAgent(t, coordinatorAccount.email);
    await coordinator.post(`/api/days/${day.id}/reminders`).expect(202);
    await runQueuedJobs(t);
    await t.db
      .insertInto('bookings')
      .values({
        dayId: day.id,
        stationId: day.stations[0]!.id,
        personId: invited[0]!.id,
        startsAt: new Date(`${day.date}T09:00:00Z`),
        passToken: `pass-${invited[0]!.id}`,
        calendarUid: `${invited[0]!.id}@test`,
      })
      .execute();

    const nextOf = (body: {
      entries: { kind: string; personId: string; nextReminderAt: string | null }[];
    }) =>
      Object.fromEntries(
        body.entries
          .filter((entry) => entry.kind === 'reminder')
          .map((entry) => [entry.personId, entry.nextReminderAt]),
      );
    const open = await coordinator.get(`/api/days/${day.id}/mailings`).expect(200);
    expect(nextOf(open.body)[invited[0]!.id]).toBeNull();
    expect(nextOf(open.body)[invited[1]!.id]).toEqual(expect.any(String));
    expect(open.body.reminders).toMatchObject({ coolingDown: 1 });

    // insertDay closes booking at the start of the day's date.
    t.clock.advance(Date.parse(`${day.date}T00:00:00Z`) + 60_000 - t.clock.now().getTime());
    const later = await signedInAgent(t, coordinatorAccount.email);
    const closed = await later.get(`/api/days/${day.id}/mailings`).expect(200);
    expect(Object.values(nextOf(closed.body))).toEqual([null, null]);
    expect(closed.body.reminders).toMatchObject({
      bookingClosed: true,
      dueNow: 0,
      coolingDown: 0,
      nextAt: null,
    });
  });

  it('takes its cool-down from REMINDER_COOLDOWN_HOURS, 24 by default', () => {
    const config = (env: Record<string, string>) => toAppConfig(parseEnvironment(env));
    expect(config({}).reminderCooldownMs).toBe(24 * 3_600_000);
    expect(config({ REMINDER_COOLDOWN_HOURS: '6' }).reminderCooldownMs).toBe(6 * 3_600_000);
  });
});

describe('day sanity', () => {
  it('refuses dates outside a sensible window, cut-offs after the day, odd slot lengths and coerced numbers', async () => {
    const client = await insertClient(t.db);
    const office = await insertOffice(t.db, client.id, 'Rotterdam', 'Europe/Amsterdam');
    const photographer = await insertStaff(t.db, { role: 'photographer' });
    const admin = await signedInAgent(t, (await insertStaff(t.db)).email);
    const valid = {
      clientId: client.id,
      officeId: office.id,
      date: '2030-10-27',
      address: 'Brugmeesterkade 9, Rotterdam',
      opensAt: '09:00',
      closesAt: '12:00',
      slotMinutes: 5,
      bookingOpensAt: '2030-10-01T08:00:00Z',
      bookingClosesAt: '2030-10-26T16:00:00Z',
      changesCloseAt: '2030-10-26T16:00:00Z',
      stations: [{ name: 'Station A', photographerId: photographer.id }],
    };
    const count = async () =>
      Number(
        (
          await t.db
            .selectFrom('shootDays')
            .select(t.db.fn.countAll().as('n'))
            .where('clientId', '=', client.id)
            .executeTakeFirstOrThrow()
        ).n,
      );
    const refusedOn = async (patch: Record<string, unknown>, field: string) => {
      const response = await admin
        .post('/api/days')
        .send({ ...valid, ...patch })
        .expect(400);
      expect(response.body.error.details.fieldErrors[field]).toBeDefined();
    };
    await refusedOn({ date: '1900-01-01' }, 'date');
    await refusedOn({ date: '9999-12-31' }, 'date');
    await refusedOn({ bookingOpensAt: '1900-01-01T00:00:00Z' }, 'bookingOpensAt');
    // Not a date-time at all: a field error, never a failure inside the window check.
    await refusedOn({ bookingOpensAt: '', date: '' }, 'bookingOpensAt');
    await refusedOn({ changesCloseAt: 'soon' }, 'changesCloseAt');
    // The day closes at 12:00 Amsterdam time, 11:00 UTC (winter time from 03:00 that morning,
    // the last Sunday of October; EU summer-time rule, from memory): later cut-offs are refused.
    await refusedOn({ bookingClosesAt: '2030-10-27T12:00:00Z' }, 'bookingClosesAt');
    await refusedOn({ changesCloseAt: '2030-10-28T08:00:00Z' }, 'changesCloseAt');
    await refusedOn({ slotMinutes: 7 }, 'slotMinutes');
    await refusedOn({ slotMinutes: [7] }, 'slotMinutes');
    await refusedOn({ slotMinutes: '0x0a' }, 'slotMinutes');
    await refusedOn({ slotMinutes: '10' }, 'slotMinutes');
    expect(await count()).toBe(0);
    await admin.post('/api/days').send(valid).expect(201);
    await admin
      .post('/api/days')
      .send({ ...valid, slotMinutes: 10, bookingClosesAt: '2030-10-27T10:00:00Z' })
      .expect(201);
    expect(await count()).toBe(2);
  });
});
