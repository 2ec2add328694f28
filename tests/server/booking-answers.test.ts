import { randomUUID } from 'node:crypto';
import ICAL from 'ical.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { startTestApp, type TestApp } from '../setup/test-app';
import { signedInSitter } from './helpers';

let t: TestApp;
let day: Awaited<ReturnType<typeof insertDay>>;
let clientId: string;
let officeId: string;
beforeAll(async () => {
  t = await startTestApp({ env: { RATE_LIMIT_PER_ADDRESS: '10000' } });
  const client = await insertClient(t.db, { name: 'Halvorsen & Pike Engineering' });
  clientId = client.id;
  officeId = (await insertOffice(t.db, client.id, 'Porto', 'Europe/Lisbon')).id;
  const photographer = await insertStaff(t.db, { role: 'photographer' });
  day = await insertDay(t.db, {
    clientId,
    officeId,
    photographerIds: [photographer.id],
    timeZone: 'Europe/Lisbon',
    date: '2030-07-04',
  });
});
afterAll(() => t.close());

let minute = 0;
async function bookedSitter() {
  const person = await insertPerson(t.db, clientId, { officeId });
  const sitter = await signedInSitter(t, person.email);
  const startsAt = new Date(Date.UTC(2030, 6, 4, 8, 0 + 5 * minute++)).toISOString();
  const booked = await sitter
    .post('/api/bookings')
    .send({ dayId: day.id, startsAt, glasses: true })
    .expect(201);
  return { person, sitter, booking: booked.body as { id: string; sequence: number } };
}

describe("the sitter's own booking", () => {
  it('downloads as a calendar file that ical.js reads back (RFC 5545; PUBLISH per RFC 5546 3.2.1)', async () => {
    const { sitter, booking } = await bookedSitter();
    const response = await sitter
      .get(`/api/bookings/${booking.id}/calendar.ics`)
      .buffer(true)
      .parse((res, done) => {
        let text = '';
        res.setEncoding('utf8');
        res.on('data', (chunk: string) => (text += chunk));
        res.on('end', () => done(null, text));
      })
      .expect(200);
    expect(response.headers['content-type']).toMatch(/^text\/calendar/);
    expect(response.headers['content-disposition']).toContain('portrait-sitting.ics');
    const calendar = new ICAL.Component(ICAL.parse(response.body as string));
    expect(calendar.getFirstPropertyValue('method')).toBe('PUBLISH');
    const event = calendar.getFirstSubcomponent('vevent')!;
    const row = await t.db
      .selectFrom('bookings')
      .select(['calendarUid', 'sequence'])
      .where('id', '=', booking.id)
      .executeTakeFirstOrThrow();
    // The same entry as the mailed one: one UID, so calendars update it rather than add a copy.
    expect(event.getFirstPropertyValue('uid')).toBe(row.calendarUid);
    expect(event.getFirstPropertyValue('sequence')).toBe(row.sequence);
    const start = event.getFirstPropertyValue('dtstart') as ICAL.Time;
    start.zone = new ICAL.Timezone(calendar.getFirstSubcomponent('vtimezone')!);
    expect(start.toJSDate().toISOString()).toBe(
      new Date(Date.UTC(2030, 6, 4, 8, 5 * (minute - 1))).toISOString(),
    );
  });

  it('shows and changes the answers given at booking, checked like the booking form', async () => {
    const { sitter, booking } = await bookedSitter();
    const changed = await sitter
      .put(`/api/bookings/${booking.id}/answers`)
      .send({
        preferredName: 'Tó',
        glasses: false,
        accessNeeds: 'Step-free access, please',
        flashSensitive: true,
      })
      .expect(200);
    expect(changed.body).toMatchObject({
      preferredName: 'Tó',
      glasses: false,
      accessNeeds: 'Step-free access, please',
      flashSensitive: true,
    });
    const days = await sitter.get('/api/sitters/me/days').expect(200);
    expect(days.body.days[0].booking).toMatchObject({ flashSensitive: true, preferredName: 'Tó' });

    const tooLong = await sitter
      .put(`/api/bookings/${booking.id}/answers`)
      .send({ preferredName: 'x'.repeat(81), glasses: false, flashSensitive: false })
      .expect(400);
    expect(tooLong.body.error.details.fieldErrors.preferredName).toEqual([
      'Use at most 80 characters.',
    ]);
    const row = await t.db
      .selectFrom('bookings')
      .select('preferredName')
      .where('id', '=', booking.id)
      .executeTakeFirstOrThrow();
    expect(row.preferredName).toBe('Tó');
  });

  it("is nobody else's to read or change", async () => {
    const { booking } = await bookedSitter();
    const other = await bookedSitter();
    await other.sitter.get(`/api/bookings/${booking.id}/calendar.ics`).expect(404);
    await other.sitter
      .put(`/api/bookings/${booking.id}/answers`)
      .send({ glasses: true, flashSensitive: false })
      .expect(404);
  });

  it('keeps the answers once the sitter has checked in, and has no calendar after a cancel', async () => {
    const { sitter, booking, person } = await bookedSitter();
    const row = await t.db
      .selectFrom('bookings')
      .select(['stationId'])
      .where('id', '=', booking.id)
      .executeTakeFirstOrThrow();
    const staff = await insertStaff(t.db, { role: 'photographer' });
    await t.db
      .insertInto('checkIns')
      .values({
        id: randomUUID(),
        dayId: day.id,
        personId: person.id,
        bookingId: booking.id,
        stationId: row.stationId,
        method: 'search',
        checkedInAt: new Date(),
        tabletAt: new Date(),
        byUserId: staff.id,
      })
      .execute();
    const refused = await sitter
      .put(`/api/bookings/${booking.id}/answers`)
      .send({ glasses: false, flashSensitive: true })
      .expect(409);
    expect(refused.body.error.code).toBe('already_checked_in');

    const second = await bookedSitter();
    await second.sitter.delete(`/api/bookings/${second.booking.id}`).expect(200);
    await second.sitter.get(`/api/bookings/${second.booking.id}/calendar.ics`).expect(404);
  });
});
