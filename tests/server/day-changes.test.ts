import ICAL from 'ical.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CaughtMail } from '../../server/adapters/mail/mail-catcher';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { startTestApp, type TestApp } from '../setup/test-app';
import { runQueuedJobs } from './booking-jobs';
import { signedInAgent, signedInSitter } from './helpers';

let t: TestApp;
beforeAll(async () => {
  // With a reply address the studio organises the event, so updates are REQUESTs (RFC 5546).
  t = await startTestApp({
    env: { RATE_LIMIT_PER_ADDRESS: '10000', MAIL_REPLY_TO: 'desk@northlight.example' },
  });
});
afterAll(() => t.close());

/** The calendar part, read back with ical.js (an independent RFC 5545 parser). */
function calendarOf(mail: CaughtMail) {
  const part = mail.attachments.find((item) => item.contentType.startsWith('text/calendar'));
  if (!part) throw new Error('no calendar part');
  const text = Buffer.from(part.content, 'base64').toString('utf8');
  const calendar = new ICAL.Component(ICAL.parse(text));
  return { text, calendar, vevent: calendar.getFirstSubcomponent('vevent')! };
}

/** A London day, 2030-03-14 09:00–12:00 (UTC+00:00 then), two staffed stations, two sitters. */
async function dayWithTwoBookings() {
  const client = await insertClient(t.db);
  const office = await insertOffice(t.db, client.id, 'Leeds', 'Europe/London');
  const first = await insertStaff(t.db, { role: 'photographer' });
  const second = await insertStaff(t.db, { role: 'photographer' });
  const day = await insertDay(t.db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [first.id, second.id],
  });
  const [stationA, stationB] = day.stations;
  const late = await insertPerson(t.db, client.id, { officeId: office.id });
  const early = await insertPerson(t.db, client.id, { officeId: office.id });
  const admin = await signedInAgent(t, (await insertStaff(t.db)).email);
  const coordinatorAccount = await insertStaff(t.db, { role: 'coordinator', clientId: client.id });
  const coordinator = await signedInAgent(t, coordinatorAccount.email);
  const lateBooking = await admin
    .post('/api/bookings')
    .send({
      dayId: day.id,
      personId: late.id,
      startsAt: '2030-03-14T11:30:00.000Z',
      stationId: stationA!.id,
    })
    .expect(201);
  const earlyBooking = await admin
    .post('/api/bookings')
    .send({
      dayId: day.id,
      personId: early.id,
      startsAt: '2030-03-14T09:00:00.000Z',
      stationId: stationB!.id,
    })
    .expect(201);
  await runQueuedJobs(t);
  t.mail.clear();
  const changes = {
    date: day.date,
    address: '4 Quillfield Row, Leeds',
    room: 'Meeting room 3',
    opensAt: '09:00',
    closesAt: '12:00',
    breaks: [],
    slotMinutes: 5,
    bookingOpensAt: '2020-01-01T00:00:00.000Z',
    bookingClosesAt: '2030-03-14T00:00:00.000Z',
    changesCloseAt: '2030-03-14T00:00:00.000Z',
    stations: [
      { id: stationA!.id, name: stationA!.name, photographerId: first.id },
      { id: stationB!.id, name: stationB!.name, photographerId: second.id },
    ],
  };
  return {
    client,
    office,
    day,
    admin,
    coordinator,
    changes,
    stationA: stationA!,
    stationB: stationB!,
    photographers: [first, second],
    late: { person: late, booking: lateBooking.body as { id: string } },
    early: { person: early, booking: earlyBooking.body as { id: string } },
  };
}

const bookingRow = (id: string) =>
  t.db
    .selectFrom('bookings')
    .innerJoin('stations', 'stations.id', 'bookings.stationId')
    .select(['bookings.startsAt', 'bookings.status', 'bookings.sequence', 'stations.name'])
    .where('bookings.id', '=', id)
    .executeTakeFirstOrThrow();

describe('editing a day', () => {
  it('previews a shorter day, then moves the booking that no longer fits and mails a raised SEQUENCE', async () => {
    const s = await dayWithTwoBookings();
    const shorter = { ...s.changes, closesAt: '11:00' };
    const preview = await s.admin
      .post(`/api/days/${s.day.id}/changes/preview`)
      .send(shorter)
      .expect(200);
    expect(preview.body).toMatchObject({
      seatsBefore: 36 * 2,
      seatsAfter: 24 * 2,
      cancelled: [],
      updated: 0,
      blocked: [],
    });
    // The nearest free seat to 11:30 in a day closing at 11:00 is the last slot, 10:55.
    expect(preview.body.moved).toEqual([
      {
        bookingId: s.late.booking.id,
        personName: expect.stringContaining('Robin'),
        from: { localTime: '11:30', stationName: 'Station A' },
        to: { localTime: '10:55', stationName: 'Station A' },
        reason: 'outside_hours',
      },
    ]);
    // A preview writes nothing.
    expect((await bookingRow(s.late.booking.id)).sequence).toBe(0);

    const saved = await s.admin
      .patch(`/api/days/${s.day.id}`)
      .send({ changes: shorter })
      .expect(200);
    expect(saved.body.day).toMatchObject({ closesAt: '11:00', booked: 2 });
    expect(saved.body.outcome.moved).toHaveLength(1);
    expect(await bookingRow(s.late.booking.id)).toMatchObject({
      startsAt: new Date('2030-03-14T10:55:00.000Z'),
      status: 'active',
      sequence: 1,
      name: 'Station A',
    });
    expect((await bookingRow(s.early.booking.id)).sequence).toBe(0);

    await runQueuedJobs(t);
    const mail = await t.mail.waitFor(s.late.person.email, { subjectIncludes: 'has moved' });
    const { calendar, vevent, text } = calendarOf(mail);
    // RFC 5546 3.2.2: an updated REQUEST keeps the UID and raises SEQUENCE.
    expect(calendar.getFirstPropertyValue('method')).toBe('REQUEST');
    expect(vevent.getFirstPropertyValue('sequence')).toBe(1);
    expect(text).toContain('DTSTART;TZID=Europe/London:20300314T105500');
    // The sitter whose seat still fits is not mailed.
    expect(t.mail.list().map((m) => m.to[0])).toEqual([s.late.person.email.toLowerCase()]);

    const audit = await t.db
      .selectFrom('auditEvents')
      .select(['action', 'details'])
      .where('subjectId', '=', s.day.id)
      .where('action', '=', 'day.edited')
      .executeTakeFirstOrThrow();
    expect(audit.details).toMatchObject({ moved: 1, cancelled: 0 });
  });

  it('removes a station and cancels its booking when asked to, with a calendar cancellation', async () => {
    const s = await dayWithTwoBookings();
    const oneStation = {
      ...s.changes,
      stations: [s.changes.stations[0]!],
      resolution: 'cancel',
    };
    const preview = await s.admin
      .post(`/api/days/${s.day.id}/changes/preview`)
      .send(oneStation)
      .expect(200);
    expect(preview.body.cancelled).toEqual([
      expect.objectContaining({
        bookingId: s.early.booking.id,
        to: null,
        reason: 'station_removed',
      }),
    ]);
    await s.admin.patch(`/api/days/${s.day.id}`).send({ changes: oneStation }).expect(200);
    // Kept for the record, cancelled, and still readable after its station was removed.
    expect(await bookingRow(s.early.booking.id)).toMatchObject({ status: 'cancelled' });
    const stations = await t.db
      .selectFrom('stations')
      .select('id')
      .where('dayId', '=', s.day.id)
      .execute();
    expect(stations.map((row) => row.id)).toEqual([s.stationA.id]);
    await runQueuedJobs(t);
    const mail = await t.mail.waitFor(s.early.person.email, { subjectIncludes: 'cancelled' });
    const { calendar, vevent } = calendarOf(mail);
    // RFC 5546 3.2.5: CANCEL with the same UID and a raised SEQUENCE.
    expect(calendar.getFirstPropertyValue('method')).toBe('CANCEL');
    expect(vevent.getFirstPropertyValue('sequence')).toBe(1);
  });

  it('moves a removed station’s sitter to a free seat at the same time, and a new station counts', async () => {
    const s = await dayWithTwoBookings();
    const swapped = {
      ...s.changes,
      stations: [
        s.changes.stations[0]!,
        { name: 'Station C', photographerId: s.photographers[1]!.id },
      ],
    };
    const saved = await s.admin
      .patch(`/api/days/${s.day.id}`)
      .send({ changes: swapped })
      .expect(200);
    expect(saved.body.outcome.moved[0]).toMatchObject({
      from: { localTime: '09:00', stationName: 'Station B' },
      to: { localTime: '09:00', stationName: 'Station A' },
    });
    expect(saved.body.day.stations.map((station: { name: string }) => station.name)).toEqual([
      'Station A',
      'Station C',
    ]);
  });

  it('refuses an edit that would move a sitting already begun, and writes nothing', async () => {
    const s = await dayWithTwoBookings();
    const before = t.clock.now().getTime();
    t.clock.advance(Date.parse('2030-03-14T09:02:00Z') - before);
    try {
      // Signed in on the day itself (a session from years before has expired).
      const admin = await signedInAgent(t, (await insertStaff(t.db)).email);
      const later = { ...s.changes, opensAt: '09:30' };
      const refused = await admin
        .patch(`/api/days/${s.day.id}`)
        .send({ changes: later })
        .expect(409);
      expect(refused.body.error.code).toBe('edit_blocked');
      expect(refused.body.error.message).toMatch(/has begun/);
      const day = await admin.get(`/api/days/${s.day.id}`).expect(200);
      expect(day.body.opensAt).toBe('09:00');
      expect((await bookingRow(s.early.booking.id)).sequence).toBe(0);
    } finally {
      t.clock.advance(before - t.clock.now().getTime());
    }
  });

  it('refuses bad edits with field errors: unknown station, no photographer, cut-off after the day', async () => {
    const s = await dayWithTwoBookings();
    const stranger = { ...s.changes.stations[0]!, id: '00000000-0000-4000-8000-000000000000' };
    await s.admin
      .patch(`/api/days/${s.day.id}`)
      .send({ changes: { ...s.changes, stations: [stranger] } })
      .expect(400);
    const unstaffed = await s.admin
      .patch(`/api/days/${s.day.id}`)
      .send({ changes: { ...s.changes, stations: [{ name: 'Station D', photographerId: null }] } })
      .expect(400);
    expect(unstaffed.body.error.details.fieldErrors.stations).toBeDefined();
    const late = await s.admin
      .patch(`/api/days/${s.day.id}`)
      .send({ changes: { ...s.changes, changesCloseAt: '2030-03-15T09:00:00.000Z' } })
      .expect(400);
    expect(late.body.error.details.fieldErrors.changesCloseAt).toBeDefined();
    await s.coordinator.patch(`/api/days/${s.day.id}`).send({ changes: s.changes }).expect(403);
  });
});

describe('cancelling a day', () => {
  it('cancels every booking with a calendar cancellation; invitations stop', async () => {
    const s = await dayWithTwoBookings();
    await s.coordinator.post(`/api/days/${s.day.id}/invitations`).expect(202);
    const cancelled = await s.admin
      .post(`/api/days/${s.day.id}/cancellation`)
      .send({ reason: 'The venue is closed.' })
      .expect(200);
    expect(cancelled.body.day.status).toBe('cancelled');
    expect(cancelled.body.outcome.cancelled).toHaveLength(2);
    expect(await bookingRow(s.late.booking.id)).toMatchObject({ status: 'cancelled' });
    await runQueuedJobs(t);
    for (const person of [s.late.person, s.early.person]) {
      const mail = await t.mail.waitFor(person.email, { subjectIncludes: 'cancelled' });
      expect(calendarOf(mail).calendar.getFirstPropertyValue('method')).toBe('CANCEL');
    }
    // The invitations queued before the cancellation are not sent, and the log says why.
    expect(t.mail.list().some((m) => m.subject.startsWith('Book your portrait'))).toBe(false);
    const log = await s.coordinator.get(`/api/days/${s.day.id}/mailings`).expect(200);
    expect(log.body.entries.filter((e: { kind: string }) => e.kind === 'invitation')).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ reason: 'Not sent: the day was cancelled' }),
      ]),
    );
    await s.coordinator.post(`/api/days/${s.day.id}/reminders`).expect(409);
    await s.admin.patch(`/api/days/${s.day.id}`).send({ changes: s.changes }).expect(409);
  });
});

describe('coordinator proposals', () => {
  it('a coordinator proposes, the studio sees it and applies it with the edit; declines another', async () => {
    const s = await dayWithTwoBookings();
    const longer = { ...s.changes, closesAt: '13:00' };
    // A coordinator sees the consequences too, but cannot save.
    await s.coordinator.post(`/api/days/${s.day.id}/changes/preview`).send(longer).expect(200);
    const proposed = await s.coordinator
      .post(`/api/days/${s.day.id}/proposals`)
      .send({ kind: 'edit', changes: longer, note: 'The lunch crowd wants later slots.' })
      .expect(201);
    expect(proposed.body).toMatchObject({ kind: 'edit', status: 'waiting' });
    const declinedOne = await s.coordinator
      .post(`/api/days/${s.day.id}/proposals`)
      .send({ kind: 'cancel', note: 'Maybe drop it.' })
      .expect(201);
    // Nothing changes until the studio applies it.
    expect((await s.admin.get(`/api/days/${s.day.id}`).expect(200)).body.closesAt).toBe('12:00');
    const listed = await s.admin.get(`/api/days/${s.day.id}/proposals`).expect(200);
    expect(listed.body.proposals.map((p: { id: string }) => p.id).sort()).toEqual(
      [proposed.body.id, declinedOne.body.id].sort(),
    );
    await s.admin
      .patch(`/api/days/${s.day.id}`)
      .send({ changes: proposed.body.changes, proposalId: proposed.body.id })
      .expect(200);
    expect((await s.admin.get(`/api/days/${s.day.id}`).expect(200)).body.closesAt).toBe('13:00');
    // Applied once: naming it again is refused and writes nothing.
    await s.admin
      .patch(`/api/days/${s.day.id}`)
      .send({ changes: s.changes, proposalId: proposed.body.id })
      .expect(404);
    expect((await s.admin.get(`/api/days/${s.day.id}`).expect(200)).body.closesAt).toBe('13:00');
    const declined = await s.admin
      .post(`/api/days/${s.day.id}/proposals/${declinedOne.body.id}/decline`)
      .expect(200);
    const statuses = Object.fromEntries(
      declined.body.proposals.map((p: { id: string; status: string }) => [p.id, p.status]),
    );
    expect(statuses).toEqual({ [proposed.body.id]: 'applied', [declinedOne.body.id]: 'declined' });
    // Another client's coordinator sees none of it.
    const other = await insertClient(t.db);
    const stranger = await insertStaff(t.db, { role: 'coordinator', clientId: other.id });
    const strangerAgent = await signedInAgent(t, stranger.email);
    await strangerAgent.get(`/api/days/${s.day.id}/proposals`).expect(404);
    await strangerAgent
      .post(`/api/days/${s.day.id}/proposals`)
      .send({ kind: 'cancel', note: '' })
      .expect(404);
  });
});

describe('booking for someone at a chosen station', () => {
  it('seats the person at the station asked for, refuses a taken one, and sitters cannot choose', async () => {
    const s = await dayWithTwoBookings();
    expect((await bookingRow(s.late.booking.id)).name).toBe('Station A');
    expect((await bookingRow(s.early.booking.id)).name).toBe('Station B');
    const slots = await s.admin.get(`/api/days/${s.day.id}/slots`).expect(200);
    const nine = slots.body.slots.find((slot: { localTime: string }) => slot.localTime === '09:00');
    expect(nine).toMatchObject({ free: 1, freeStationIds: [s.stationA.id] });
    const third = await insertPerson(t.db, s.client.id, { officeId: s.office.id });
    const taken = await s.coordinator
      .post('/api/bookings')
      .send({
        dayId: s.day.id,
        personId: third.id,
        startsAt: '2030-03-14T09:00:00.000Z',
        stationId: s.stationB.id,
      })
      .expect(409);
    expect(taken.body.error.code).toBe('station_taken');
    // Without a station, any free one is taken.
    const any = await s.coordinator
      .post('/api/bookings')
      .send({ dayId: s.day.id, personId: third.id, startsAt: '2030-03-14T09:00:00.000Z' })
      .expect(201);
    expect(any.body.stationName).toBe('Station A');
    // A sitter books a time; the studio places them.
    const sitterPerson = await insertPerson(t.db, s.client.id, { officeId: s.office.id });
    const sitter = await signedInSitter(t, sitterPerson.email);
    const refused = await sitter
      .post('/api/bookings')
      .send({ dayId: s.day.id, startsAt: '2030-03-14T09:05:00.000Z', stationId: s.stationA.id })
      .expect(400);
    expect(refused.body.error.details.fieldErrors.stationId).toBeDefined();
  });
});
