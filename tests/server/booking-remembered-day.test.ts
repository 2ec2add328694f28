import { sql } from 'kysely';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { startTestApp, type TestApp } from '../setup/test-app';
import { signedInSitter } from './helpers';

// A sitter's claim on a day the process read lately takes the day from memory (booking-claim.ts)
// and books only if the day row is still that version. These change the day behind the app's
// back, as another web process or a direct edit would, and expect the answer the day as it is
// now gives.

let t: TestApp;
let clientId: string;
let officeId: string;
let photographerId: string;

beforeAll(async () => {
  t = await startTestApp({ env: { RATE_LIMIT_PER_ADDRESS: '10000' } });
  clientId = (await insertClient(t.db)).id;
  officeId = (await insertOffice(t.db, clientId, 'Leeds', 'Europe/London')).id;
  photographerId = (await insertStaff(t.db, { role: 'photographer' })).id;
});
afterAll(() => t.close());

async function sitters(count: number, dayOptions: Partial<Parameters<typeof insertDay>[1]> = {}) {
  const day = await insertDay(t.db, {
    clientId,
    officeId,
    photographerIds: [photographerId],
    ...dayOptions,
  });
  const agents: Array<{ id: string; agent: request.Agent }> = [];
  for (let index = 0; index < count; index += 1) {
    const person = await insertPerson(t.db, clientId, { officeId });
    agents.push({ id: person.id, agent: await signedInSitter(t, person.email) });
    if (dayOptions.inviteBy === 'list') {
      await t.db.insertInto('dayInvitees').values({ dayId: day.id, personId: person.id }).execute();
    }
  }
  // The first booking makes the app read, and remember, the day.
  await agents[0]!.agent
    .post('/api/bookings')
    .send({ dayId: day.id, startsAt: '2030-03-14T09:00:00.000Z' })
    .expect(201);
  return { day, agents };
}

const activeBookingsOf = (dayId: string) =>
  t.db
    .selectFrom('bookings')
    .select(['personId', 'startsAt'])
    .where('dayId', '=', dayId)
    .where('status', '=', 'active')
    .execute();

describe('claims on a day the app has read before', () => {
  it('a slot the day no longer has is refused after the hours were shortened elsewhere', async () => {
    const { day, agents } = await sitters(2);
    await sql`update shoot_days set closes_at = '10:00' where id = ${day.id}`.execute(t.db);
    const late = await agents[1]!.agent
      .post('/api/bookings')
      .send({ dayId: day.id, startsAt: '2030-03-14T11:00:00.000Z' });
    expect(late.status).toBe(400);
    expect(late.body.error.details.fieldErrors).toMatchObject({
      startsAt: ['Pick one of the listed slots.'],
    });
    expect(await activeBookingsOf(day.id)).toHaveLength(1);
    // A slot the shortened day still has books as before.
    await agents[1]!.agent
      .post('/api/bookings')
      .send({ dayId: day.id, startsAt: '2030-03-14T09:30:00.000Z' })
      .expect(201);
  });

  it('booking closed meanwhile is refused as closed', async () => {
    const { day, agents } = await sitters(2);
    await sql`update shoot_days set booking_closes_at = '2020-06-01T00:00:00Z' where id = ${day.id}`.execute(
      t.db,
    );
    const closed = await agents[1]!.agent
      .post('/api/bookings')
      .send({ dayId: day.id, startsAt: '2030-03-14T10:00:00.000Z' });
    expect(closed.status).toBe(409);
    expect(closed.body.error.code).toBe('booking_closed');
    expect(await activeBookingsOf(day.id)).toHaveLength(1);
  });

  it('a sitter taken off the invitation list meanwhile gets 404, and nothing is booked', async () => {
    const { day, agents } = await sitters(2, { inviteBy: 'list' });
    // The list lives in its own table: the day row, and so its version, does not change.
    await t.db
      .deleteFrom('dayInvitees')
      .where('dayId', '=', day.id)
      .where('personId', '=', agents[1]!.id)
      .execute();
    const refused = await agents[1]!.agent
      .post('/api/bookings')
      .send({ dayId: day.id, startsAt: '2030-03-14T10:00:00.000Z' });
    expect(refused.status).toBe(404);
    expect((await activeBookingsOf(day.id)).map((row) => row.personId)).toEqual([agents[0]!.id]);
  });

  it('sitters racing for the last seat on a remembered day: one booking, clear refusals', async () => {
    const { day, agents } = await sitters(12, { closesAt: '09:10' });
    const responses = await Promise.all(
      agents
        .slice(1)
        .map(({ agent }) =>
          agent.post('/api/bookings').send({ dayId: day.id, startsAt: '2030-03-14T09:05:00.000Z' }),
        ),
    );
    const statuses = responses.map((response) => response.status).sort();
    expect(statuses.filter((status) => status === 201)).toHaveLength(1);
    expect(statuses.filter((status) => status === 409)).toHaveLength(10);
    for (const refused of responses.filter((response) => response.status === 409)) {
      expect(refused.body.error.code).toBe('slot_taken');
    }
    const booked = await activeBookingsOf(day.id);
    expect(booked.map((row) => row.startsAt.toISOString()).sort()).toEqual([
      '2030-03-14T09:00:00.000Z',
      '2030-03-14T09:05:00.000Z',
    ]);
  });
});
