import { randomUUID } from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { startTestApp, type TestApp } from '../setup/test-app';
import { action, insertBooking, slateToken } from './console-support';
import { signedInAgent } from './helpers';

let t: TestApp;
let photographer: ReturnType<typeof request.agent>;
let clientId: string;
let officeId: string;
let day: Awaited<ReturnType<typeof insertDay>>;
let stationId: string;
let seat = 0;

beforeAll(async () => {
  t = await startTestApp();
  const client = await insertClient(t.db, { name: 'Halvorsen & Pike Engineering' });
  clientId = client.id;
  officeId = (await insertOffice(t.db, client.id, 'Rotterdam', 'Europe/Amsterdam')).id;
  const staff = await insertStaff(t.db, { role: 'photographer' });
  day = await insertDay(t.db, { clientId, officeId, photographerIds: [staff.id] });
  stationId = day.stations[0]!.id;
  photographer = await signedInAgent(t, staff.email);
});
afterAll(() => t.close());

const post = (agent: ReturnType<typeof request.agent>, body: object, dayId = day.id) =>
  agent.post(`/api/days/${dayId}/console/actions`).send(body);

/** A booked sitter whose slot starts `minutesFromNow` after the test clock's now. */
async function booked(minutesFromNow: number) {
  const person = await insertPerson(t.db, clientId, { officeId });
  const startsAt = new Date(t.clock.now().getTime() + minutesFromNow * 60_000);
  // Seconds apart so no two bookings share a seat.
  startsAt.setUTCSeconds(seat++ % 60);
  const booking = await insertBooking(t.db, {
    dayId: day.id,
    stationId,
    personId: person.id,
    startsAt,
  });
  return { person, booking };
}

async function checkedIn() {
  const { person, booking } = await booked(-100 - seat);
  const checkInId = randomUUID();
  await post(
    photographer,
    action('check_in_pass', { stationId, checkInId, passToken: booking.passToken }),
  ).expect(201);
  return { person, booking, checkInId };
}

describe('sittings', () => {
  it('starts with the first frame and finishes with the last; a retake is a second sitting', async () => {
    const { person, checkInId } = await checkedIn();
    const sittingId = randomUUID();
    const token = slateToken();
    await post(
      photographer,
      action('start_sitting', {
        stationId,
        sittingId,
        checkInId,
        slateToken: token,
        firstFrame: 9990,
      }),
    ).expect(201);
    let snapshot = await photographer.get(`/api/days/${day.id}/console`).expect(200);
    const entryOf = () =>
      snapshot.body.entries.find((item: { personId: string }) => item.personId === person.id);
    expect(entryOf().status).toBe('in_chair');

    // Another sitting cannot open on the same station meanwhile.
    const other = await checkedIn();
    const busy = await post(
      photographer,
      action('start_sitting', {
        stationId,
        sittingId: randomUUID(),
        checkInId: other.checkInId,
        slateToken: slateToken(),
        firstFrame: 9991,
      }),
    ).expect(409);
    expect(busy.body.error.code).toBe('station_busy');

    // The camera rolled over from 9999 to 0001 during the sitting (DCF, JEITA CP-3461).
    await post(
      photographer,
      action('finish_sitting', { stationId, sittingId, lastFrame: 12 }),
    ).expect(201);
    snapshot = await photographer.get(`/api/days/${day.id}/console`).expect(200);
    expect(entryOf().status).toBe('done');
    const sitting = snapshot.body.sittings.find((item: { id: string }) => item.id === sittingId);
    expect(sitting).toMatchObject({ firstFrame: 9990, lastFrame: 12, slateToken: token });
    expect(sitting.finishedAt).not.toBeNull();

    const retakeId = randomUUID();
    await post(
      photographer,
      action('start_sitting', {
        stationId,
        sittingId: retakeId,
        checkInId,
        slateToken: slateToken(),
        firstFrame: 13,
      }),
    ).expect(201);
    // A last frame below the first that is no wrap past 9999 is a mistyped counter.
    const mistyped = await post(
      photographer,
      action('finish_sitting', { stationId, sittingId: retakeId, lastFrame: 5 }),
    ).expect(400);
    expect(mistyped.body.error.code).toBe('implausible_last_frame');
    await post(
      photographer,
      action('finish_sitting', { stationId, sittingId: retakeId, lastFrame: null }),
    ).expect(201);
    const rows = await t.db
      .selectFrom('sittings')
      .select(['firstFrame', 'lastFrame'])
      .where('personId', '=', person.id)
      .orderBy('startedAt')
      .execute();
    expect(rows).toEqual([
      { firstFrame: 9990, lastFrame: 12 },
      { firstFrame: 13, lastFrame: null },
    ]);
  });

  it('refuses frame numbers outside 0001-9999 and a sitting for someone not checked in', async () => {
    const { checkInId } = await checkedIn();
    const zero = await post(
      photographer,
      action('start_sitting', {
        stationId,
        sittingId: randomUUID(),
        checkInId,
        slateToken: slateToken(),
        firstFrame: 0,
      }),
    ).expect(400);
    expect(zero.body.error.details.fieldErrors.firstFrame[0]).toMatch(/0001 to 9999/);
    await post(
      photographer,
      action('start_sitting', {
        stationId,
        sittingId: randomUUID(),
        checkInId: randomUUID(),
        slateToken: slateToken(),
        firstFrame: 5,
      }),
    ).expect(409);
  });
});

describe('no-shows', () => {
  it('waits for the grace period (10 minutes by default), then marks in one step', async () => {
    const { booking } = await booked(-5);
    const early = await post(
      photographer,
      action('mark_no_show', { stationId, noShowId: randomUUID(), bookingId: booking.id }),
    ).expect(409);
    expect(early.body.error).toMatchObject({ code: 'too_early', message: /10 minutes/ });
    t.clock.advance(6 * 60_000);
    await post(
      photographer,
      action('mark_no_show', { stationId, noShowId: randomUUID(), bookingId: booking.id }),
    ).expect(201);
    const coordinatorUser = await insertStaff(t.db, { role: 'coordinator', clientId });
    const coordinator = await signedInAgent(t, coordinatorUser.email);
    const snapshot = await coordinator.get(`/api/days/${day.id}/console`).expect(200);
    expect(
      snapshot.body.entries.find((item: { bookingId: string }) => item.bookingId === booking.id),
    ).toMatchObject({ status: 'no_show' });
  });

  it('follows the per-day grace setting, refuses a checked-in sitter, and a late arrival clears it', async () => {
    await t.db
      .updateTable('shootDays')
      .set({ noShowGraceMinutes: 0 })
      .where('id', '=', day.id)
      .execute();
    const { booking } = await booked(-1);
    await post(
      photographer,
      action('mark_no_show', { stationId, noShowId: randomUUID(), bookingId: booking.id }),
    ).expect(201);
    await post(
      photographer,
      action('check_in_pass', { stationId, checkInId: randomUUID(), passToken: booking.passToken }),
    ).expect(201);
    const snapshot = await photographer.get(`/api/days/${day.id}/console`).expect(200);
    expect(
      snapshot.body.entries.find((item: { bookingId: string }) => item.bookingId === booking.id),
    ).toMatchObject({ status: 'arrived', noShow: null });
    const again = await post(
      photographer,
      action('mark_no_show', { stationId, noShowId: randomUUID(), bookingId: booking.id }),
    ).expect(409);
    expect(again.body.error.code).toBe('already_checked_in');
  });
});

describe('undo', () => {
  it('takes back a check-in within the window, and not once a sitting hangs on it', async () => {
    const { booking } = await booked(-200);
    const checkIn = action('check_in_pass', {
      stationId,
      checkInId: randomUUID(),
      passToken: booking.passToken,
    });
    await post(photographer, checkIn).expect(201);
    await post(
      photographer,
      action('undo', { stationId, targetKey: checkIn.idempotencyKey }),
    ).expect(201);
    const after = await photographer.get(`/api/days/${day.id}/console`).expect(200);
    expect(
      after.body.entries.find((item: { bookingId: string }) => item.bookingId === booking.id),
    ).toMatchObject({ status: 'booked', checkIn: null });

    const second = await checkedIn();
    const late = action(
      'undo',
      { stationId, targetKey: randomUUID() },
      new Date(Date.now() + 10 * 60_000),
    );
    await post(photographer, late).expect(404);
    const start = action('start_sitting', {
      stationId,
      sittingId: randomUUID(),
      checkInId: second.checkInId,
      slateToken: slateToken(),
      firstFrame: 100,
    });
    await post(photographer, start).expect(201);
    const checkInKey = await t.db
      .selectFrom('stationActions')
      .select('idempotencyKey')
      .where('kind', '=', 'check_in_pass')
      .orderBy('id', 'desc')
      .executeTakeFirstOrThrow();
    const blocked = await post(
      photographer,
      action('undo', { stationId, targetKey: checkInKey.idempotencyKey }),
    ).expect(409);
    expect(blocked.body.error.code).toBe('has_sitting');
    await post(photographer, action('undo', { stationId, targetKey: start.idempotencyKey })).expect(
      201,
    );
    const expired = await post(
      photographer,
      action(
        'undo',
        { stationId, targetKey: checkInKey.idempotencyKey },
        new Date(Date.now() + 10 * 60_000),
      ),
    ).expect(409);
    expect(expired.body.error.code).toBe('undo_expired');
  });
});

describe('authorisation', () => {
  it('a photographer not on the day gets 403; a coordinator can look but not change', async () => {
    const { booking } = await booked(20);
    const stranger = await insertStaff(t.db, { role: 'photographer' });
    const strangerAgent = await signedInAgent(t, stranger.email);
    await strangerAgent.get(`/api/days/${day.id}/console`).expect(403);
    await post(
      strangerAgent,
      action('check_in_pass', { stationId, checkInId: randomUUID(), passToken: booking.passToken }),
    ).expect(403);

    const coordinatorUser = await insertStaff(t.db, { role: 'coordinator', clientId });
    const coordinator = await signedInAgent(t, coordinatorUser.email);
    const view = await coordinator.get(`/api/days/${day.id}/console`).expect(200);
    expect(view.body.canAct).toBe(false);
    await post(
      coordinator,
      action('check_in_pass', { stationId, checkInId: randomUUID(), passToken: booking.passToken }),
    ).expect(403);

    const otherClient = await insertClient(t.db);
    const otherCoordinator = await insertStaff(t.db, {
      role: 'coordinator',
      clientId: otherClient.id,
    });
    const outsider = await signedInAgent(t, otherCoordinator.email);
    await outsider.get(`/api/days/${day.id}/console`).expect(404);

    const admin = await signedInAgent(t, (await insertStaff(t.db, { role: 'studio_admin' })).email);
    await post(
      admin,
      action('check_in_pass', { stationId, checkInId: randomUUID(), passToken: booking.passToken }),
    ).expect(201);
  });
});

describe('live events', () => {
  it('tells a listening tablet about a change committed by another', async () => {
    const server = http.createServer(t.app);
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    const { port } = server.address() as AddressInfo;
    const cookie = (
      await request(t.app)
        .post('/api/session')
        .send({
          email: (await insertStaff(t.db, { role: 'studio_admin' })).email,
          password: 'correct horse battery',
        })
        .expect(201)
    ).headers['set-cookie'] as unknown as string[];
    const received: string[] = [];
    const stream = http.get(
      `http://127.0.0.1:${port}/api/days/${day.id}/console/events?stationId=${stationId}`,
      { headers: { Cookie: cookie.map((line) => line.split(';')[0]).join('; ') } },
    );
    const response = await new Promise<http.IncomingMessage>((resolve) =>
      stream.on('response', resolve),
    );
    expect(response.headers['content-type']).toMatch(/text\/event-stream/);
    response.setEncoding('utf8');
    response.on('data', (chunk: string) => received.push(chunk));
    await expect.poll(() => received.join('')).toMatch(/event: ready/);
    const started = Date.now();
    await checkedIn();
    await expect.poll(() => received.join(''), { timeout: 2000 }).toMatch(/event: changed/);
    expect(Date.now() - started).toBeLessThan(2000);
    stream.destroy();
    await new Promise<void>((resolve) => {
      server.close(() => resolve());
      server.closeAllConnections();
    });
  });
});
