import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { startTestApp, type TestApp } from '../setup/test-app';
import { signedInAgent, signedInSitter } from './helpers';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ env: { RATE_LIMIT_PER_ADDRESS: '10000' } });
});
afterAll(() => t.close());

const validDay = (clientId: string, officeId: string, photographerId: string | null) => ({
  clientId,
  officeId,
  date: '2030-10-27',
  address: 'Brugmeesterkade 9, Rotterdam',
  room: 'Zaal 4',
  opensAt: '09:00',
  closesAt: '12:00',
  breaks: [{ start: '10:30', end: '10:45' }],
  slotMinutes: 5,
  bookingOpensAt: '2030-10-01T08:00:00Z',
  bookingClosesAt: '2030-10-26T16:00:00Z',
  changesCloseAt: '2030-10-26T16:00:00Z',
  inviteBy: 'office',
  stations: [
    { name: 'Station A', photographerId },
    { name: 'Station B', photographerId },
  ],
});

describe('shoot days', () => {
  it('the studio creates a day in the office zone; seats skip the break; the photographer sees it', async () => {
    const client = await insertClient(t.db);
    const office = await insertOffice(t.db, client.id, 'Rotterdam', 'Europe/Amsterdam');
    const photographer = await insertStaff(t.db, { role: 'photographer' });
    const admin = await signedInAgent(t, (await insertStaff(t.db)).email);
    const created = await admin
      .post('/api/days')
      .send(validDay(client.id, office.id, photographer.id))
      .expect(201);
    // 27 October 2030 is the last Sunday of October: the zone comes from the office.
    expect(created.body).toMatchObject({ timeZone: 'Europe/Amsterdam', status: 'confirmed' });
    expect(created.body.seats).toBe((36 - 3) * 2);
    const slots = await admin.get(`/api/days/${created.body.id}/slots`).expect(200);
    expect(slots.body.slots[0]).toMatchObject({
      localTime: '09:00',
      startsAt: '2030-10-27T08:00:00.000Z',
      offset: 'UTC+01:00',
      free: 2,
    });
    const own = await signedInAgent(t, photographer.email);
    const listed = await own.get('/api/days').expect(200);
    expect(listed.body.days.map((day: { id: string }) => day.id)).toEqual([created.body.id]);
    await own.get(`/api/days/${created.body.id}/schedule`).expect(200);
  });

  it('refuses bad input with field errors and writes nothing', async () => {
    const client = await insertClient(t.db);
    const office = await insertOffice(t.db, client.id, 'Porto', 'Europe/Lisbon');
    const photographer = await insertStaff(t.db, { role: 'photographer' });
    const admin = await signedInAgent(t, (await insertStaff(t.db)).email);
    const before = await t.db
      .selectFrom('shootDays')
      .select(t.db.fn.countAll().as('n'))
      .executeTakeFirst();
    const reversed = await admin
      .post('/api/days')
      .send({
        ...validDay(client.id, office.id, photographer.id),
        opensAt: '12:00',
        closesAt: '09:00',
      })
      .expect(400);
    expect(reversed.body.error.details.fieldErrors.closesAt).toBeDefined();
    const unstaffed = await admin
      .post('/api/days')
      .send(validDay(client.id, office.id, null))
      .expect(400);
    expect(unstaffed.body.error.details.fieldErrors.stations).toBeDefined();
    const notAPhotographer = await insertStaff(t.db, { role: 'studio_admin' });
    await admin
      .post('/api/days')
      .send(validDay(client.id, office.id, notAPhotographer.id))
      .expect(400);
    const otherOffice = await insertOffice(t.db, (await insertClient(t.db)).id);
    const foreign = await admin
      .post('/api/days')
      .send(validDay(client.id, otherOffice.id, photographer.id))
      .expect(400);
    expect(foreign.body.error.details.fieldErrors.officeId).toBeDefined();
    const after = await t.db
      .selectFrom('shootDays')
      .select(t.db.fn.countAll().as('n'))
      .executeTakeFirst();
    expect(after).toEqual(before);
  });

  it('a coordinator proposes for their own client; sitters see it only once the studio confirms', async () => {
    const client = await insertClient(t.db);
    const office = await insertOffice(t.db, client.id, 'Leeds', 'Europe/London');
    const photographer = await insertStaff(t.db, { role: 'photographer' });
    const coordinatorAccount = await insertStaff(t.db, {
      role: 'coordinator',
      clientId: client.id,
    });
    const coordinator = await signedInAgent(t, coordinatorAccount.email);
    const person = await insertPerson(t.db, client.id, { officeId: office.id });

    const stranger = await insertClient(t.db);
    const strangerOffice = await insertOffice(t.db, stranger.id);
    await coordinator
      .post('/api/days')
      .send(validDay(stranger.id, strangerOffice.id, null))
      .expect(404);

    const proposed = await coordinator
      .post('/api/days')
      .send(validDay(client.id, office.id, photographer.id))
      .expect(201);
    expect(proposed.body.status).toBe('proposed');
    // The coordinator cannot staff stations: the photographer they named was dropped.
    expect(
      proposed.body.stations.every(
        (s: { photographerId: string | null }) => s.photographerId === null,
      ),
    ).toBe(true);

    const sitter = await signedInSitter(t, person.email);
    expect((await sitter.get('/api/sitters/me/days').expect(200)).body.days).toEqual([]);
    await sitter.get(`/api/days/${proposed.body.id}/slots`).expect(404);
    await coordinator.post(`/api/days/${proposed.body.id}/invitations`).expect(409);

    const admin = await signedInAgent(t, (await insertStaff(t.db)).email);
    await admin
      .post(`/api/days/${proposed.body.id}/confirmation`)
      .send({ stations: [{ id: proposed.body.stations[0].id, photographerId: photographer.id }] })
      .expect(400);
    const confirmed = await admin
      .post(`/api/days/${proposed.body.id}/confirmation`)
      .send({
        stations: proposed.body.stations.map((s: { id: string }) => ({
          id: s.id,
          photographerId: photographer.id,
        })),
      })
      .expect(200);
    expect(confirmed.body.status).toBe('confirmed');
    const days = (await sitter.get('/api/sitters/me/days').expect(200)).body.days;
    expect(days).toHaveLength(1);
    expect(days[0]).toMatchObject({
      id: proposed.body.id,
      timeZone: 'Europe/London',
      booking: null,
    });
  });

  it('a hand-picked list invites exactly those people, and only from the client roster', async () => {
    const client = await insertClient(t.db);
    const office = await insertOffice(t.db, client.id, 'Leeds', 'Europe/London');
    const photographer = await insertStaff(t.db, { role: 'photographer' });
    const admin = await signedInAgent(t, (await insertStaff(t.db)).email);
    const picked = await insertPerson(t.db, client.id, { officeId: office.id });
    const left = await insertPerson(t.db, client.id, { officeId: office.id });
    const outsider = await insertPerson(t.db, (await insertClient(t.db)).id);
    const base = { ...validDay(client.id, office.id, photographer.id), inviteBy: 'list' };
    const refused = await admin
      .post('/api/days')
      .send({ ...base, invitePersonIds: [picked.id, outsider.id] })
      .expect(400);
    expect(refused.body.error.details.fieldErrors.invitePersonIds).toBeDefined();
    const day = await admin
      .post('/api/days')
      .send({ ...base, invitePersonIds: [picked.id] })
      .expect(201);
    const progress = await admin.get(`/api/days/${day.body.id}/progress`).expect(200);
    expect(progress.body.unbookedPeople.map((person: { id: string }) => person.id)).toEqual([
      picked.id,
    ]);
    const leftOut = await signedInSitter(t, left.email);
    await leftOut.get(`/api/days/${day.body.id}/slots`).expect(404);
  });
});
