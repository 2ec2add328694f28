import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { startTestApp, type TestApp } from '../setup/test-app';
import { signedInAgent, signedInSitter } from './helpers';

let t: TestApp;
let server: Server;
let base: string;
let clientId: string;
let officeId: string;
let photographers: string[];
let coordinatorCookie: string;

beforeAll(async () => {
  t = await startTestApp({
    env: { RATE_LIMIT_PER_ADDRESS: '10000', RATE_LIMIT_PER_ACCOUNT: '10000' },
  });
  const client = await insertClient(t.db, { name: 'Halvorsen & Pike Engineering' });
  clientId = client.id;
  officeId = (await insertOffice(t.db, clientId, 'Leeds', 'Europe/London')).id;
  photographers = [
    (await insertStaff(t.db, { role: 'photographer' })).id,
    (await insertStaff(t.db, { role: 'photographer' })).id,
  ];
  const coordinator = await insertStaff(t.db, { role: 'coordinator', clientId });
  const login = await request(t.app)
    .post('/api/session')
    .send({ email: coordinator.email, password: 'correct horse battery' })
    .expect(201);
  coordinatorCookie = String(login.headers['set-cookie']?.[0]).split(';')[0]!;
  server = t.app.listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(async () => {
  await new Promise((resolve) => server.close(resolve));
  await t.close();
});

const activeBookings = (dayId: string) =>
  t.db
    .selectFrom('bookings')
    .selectAll()
    .where('dayId', '=', dayId)
    .where('status', '=', 'active')
    .execute();

describe('claiming a seat', () => {
  it('200 parallel claims for the last free seat: exactly one booking, 199 clear refusals', async () => {
    // One station, one slot: a single seat.
    const day = await insertDay(t.db, {
      clientId,
      officeId,
      photographerIds: [photographers[0]!],
      opensAt: '09:00',
      closesAt: '09:05',
    });
    const people = await Promise.all(
      Array.from({ length: 200 }, () => insertPerson(t.db, clientId, { officeId })),
    );
    const responses = await Promise.all(
      people.map((person) =>
        fetch(`${base}/api/bookings`, {
          method: 'POST',
          headers: { 'Content-Type': 'application/json', Cookie: coordinatorCookie },
          body: JSON.stringify({
            dayId: day.id,
            personId: person.id,
            startsAt: '2030-03-14T09:00:00.000Z',
          }),
        }).then(async (response) => ({ status: response.status, body: await response.json() })),
      ),
    );
    const statuses = responses.map((response) => response.status);
    expect(statuses.filter((status) => status === 201)).toHaveLength(1);
    const refused = responses.filter((response) => response.status === 409);
    expect(refused).toHaveLength(199);
    for (const response of refused) expect(response.body.error.code).toBe('slot_taken');
    expect(await activeBookings(day.id)).toHaveLength(1);
  });

  it('a sitter double-clicking gets one booking, and the database refuses a second seat holder', async () => {
    const day = await insertDay(t.db, { clientId, officeId, photographerIds: photographers });
    const person = await insertPerson(t.db, clientId, { officeId });
    const sitter = await signedInSitter(t, person.email);
    const claim = () =>
      sitter.post('/api/bookings').send({
        dayId: day.id,
        startsAt: '2030-03-14T10:00:00.000Z',
        glasses: true,
        flashSensitive: true,
      });
    const [first, second] = await Promise.all([claim(), claim()]);
    expect([first.status, second.status].sort()).toEqual([200, 201]);
    expect(first.body.id).toBe(second.body.id);
    const rows = await activeBookings(day.id);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ glasses: true, flashSensitive: true });

    // The partial unique index itself refuses a second sitter on the same seat.
    const other = await insertPerson(t.db, clientId, { officeId });
    await expect(
      t.db
        .insertInto('bookings')
        .values({
          dayId: day.id,
          stationId: rows[0]!.stationId,
          personId: other.id,
          startsAt: rows[0]!.startsAt,
          passToken: 'X'.repeat(26),
          calendarUid: 'manual@test',
        })
        .execute(),
    ).rejects.toThrow(/bookings_one_per_seat/);
  });

  it('fills every station of a slot, then refuses; one booking per sitter per day', async () => {
    const day = await insertDay(t.db, { clientId, officeId, photographerIds: photographers });
    const coordinator = request.agent(t.app).set('Cookie', coordinatorCookie);
    const startsAt = '2030-03-14T11:00:00.000Z';
    const [a, b, c] = await Promise.all(
      [1, 2, 3].map(() => insertPerson(t.db, clientId, { officeId })),
    );
    await coordinator
      .post('/api/bookings')
      .send({ dayId: day.id, personId: a!.id, startsAt })
      .expect(201);
    await coordinator
      .post('/api/bookings')
      .send({ dayId: day.id, personId: b!.id, startsAt })
      .expect(201);
    const full = await coordinator
      .post('/api/bookings')
      .send({ dayId: day.id, personId: c!.id, startsAt });
    expect(full.status).toBe(409);
    const again = await coordinator
      .post('/api/bookings')
      .send({ dayId: day.id, personId: a!.id, startsAt: '2030-03-14T11:05:00.000Z' });
    expect(again.body.error.code).toBe('already_booked');
    const slots = await coordinator.get(`/api/days/${day.id}/slots`).expect(200);
    const slot = slots.body.slots.find((s: { startsAt: string }) => s.startsAt === startsAt);
    expect(slot.free).toBe(0);
  });

  it('bad input is refused with a reason and writes nothing', async () => {
    const day = await insertDay(t.db, { clientId, officeId, photographerIds: photographers });
    const person = await insertPerson(t.db, clientId, { officeId });
    const coordinator = request.agent(t.app).set('Cookie', coordinatorCookie);
    const offGrid = await coordinator
      .post('/api/bookings')
      .send({ dayId: day.id, personId: person.id, startsAt: '2030-03-14T09:02:00.000Z' });
    expect(offGrid.status).toBe(400);
    expect(offGrid.body.error.details.fieldErrors.startsAt).toBeDefined();
    const missing = await coordinator.post('/api/bookings').send({ dayId: day.id });
    expect(missing.status).toBe(400);
    expect(await activeBookings(day.id)).toHaveLength(0);
  });

  it('keeps each party to their own: other clients, other sitters, unassigned photographers get 404', async () => {
    const day = await insertDay(t.db, { clientId, officeId, photographerIds: [photographers[0]!] });
    const person = await insertPerson(t.db, clientId, { officeId });
    const coordinator = request.agent(t.app).set('Cookie', coordinatorCookie);
    const made = await coordinator
      .post('/api/bookings')
      .send({ dayId: day.id, personId: person.id, startsAt: '2030-03-14T09:30:00.000Z' })
      .expect(201);

    const otherClient = await insertClient(t.db);
    const stranger = await insertStaff(t.db, { role: 'coordinator', clientId: otherClient.id });
    const strangerAgent = await signedInAgent(t, stranger.email);
    await strangerAgent.get(`/api/days/${day.id}`).expect(404);
    await strangerAgent.get(`/api/bookings/${made.body.id}/pass.png`).expect(404);
    await strangerAgent.delete(`/api/bookings/${made.body.id}`).expect(404);

    const otherSitter = await insertPerson(t.db, clientId, { officeId });
    const sitterAgent = await signedInSitter(t, otherSitter.email);
    await sitterAgent
      .patch(`/api/bookings/${made.body.id}`)
      .send({ startsAt: '2030-03-14T09:35:00.000Z' })
      .expect(404);

    const unassigned = await insertStaff(t.db, { role: 'photographer' });
    const unassignedAgent = await signedInAgent(t, unassigned.email);
    await unassignedAgent.get(`/api/days/${day.id}`).expect(404);
    const days = await unassignedAgent.get('/api/days').expect(200);
    expect(days.body.days).toHaveLength(0);
    expect((await activeBookings(day.id))[0]?.status).toBe('active');
  });

  it('sitters change only until the cut-off; coordinators still can', async () => {
    const day = await insertDay(t.db, {
      clientId,
      officeId,
      photographerIds: photographers,
      changesCloseAt: new Date(t.clock.now().getTime() + 60_000),
    });
    const person = await insertPerson(t.db, clientId, { officeId });
    const sitter = await signedInSitter(t, person.email);
    const made = await sitter
      .post('/api/bookings')
      .send({ dayId: day.id, startsAt: '2030-03-14T09:00:00.000Z' })
      .expect(201);
    t.clock.advance(2 * 60_000);
    const late = await sitter
      .patch(`/api/bookings/${made.body.id}`)
      .send({ startsAt: '2030-03-14T09:05:00.000Z' });
    expect(late.status).toBe(409);
    expect(late.body.error.code).toBe('changes_closed');
    const coordinator = request.agent(t.app).set('Cookie', coordinatorCookie);
    const moved = await coordinator
      .patch(`/api/bookings/${made.body.id}`)
      .send({ startsAt: '2030-03-14T09:05:00.000Z' })
      .expect(200);
    expect(moved.body.sequence).toBe(1);
  });

  it('a booking whose sitter has checked in can no longer be moved or cancelled, by anyone', async () => {
    const day = await insertDay(t.db, { clientId, officeId, photographerIds: photographers });
    const person = await insertPerson(t.db, clientId, { officeId });
    const sitter = await signedInSitter(t, person.email);
    const made = await sitter
      .post('/api/bookings')
      .send({ dayId: day.id, startsAt: '2030-03-14T09:00:00.000Z' })
      .expect(201);
    expect(made.body.canChange).toBe(true);
    const [stored] = await activeBookings(day.id);
    await t.db
      .insertInto('checkIns')
      .values({
        id: crypto.randomUUID(),
        dayId: day.id,
        personId: person.id,
        bookingId: made.body.id,
        stationId: stored!.stationId,
        method: 'pass',
        checkedInAt: t.clock.now(),
        tabletAt: t.clock.now(),
      })
      .execute();
    const cancel = await sitter.delete(`/api/bookings/${made.body.id}`);
    expect(cancel.status).toBe(409);
    expect(cancel.body.error.code).toBe('already_checked_in');
    const coordinator = request.agent(t.app).set('Cookie', coordinatorCookie);
    const move = await coordinator
      .patch(`/api/bookings/${made.body.id}`)
      .send({ startsAt: '2030-03-14T09:05:00.000Z' });
    expect(move.status).toBe(409);
    const rows = await activeBookings(day.id);
    expect(rows.map((row) => row.id)).toEqual([made.body.id]);
    const mine = await sitter.get('/api/sitters/me/days').expect(200);
    expect(mine.body.days.find((d: { id: string }) => d.id === day.id).booking.canChange).toBe(
      false,
    );
  });
});
