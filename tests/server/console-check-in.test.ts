import { randomUUID } from 'node:crypto';
import { sql } from 'kysely';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { startTestApp, type TestApp } from '../setup/test-app';
import { action, insertBooking } from './console-support';
import { signedInAgent } from './helpers';

let t: TestApp;
let photographer: ReturnType<typeof request.agent>;
let photographerId: string;
let clientId: string;
let officeId: string;
let day: Awaited<ReturnType<typeof insertDay>>;
let otherDay: Awaited<ReturnType<typeof insertDay>>;
let stationId: string;

beforeAll(async () => {
  t = await startTestApp();
  const client = await insertClient(t.db, { name: 'Halvorsen & Pike Engineering' });
  clientId = client.id;
  officeId = (await insertOffice(t.db, client.id, 'Leeds')).id;
  const staff = await insertStaff(t.db, { role: 'photographer' });
  photographerId = staff.id;
  day = await insertDay(t.db, { clientId, officeId, photographerIds: [staff.id, staff.id] });
  otherDay = await insertDay(t.db, {
    clientId,
    officeId,
    photographerIds: [staff.id],
    date: '2030-03-15',
  });
  stationId = day.stations[0]!.id;
  photographer = await signedInAgent(t, staff.email);
});
afterAll(() => t.close());

const post = (agent: ReturnType<typeof request.agent>, body: object, dayId = day.id) =>
  agent.post(`/api/days/${dayId}/console/actions`).send(body);

let seat = 0;
async function bookedPerson(
  options: { dayId?: string; stationId?: string; status?: 'cancelled' } = {},
) {
  const person = await insertPerson(t.db, clientId, { officeId });
  const booking = await insertBooking(t.db, {
    dayId: options.dayId ?? day.id,
    stationId: options.stationId ?? stationId,
    personId: person.id,
    // Each booking takes the next free seat.
    startsAt: new Date(t.clock.now().getTime() + (30 + 5 * seat++) * 60_000),
    status: options.status,
  });
  return { person, booking };
}

describe('check-in by pass token', () => {
  it('checks in a valid pass and records who, when and where', async () => {
    const { person, booking } = await bookedPerson();
    const tabletAt = new Date('2030-03-14T09:01:02Z');
    const body = action(
      'check_in_pass',
      { stationId, checkInId: randomUUID(), passToken: booking.passToken },
      tabletAt,
    );
    const response = await post(photographer, body).expect(201);
    expect(response.body).toMatchObject({ replayed: false, message: /is checked in/ });

    const snapshot = await photographer.get(`/api/days/${day.id}/console`).expect(200);
    const entry = snapshot.body.entries.find(
      (item: { personId: string }) => item.personId === person.id,
    );
    expect(entry).toMatchObject({ status: 'arrived', bookingId: booking.id });

    const audit = await t.db
      .selectFrom('stationActions')
      .selectAll()
      .where('idempotencyKey', '=', body.idempotencyKey)
      .executeTakeFirstOrThrow();
    expect(audit).toMatchObject({ userId: photographerId, stationId, kind: 'check_in_pass' });
    expect(audit.tabletAt.toISOString()).toBe(tabletAt.toISOString());
    expect(audit.receivedAt.toISOString()).toBe(t.clock.now().toISOString());
  });

  it('refuses a pass for another day of the same client, saying so', async () => {
    const { booking } = await bookedPerson({
      dayId: otherDay.id,
      stationId: otherDay.stations[0]!.id,
    });
    const response = await post(
      photographer,
      action('check_in_pass', { stationId, checkInId: randomUUID(), passToken: booking.passToken }),
    ).expect(409);
    expect(response.body.error).toMatchObject({ code: 'other_day', message: /2030-03-15/ });
  });

  it("refuses another client's pass without naming anyone", async () => {
    const other = await insertClient(t.db);
    const otherOffice = await insertOffice(t.db, other.id, 'Porto', 'Europe/Lisbon');
    const theirs = await insertDay(t.db, {
      clientId: other.id,
      officeId: otherOffice.id,
      photographerIds: [photographerId],
    });
    const person = await insertPerson(t.db, other.id);
    const booking = await insertBooking(t.db, {
      dayId: theirs.id,
      stationId: theirs.stations[0]!.id,
      personId: person.id,
      startsAt: new Date(),
    });
    const response = await post(
      photographer,
      action('check_in_pass', { stationId, checkInId: randomUUID(), passToken: booking.passToken }),
    ).expect(409);
    expect(response.body.error.code).toBe('other_client');
  });

  it('refuses a cancelled booking and an unknown code', async () => {
    const { booking } = await bookedPerson({ status: 'cancelled' });
    const cancelled = await post(
      photographer,
      action('check_in_pass', { stationId, checkInId: randomUUID(), passToken: booking.passToken }),
    ).expect(409);
    expect(cancelled.body.error.code).toBe('pass_cancelled');
    const unknown = await post(
      photographer,
      action('check_in_pass', { stationId, checkInId: randomUUID(), passToken: 'NOT-A-PASS' }),
    ).expect(404);
    expect(unknown.body.error.code).toBe('unknown_pass');
  });

  it('refuses a pass used twice, telling where and when it was used', async () => {
    const { booking } = await bookedPerson();
    await post(
      photographer,
      action('check_in_pass', { stationId, checkInId: randomUUID(), passToken: booking.passToken }),
    ).expect(201);
    const second = await post(
      photographer,
      action('check_in_pass', {
        stationId: day.stations[1]!.id,
        checkInId: randomUUID(),
        passToken: booking.passToken,
      }),
    ).expect(409);
    expect(second.body.error).toMatchObject({
      code: 'already_checked_in',
      message: /Already checked in at Station A, \d\d:\d\d/,
    });
  });

  it('two tablets scanning the same pass at once end with one check-in', async () => {
    const { person, booking } = await bookedPerson();
    const [first, second] = await Promise.all(
      day.stations.map((station) =>
        post(
          photographer,
          action('check_in_pass', {
            stationId: station.id,
            checkInId: randomUUID(),
            passToken: booking.passToken,
          }),
        ),
      ),
    );
    expect([first!.status, second!.status].sort()).toEqual([201, 409]);
    const loser = first!.status === 409 ? first! : second!;
    expect(loser.body.error.code).toBe('already_checked_in');
    const rows = await t.db
      .selectFrom('checkIns')
      .select('id')
      .where('personId', '=', person.id)
      .execute();
    expect(rows).toHaveLength(1);
  });
});

/** Waits until this many statements wait on a lock (both requests reached the database). */
async function waitForBlockedStatements(count: number) {
  for (;;) {
    const { rows } = await sql<{ waiting: number }>`
      select count(*)::int as waiting from pg_locks where not granted`.execute(t.db);
    if ((rows[0]?.waiting ?? 0) >= count) return;
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

describe('idempotent replay', () => {
  it('applies the same queued action once, however often it is sent', async () => {
    const { person, booking } = await bookedPerson();
    const body = action('check_in_pass', {
      stationId,
      checkInId: randomUUID(),
      passToken: booking.passToken,
    });
    await post(photographer, body).expect(201);
    const again = await post(photographer, body).expect(200);
    expect(again.body).toMatchObject({ replayed: true, idempotencyKey: body.idempotencyKey });
    const both = await Promise.all([post(photographer, body), post(photographer, body)]);
    expect(both.map((response) => response.status)).toEqual([200, 200]);
    const checkIns = await t.db
      .selectFrom('checkIns')
      .select('id')
      .where('personId', '=', person.id)
      .execute();
    expect(checkIns).toHaveLength(1);
    const actions = await t.db
      .selectFrom('stationActions')
      .select('id')
      .where('idempotencyKey', '=', body.idempotencyKey)
      .execute();
    expect(actions).toHaveLength(1);
  });

  it('answers a replay sent while the first is still in flight with its result, not a 409', async () => {
    const { person, booking } = await bookedPerson();
    const body = action('check_in_pass', {
      stationId,
      checkInId: randomUUID(),
      passToken: booking.passToken,
    });
    // Hold the booking row so the first request stalls mid-transaction, as on a slow database.
    let release!: () => void;
    const released = new Promise<void>((resolve) => (release = resolve));
    let locked!: () => void;
    const holding = new Promise<void>((resolve) => (locked = resolve));
    const holder = t.db.transaction().execute(async (trx) => {
      await trx
        .selectFrom('bookings')
        .select('id')
        .where('id', '=', booking.id)
        .forUpdate()
        .execute();
      locked();
      await released;
    });
    await holding;
    const first = post(photographer, body).then((response) => response);
    const replay = post(photographer, body).then((response) => response);
    await waitForBlockedStatements(2);
    release();
    await holder;
    const answers = await Promise.all([first, replay]);
    expect(answers.map((response) => response.status).sort()).toEqual([200, 201]);
    for (const response of answers) {
      expect(response.body).toMatchObject({ idempotencyKey: body.idempotencyKey });
    }
    const checkIns = await t.db
      .selectFrom('checkIns')
      .select('id')
      .where('personId', '=', person.id)
      .execute();
    expect(checkIns).toHaveLength(1);
  });

  it('refuses a key reused for a different change', async () => {
    const { booking } = await bookedPerson();
    const body = action('check_in_pass', {
      stationId,
      checkInId: randomUUID(),
      passToken: booking.passToken,
    });
    await post(photographer, body).expect(201);
    const reused = await post(photographer, { ...body, kind: 'undo', targetKey: randomUUID() });
    expect(reused.status).toBe(409);
    expect(reused.body.error.code).toBe('key_reused');
  });
});

describe('roster search on the console', () => {
  it('ignores accents and capitals, matches every word, and finds employee ids', async () => {
    const zoe = await t.db
      .insertInto('people')
      .values({
        clientId,
        officeId,
        givenName: 'Zoë',
        familyName: 'Müller-Łęcka',
        email: 'zoe.muller@halvorsen-pike.example',
        employeeId: 'HP-40917',
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    const found = async (q: string) => {
      const response = await photographer
        .get(`/api/days/${day.id}/console/roster`)
        .query({ q })
        .expect(200);
      return response.body.people.map((item: { id: string }) => item.id) as string[];
    };
    // unaccent's rules (PostgreSQL contrib) fold ë, ü, Ł and ę to e, u, L and e.
    for (const q of ['Zoe', 'zoë', 'MULLER', 'zoe muller', 'lecka', 'hp-40917', '40917']) {
      expect(await found(q), q).toContain(zoe.id);
    }
    expect(await found('zoe smith')).not.toContain(zoe.id);
    const response = await photographer
      .get(`/api/days/${day.id}/console/roster`)
      .query({ q: '40917' })
      .expect(200);
    expect(response.body.people[0]).toMatchObject({ employeeId: 'HP-40917' });
    // A wildcard typed by the user is a plain character, not a pattern.
    expect(await found('%%')).toEqual([]);
  });
});

describe('walk-ins', () => {
  it('checks in someone on the roster without a booking as a walk-in', async () => {
    const person = await insertPerson(t.db, clientId, { officeId, givenName: 'Ingrid' });
    const search = await photographer
      .get(`/api/days/${day.id}/console/roster`)
      .query({ q: 'ingrid' })
      .expect(200);
    expect(search.body.people.map((item: { id: string }) => item.id)).toContain(person.id);
    const response = await post(
      photographer,
      action('check_in_person', { stationId, checkInId: randomUUID(), personId: person.id }),
    ).expect(201);
    expect(response.body.message).toMatch(/as a walk-in/);
    const snapshot = await photographer.get(`/api/days/${day.id}/console`).expect(200);
    expect(
      snapshot.body.entries.find((item: { personId: string }) => item.personId === person.id),
    ).toMatchObject({ walkIn: true, status: 'arrived', bookingId: null, stationId });
  });

  it('adds a person not on the roster, marked as added on the day', async () => {
    const personId = randomUUID();
    await post(
      photographer,
      action('check_in_new_person', {
        stationId,
        checkInId: randomUUID(),
        personId,
        givenName: 'Tomasz',
        familyName: 'Brekke',
        email: 'Tomasz.Brekke@halvorsen-pike.example',
      }),
    ).expect(201);
    const person = await t.db
      .selectFrom('people')
      .select(['clientId', 'addedOnDayId', 'email', 'officeId'])
      .where('id', '=', personId)
      .executeTakeFirstOrThrow();
    expect(person).toEqual({
      clientId,
      addedOnDayId: day.id,
      email: 'tomasz.brekke@halvorsen-pike.example',
      officeId,
    });
    const audit = await t.db
      .selectFrom('auditEvents')
      .select(['action', 'actorUserId'])
      .where('subjectId', '=', personId)
      .execute();
    expect(audit).toEqual([{ action: 'person.added_on_day', actorUserId: photographerId }]);
    const again = await post(
      photographer,
      action('check_in_new_person', {
        stationId,
        checkInId: randomUUID(),
        personId: randomUUID(),
        givenName: 'Tomasz',
        familyName: 'Brekke',
        email: 'tomasz.brekke@halvorsen-pike.example',
      }),
    ).expect(409);
    expect(again.body.error.code).toBe('email_on_roster');
  });

  it('rejects bad input with a message per field and writes nothing', async () => {
    const response = await post(photographer, {
      ...action('check_in_new_person', {
        stationId,
        checkInId: randomUUID(),
        personId: randomUUID(),
        givenName: '',
        familyName: 'Brekke',
        email: 'not an address',
      }),
    }).expect(400);
    expect(response.body.error.details.fieldErrors).toMatchObject({
      givenName: expect.any(Array),
      email: expect.any(Array),
    });
  });
});
