import { randomUUID } from 'node:crypto';
import { sql } from 'kysely';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPgNotifications } from '../../server/adapters/notifications';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { startTestApp, type TestApp } from '../setup/test-app';
import { action, insertBooking, slateToken } from './console-support';
import { signedInAgent } from './helpers';

// Which sittings a station may correct, and how, is the product's own rule (no outside source).

let t: TestApp;
let photographer: ReturnType<typeof request.agent>;
let photographerId: string;
let clientId: string;
let officeId: string;
let day: Awaited<ReturnType<typeof insertDay>>;
let otherDay: Awaited<ReturnType<typeof insertDay>>;
let stationId: string;
let secondStationId: string;
let seat = 0;

beforeAll(async () => {
  t = await startTestApp();
  const client = await insertClient(t.db, { name: 'Halvorsen & Pike Engineering' });
  clientId = client.id;
  officeId = (await insertOffice(t.db, client.id, 'Rotterdam', 'Europe/Amsterdam')).id;
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
  secondStationId = day.stations[1]!.id;
  photographer = await signedInAgent(t, staff.email);
});
afterAll(() => t.close());

/** Each change a second after the one before, so "the last one finished" is well defined. */
const post = (body: object, dayId = day.id) => {
  t.clock.advance(1000);
  return photographer.post(`/api/days/${dayId}/console/actions`).send(body);
};

/** A sitter checked in and seated at `station`, the slate typed as `firstFrame`. */
async function seated(firstFrame: number, station = stationId) {
  const person = await insertPerson(t.db, clientId, { officeId, givenName: 'Ines' });
  const startsAt = new Date(t.clock.now().getTime() - 60 * 60_000);
  startsAt.setUTCSeconds(seat++ % 60);
  const booking = await insertBooking(t.db, {
    dayId: day.id,
    stationId: station,
    personId: person.id,
    startsAt,
  });
  const checkInId = randomUUID();
  await post(
    action('check_in_pass', { stationId: station, checkInId, passToken: booking.passToken }),
  ).expect(201);
  const sittingId = randomUUID();
  await post(
    action('start_sitting', {
      stationId: station,
      sittingId,
      checkInId,
      slateToken: slateToken(),
      firstFrame,
    }),
  ).expect(201);
  return { person, sittingId };
}

const sittingRow = (sittingId: string) =>
  t.db
    .selectFrom('sittings')
    .select([
      'firstFrame',
      'lastFrame',
      'typedFirstFrame',
      'typedLastFrame',
      'framesCorrectedAt',
      'framesCorrectedByUserId',
      'finishedAt',
    ])
    .where('id', '=', sittingId)
    .executeTakeFirstOrThrow();

const correctionAudits = (sittingId: string) =>
  t.db
    .selectFrom('auditEvents')
    .select('details')
    .where('action', '=', 'sitting.frames_corrected')
    .where('subjectId', '=', sittingId)
    .execute();

describe('correcting a mistyped first frame', () => {
  it('unblocks a refused finish: the correction is recorded, the typed number kept', async () => {
    const { person, sittingId } = await seated(4510);
    const refused = await post(
      action('finish_sitting', { stationId, sittingId, lastFrame: 466 }),
    ).expect(400);
    expect(refused.body.error.code).toBe('implausible_last_frame');

    const correction = action('correct_frames', { stationId, sittingId, firstFrame: 451 });
    const corrected = await post(correction).expect(201);
    const correctedAt = t.clock.now();
    expect(corrected.body).toMatchObject({
      kind: 'correct_frames',
      replayed: false,
      message: expect.stringMatching(/^Corrected for Ines Sample-\S+: first frame 0451\.$/),
    });
    await post(action('finish_sitting', { stationId, sittingId, lastFrame: 466 })).expect(201);

    const row = await sittingRow(sittingId);
    expect(row).toMatchObject({
      firstFrame: 451,
      lastFrame: 466,
      typedFirstFrame: 4510,
      typedLastFrame: 466,
      framesCorrectedByUserId: photographerId,
    });
    expect(row.framesCorrectedAt).toEqual(correctedAt);
    expect(row.finishedAt).not.toBeNull();
    expect((await correctionAudits(sittingId)).map((entry) => entry.details)).toEqual([
      {
        dayId: day.id,
        stationId,
        idempotencyKey: correction.idempotencyKey,
        before: { firstFrame: 4510, lastFrame: null },
        after: { firstFrame: 451, lastFrame: null },
      },
    ]);

    const snapshot = await photographer.get(`/api/days/${day.id}/console`).expect(200);
    expect(
      snapshot.body.sittings.find((item: { id: string }) => item.id === sittingId),
    ).toMatchObject({
      firstFrame: 451,
      lastFrame: 466,
      typedFirstFrame: 4510,
      typedLastFrame: 466,
      framesCorrectedAt: correctedAt.toISOString(),
    });
    const entry = snapshot.body.entries.find(
      (item: { personId: string }) => item.personId === person.id,
    );
    expect(entry.status).toBe('done');
  });

  it('applies a replayed correction once and answers it as a replay', async () => {
    const { sittingId } = await seated(4520);
    const correction = action('correct_frames', { stationId, sittingId, firstFrame: 452 });
    await post(correction).expect(201);
    const again = await post(correction).expect(200);
    expect(again.body).toMatchObject({ replayed: true, kind: 'correct_frames' });
    expect(await correctionAudits(sittingId)).toHaveLength(1);
    const actions = await t.db
      .selectFrom('stationActions')
      .select('kind')
      .where('idempotencyKey', '=', correction.idempotencyKey)
      .execute();
    expect(actions).toEqual([{ kind: 'correct_frames' }]);
    await post(action('finish_sitting', { stationId, sittingId, lastFrame: null })).expect(201);
  });

  it('tells the other tablets about a correction, and about nothing when one is refused', async () => {
    const { sittingId } = await seated(4530);
    const notifications = await createPgNotifications(t.database.url);
    let heard = 0;
    notifications.subscribe(day.id, () => (heard += 1));
    try {
      // Let the listening connection start before anything is sent.
      await new Promise((resolve) => setTimeout(resolve, 200));
      await post(action('correct_frames', { stationId, sittingId, firstFrame: 4530 })).expect(400);
      await post(action('correct_frames', { stationId, sittingId, firstFrame: 453 })).expect(201);
      await expect.poll(() => heard, { timeout: 2000 }).toBe(1);
      await new Promise((resolve) => setTimeout(resolve, 200));
      expect(heard).toBe(1);
    } finally {
      await notifications.close();
    }
    await post(action('finish_sitting', { stationId, sittingId, lastFrame: null })).expect(201);
  });
});

describe('correcting a last frame', () => {
  it('corrects the last finished sitting, and undoing its finish still reopens it', async () => {
    const { sittingId } = await seated(500);
    const finish = action('finish_sitting', { stationId, sittingId, lastFrame: 512 });
    await post(finish).expect(201);
    const corrected = await post(
      action('correct_frames', { stationId, sittingId, lastFrame: 521 }),
    ).expect(201);
    expect(corrected.body.message).toMatch(/^Corrected for Ines Sample-\S+: last frame 0521\.$/);
    expect(await sittingRow(sittingId)).toMatchObject({
      firstFrame: 500,
      lastFrame: 521,
      typedFirstFrame: 500,
      typedLastFrame: 512,
    });

    await post(action('undo', { stationId, targetKey: finish.idempotencyKey })).expect(201);
    expect(await sittingRow(sittingId)).toMatchObject({
      lastFrame: null,
      typedLastFrame: null,
      finishedAt: null,
    });
    await post(action('finish_sitting', { stationId, sittingId, lastFrame: 522 })).expect(201);
    expect(await sittingRow(sittingId)).toMatchObject({ lastFrame: 522, typedLastFrame: 522 });
  });

  it('adds a last frame to a sitting finished without one', async () => {
    const { sittingId } = await seated(600);
    await post(action('finish_sitting', { stationId, sittingId, lastFrame: null })).expect(201);
    await post(action('correct_frames', { stationId, sittingId, lastFrame: 615 })).expect(201);
    const snapshot = await photographer.get(`/api/days/${day.id}/console`).expect(200);
    expect(
      snapshot.body.sittings.find((item: { id: string }) => item.id === sittingId),
    ).toMatchObject({ firstFrame: 600, lastFrame: 615, typedLastFrame: null });
  });

  it('refuses to undo a correction: correcting again is the way back', async () => {
    const { sittingId } = await seated(700);
    const correction = action('correct_frames', { stationId, sittingId, firstFrame: 701 });
    await post(correction).expect(201);
    const undo = await post(action('undo', { stationId, targetKey: correction.idempotencyKey }));
    expect(undo.status).toBe(409);
    expect(undo.body.error).toMatchObject({ code: 'cannot_undo', message: /correct the frame/ });
    await post(action('finish_sitting', { stationId, sittingId, lastFrame: null })).expect(201);
  });
});

describe('what a correction refuses', () => {
  it('answers bad numbers with 400 and a message per field, writing nothing', async () => {
    const { sittingId } = await seated(800);
    const cases: Array<[object, string, RegExp]> = [
      [{}, 'firstFrame', /Enter the corrected first or last frame/],
      [{ firstFrame: 0 }, 'firstFrame', /0001 to 9999/],
      [{ lastFrame: 10_000 }, 'lastFrame', /0001 to 9999/],
      [{ firstFrame: 12.5 }, 'firstFrame', /whole numbers/],
      [{ firstFrame: '0801' }, 'firstFrame', /Enter the frame number/],
      [{ firstFrame: null }, 'firstFrame', /Enter the frame number/],
    ];
    for (const [numbers, field, message] of cases) {
      const body = { ...action('correct_frames', { stationId, sittingId }), ...numbers };
      const answer = await post(body).expect(400);
      expect(answer.body.error.code, JSON.stringify(numbers)).toBe('invalid_input');
      expect(answer.body.error.details.fieldErrors[field][0], JSON.stringify(numbers)).toMatch(
        message,
      );
    }
    const padded = await post({
      ...action('correct_frames', { stationId, sittingId, firstFrame: 801 }),
      stationId: `${stationId}\u0000`,
    }).expect(400);
    // Refused at the edge for its control character, before the identifier check.
    expect(padded.body.error.details.fieldErrors.stationId[0]).toMatch(/control characters/);

    const same = await post(
      action('correct_frames', { stationId, sittingId, firstFrame: 800 }),
    ).expect(400);
    expect(same.body.error).toMatchObject({
      code: 'nothing_to_correct',
      message: 'These are already the sitting’s frame numbers.',
    });
    const open = await post(
      action('correct_frames', { stationId, sittingId, lastFrame: 810 }),
    ).expect(409);
    expect(open.body.error.code).toBe('sitting_open');

    await post(action('finish_sitting', { stationId, sittingId, lastFrame: 812 })).expect(201);
    const implausible = await post(
      action('correct_frames', { stationId, sittingId, firstFrame: 8120 }),
    ).expect(400);
    expect(implausible.body.error).toMatchObject({
      code: 'implausible_frames',
      message: /The last frame 0812 does not follow the first, 8120/,
    });
    expect(implausible.body.error.details.fieldErrors.firstFrame).toHaveLength(1);

    expect(await sittingRow(sittingId)).toMatchObject({
      firstFrame: 800,
      lastFrame: 812,
      framesCorrectedAt: null,
    });
    expect(await correctionAudits(sittingId)).toHaveLength(0);
    const refusedKinds = await t.db
      .selectFrom('stationActions')
      .select('id')
      .where('kind', '=', 'correct_frames')
      .where(sql<string>`payload->>'sittingId'`, '=', sittingId)
      .execute();
    expect(refusedKinds).toHaveLength(0);
  });

  it('refuses another station, another day, an undone sitting and an older one', async () => {
    const { sittingId } = await seated(900);
    const otherStation = await post(
      action('correct_frames', { stationId: secondStationId, sittingId, firstFrame: 901 }),
    ).expect(409);
    expect(otherStation.body.error).toMatchObject({
      code: 'other_station',
      message: /another station/,
    });
    const wrongDay = await post(
      action('correct_frames', {
        stationId: otherDay.stations[0]!.id,
        sittingId,
        firstFrame: 901,
      }),
      otherDay.id,
    ).expect(404);
    expect(wrongDay.body.error.message).toMatch(/That sitting/);
    // The station must belong to the day in the address, too.
    await post(
      action('correct_frames', { stationId, sittingId, firstFrame: 901 }),
      otherDay.id,
    ).expect(404);
    await post(action('finish_sitting', { stationId, sittingId, lastFrame: 910 })).expect(201);

    // Two sittings later the first one is no longer the station's to correct.
    const second = await seated(911);
    await post(
      action('finish_sitting', { stationId, sittingId: second.sittingId, lastFrame: 920 }),
    ).expect(201);
    const third = await seated(921);
    const older = await post(
      action('correct_frames', { stationId, sittingId, firstFrame: 901 }),
    ).expect(409);
    expect(older.body.error.code).toBe('too_late_to_correct');
    // The sitting in the chair and the last one finished still can be.
    await post(
      action('correct_frames', { stationId, sittingId: second.sittingId, lastFrame: 919 }),
    ).expect(201);
    await post(
      action('correct_frames', { stationId, sittingId: third.sittingId, firstFrame: 922 }),
    ).expect(201);

    const start = await t.db
      .selectFrom('stationActions')
      .select('idempotencyKey')
      .where('kind', '=', 'start_sitting')
      .where(sql<string>`payload->>'sittingId'`, '=', third.sittingId)
      .executeTakeFirstOrThrow();
    await post(action('undo', { stationId, targetKey: start.idempotencyKey })).expect(201);
    const undone = await post(
      action('correct_frames', { stationId, sittingId: third.sittingId, firstFrame: 923 }),
    ).expect(404);
    expect(undone.body.error.code).toBe('not_found');
  });

  it('is for the studio and photographers only; a coordinator may not correct', async () => {
    const { sittingId } = await seated(1000, secondStationId);
    const coordinatorUser = await insertStaff(t.db, { role: 'coordinator', clientId });
    const coordinator = await signedInAgent(t, coordinatorUser.email);
    await coordinator
      .post(`/api/days/${day.id}/console/actions`)
      .send(action('correct_frames', { stationId: secondStationId, sittingId, firstFrame: 1001 }))
      .expect(403);
    expect(await sittingRow(sittingId)).toMatchObject({ firstFrame: 1000 });
  });
});
