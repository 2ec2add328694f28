import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { startTestApp, type TestApp } from '../setup/test-app';
import { signedInAgent } from './helpers';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.close());

async function bookedPerson() {
  const client = await insertClient(t.db);
  const office = await insertOffice(t.db, client.id);
  const booked = await insertPerson(t.db, client.id, { officeId: office.id, givenName: 'Booked' });
  const waiting = await insertPerson(t.db, client.id, {
    officeId: office.id,
    givenName: 'Waiting',
  });
  const photographer = await insertStaff(t.db, { role: 'photographer' });
  const day = await insertDay(t.db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [photographer.id],
  });
  const station = day.stations[0];
  if (!station) throw new Error('no station');
  const booking = await t.db
    .insertInto('bookings')
    .values({
      dayId: day.id,
      stationId: station.id,
      personId: booked.id,
      startsAt: new Date(`${day.date}T09:00:00Z`),
      // Pass tokens are unique: 26 base32 capitals made from this person's id.
      passToken: booked.id.replace(/-/g, '').toUpperCase().slice(0, 26),
      calendarUid: `erasure-${booked.id}@likeness`,
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  const coordinator = await insertStaff(t.db, { role: 'coordinator', clientId: client.id });
  return { client, booked, waiting, booking, agent: await signedInAgent(t, coordinator.email) };
}

describe('people and their bookings', () => {
  it('filters the directory by booking status', async () => {
    const { client, agent } = await bookedPerson();
    const booked = await agent.get(`/api/clients/${client.id}/people?booking=booked`).expect(200);
    expect(booked.body.people.map((p: { givenName: string }) => p.givenName)).toEqual(['Booked']);
    expect(booked.body.people[0].booked).toBe(true);
    const waiting = await agent
      .get(`/api/clients/${client.id}/people?booking=not_booked`)
      .expect(200);
    expect(waiting.body.people.map((p: { givenName: string }) => p.givenName)).toEqual(['Waiting']);
  });

  it('erasure removes the person and their bookings, and the audit entry names no one', async () => {
    const { client, booked, booking, agent } = await bookedPerson();
    await agent
      .post(`/api/clients/${client.id}/people/${booked.id}/erasure`)
      .send({ confirmEmail: booked.email })
      .expect(204);
    expect(
      await t.db.selectFrom('bookings').select('id').where('id', '=', booking.id).execute(),
    ).toEqual([]);
    expect(
      await t.db.selectFrom('people').select('id').where('id', '=', booked.id).execute(),
    ).toEqual([]);
    const audit = await t.db
      .selectFrom('auditEvents')
      .select(['action', 'details'])
      .where('subjectId', '=', booked.id)
      .execute();
    expect(audit).toEqual([{ action: 'person.erased', details: { clientId: client.id } }]);
  });

  it('deactivating keeps the person and their booking', async () => {
    const { client, booked, booking, agent } = await bookedPerson();
    await agent
      .patch(`/api/clients/${client.id}/people/${booked.id}`)
      .send({ active: false })
      .expect(200);
    expect(
      await t.db.selectFrom('bookings').select('id').where('id', '=', booking.id).execute(),
    ).toHaveLength(1);
  });
});
