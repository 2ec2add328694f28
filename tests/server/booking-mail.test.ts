import ICAL from 'ical.js';
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CaughtMail } from '../../server/adapters/mail/mail-catcher';
import { DEFAULT_MAX_ATTEMPTS } from '../../server/jobs/job-queue';
import { bookingMailJob } from '../../server/modules/booking/booking.service';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { decodePng } from '../reference/decode-png';
import { startTestApp, type TestApp } from '../setup/test-app';
import { runQueuedJobs } from './booking-jobs';
import { signedInSitter } from './helpers';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({
    env: { RATE_LIMIT_PER_ADDRESS: '10000', MAIL_REPLY_TO: 'desk@northlight.example' },
  });
});
afterAll(() => t.close());

function calendarOf(mail: CaughtMail) {
  const part = mail.attachments.find((item) => item.contentType.startsWith('text/calendar'));
  if (!part) throw new Error('no calendar part');
  const text = Buffer.from(part.content, 'base64').toString('utf8');
  const calendar = new ICAL.Component(ICAL.parse(text));
  return { text, calendar, vevent: calendar.getFirstSubcomponent('vevent')! };
}

describe('the confirmation mail', () => {
  it('carries the pass (decodable by jsqr) and a calendar invitation that follows moves and cancels', async () => {
    const client = await insertClient(t.db, { name: 'Halvorsen & Pike Engineering' });
    const office = await insertOffice(t.db, client.id, 'Rotterdam', 'Europe/Amsterdam');
    const photographer = await insertStaff(t.db, { role: 'photographer' });
    const day = await insertDay(t.db, {
      clientId: client.id,
      officeId: office.id,
      photographerIds: [photographer.id],
      timeZone: 'Europe/Amsterdam',
      date: '2030-07-04',
    });
    const person = await insertPerson(t.db, client.id, { officeId: office.id });
    const sitter = await signedInSitter(t, person.email);
    t.mail.clear();

    const booked = await sitter
      .post('/api/bookings')
      .send({ dayId: day.id, startsAt: '2030-07-04T07:15:00.000Z', preferredName: 'Rob' })
      .expect(201);
    expect(booked.body).toMatchObject({ localTime: '09:15', offset: 'UTC+02:00' });
    // The confirmation is a job written with the booking; the worker sends it.
    expect(t.mail.list()).toHaveLength(0);
    expect(await runQueuedJobs(t)).toBe(1);
    const mail = await t.mail.waitFor(person.email, { subjectIncludes: 'is booked' });
    expect(mail.subject).toContain('Halvorsen & Pike Engineering');
    expect(mail.text).toContain('09:15 (Europe/Amsterdam, UTC+02:00)');
    // The image sits in the HTML part (mailparser inlines cid: references as data: URIs).
    expect(mail.html).toMatch(/<img src="(cid:pass@likeness|data:image\/png;base64,)/);

    // The pass: the PNG in the mail decodes (jsqr) to the stored opaque token, nothing else.
    const png = mail.attachments.find((item) => item.contentType === 'image/png');
    const row = await t.db
      .selectFrom('bookings')
      .select(['passToken', 'calendarUid'])
      .where('id', '=', booked.body.id)
      .executeTakeFirstOrThrow();
    const { code } = decodePng(Buffer.from(png!.content, 'base64'));
    expect(code?.data).toBe(row.passToken);
    expect(code?.data).not.toContain(person.email);
    const served = await sitter.get(`/api/bookings/${booked.body.id}/pass.png`).expect(200);
    expect(decodePng(served.body as Buffer).code?.data).toBe(row.passToken);

    // Mail comes from the studio, and replies go to its desk.
    expect(mail.from).toBe('"Northlight Portrait Co." <bookings@northlight.example>');
    expect(mail.replyTo).toBe('desk@northlight.example');
    expect(mail.text).toMatch(/-- \nNorthlight Portrait Co\.\n$/);
    expect(mail.text).not.toContain('Likeness');

    // RFC 5546: REQUEST, DTSTART with TZID, stable UID, SEQUENCE 0; the studio organises it at
    // the address that takes replies.
    const first = calendarOf(mail);
    expect(first.calendar.getFirstPropertyValue('method')).toBe('REQUEST');
    const organizer = first.vevent.getFirstProperty('organizer')!;
    expect(organizer.getFirstValue()).toBe('mailto:desk@northlight.example');
    expect(organizer.getParameter('cn')).toBe('Northlight Portrait Co.');
    const description = String(first.vevent.getFirstPropertyValue('description'));
    expect(description).toContain('Station A');
    expect(description).not.toMatch(/Station Station/);
    expect(first.text).toContain('DTSTART;TZID=Europe/Amsterdam:20300704T091500');
    expect(first.vevent.getFirstPropertyValue('uid')).toBe(row.calendarUid);
    expect(first.vevent.getFirstPropertyValue('sequence')).toBe(0);
    expect(first.vevent.getFirstPropertyValue('dtstamp')).toBeTruthy();

    t.mail.clear();
    await sitter
      .patch(`/api/bookings/${booked.body.id}`)
      .send({ startsAt: '2030-07-04T07:40:00.000Z' })
      .expect(200);
    await runQueuedJobs(t);
    const movedMail = await t.mail.waitFor(person.email, { subjectIncludes: 'has moved' });
    const moved = calendarOf(movedMail);
    expect(moved.vevent.getFirstPropertyValue('uid')).toBe(row.calendarUid);
    expect(moved.vevent.getFirstPropertyValue('sequence')).toBe(1);
    expect(moved.text).toContain('DTSTART;TZID=Europe/Amsterdam:20300704T094000');

    t.mail.clear();
    await sitter.delete(`/api/bookings/${booked.body.id}`).expect(200);
    await runQueuedJobs(t);
    const cancelMail = await t.mail.waitFor(person.email, { subjectIncludes: 'cancelled' });
    const cancelled = calendarOf(cancelMail);
    expect(cancelled.calendar.getFirstPropertyValue('method')).toBe('CANCEL');
    expect(cancelled.vevent.getFirstPropertyValue('uid')).toBe(row.calendarUid);
    expect(cancelled.vevent.getFirstPropertyValue('sequence')).toBe(2);
    await sitter.get(`/api/bookings/${booked.body.id}/pass.png`).expect(404);
  });
});

describe('the confirmation job', () => {
  it('is queued with the booking, with the same attempt limit as every other mail job', async () => {
    const client = await insertClient(t.db);
    const office = await insertOffice(t.db, client.id, 'Leeds', 'Europe/London');
    const photographer = await insertStaff(t.db, { role: 'photographer' });
    const day = await insertDay(t.db, {
      clientId: client.id,
      officeId: office.id,
      photographerIds: [photographer.id],
    });
    const person = await insertPerson(t.db, client.id, { officeId: office.id });
    const sitter = await signedInSitter(t, person.email);
    const booked = await sitter
      .post('/api/bookings')
      .send({ dayId: day.id, startsAt: '2030-03-14T09:30:00.000Z' })
      .expect(201);
    // The public view leaves the payload out; the job table behind it has it.
    const jobs = await sql<{ payload: unknown; maxAttempts: number }>`
      select jobs.payload, jobs.max_attempts
      from graphile_worker._private_jobs jobs
      join graphile_worker._private_tasks tasks on tasks.id = jobs.task_id
      where tasks.identifier = ${bookingMailJob}
        and jobs.payload ->> 'bookingId' = ${booked.body.id}`.execute(t.db);
    expect(jobs.rows).toEqual([
      { payload: { bookingId: booked.body.id, kind: 'booked' }, maxAttempts: DEFAULT_MAX_ATTEMPTS },
    ]);
  });
});

describe('without a reply address', () => {
  it('publishes the calendar entry (no reply asked) with the studio as organiser', async () => {
    const quiet = await startTestApp({ env: { RATE_LIMIT_PER_ADDRESS: '10000' } });
    try {
      const client = await insertClient(quiet.db, { name: 'Halvorsen & Pike Engineering' });
      const office = await insertOffice(quiet.db, client.id, 'Leeds');
      const photographer = await insertStaff(quiet.db, { role: 'photographer' });
      const day = await insertDay(quiet.db, {
        clientId: client.id,
        officeId: office.id,
        photographerIds: [photographer.id],
        date: '2030-07-04',
      });
      const person = await insertPerson(quiet.db, client.id, { officeId: office.id });
      const sitter = await signedInSitter(quiet, person.email);
      await sitter
        .post('/api/bookings')
        .send({ dayId: day.id, startsAt: '2030-07-04T08:15:00.000Z' })
        .expect(201);
      await runQueuedJobs(quiet);
      const mail = await quiet.mail.waitFor(person.email, { subjectIncludes: 'is booked' });
      expect(mail.replyTo).toBe('');
      const { calendar, vevent } = calendarOf(mail);
      // RFC 5546 3.2.1: PUBLISH has an ORGANIZER and no ATTENDEE.
      expect(calendar.getFirstPropertyValue('method')).toBe('PUBLISH');
      expect(vevent.getFirstPropertyValue('organizer')).toBe('mailto:bookings@northlight.example');
      expect(vevent.getAllProperties('attendee')).toHaveLength(0);
    } finally {
      await quiet.close();
    }
  });
});
