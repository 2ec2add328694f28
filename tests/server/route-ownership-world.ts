import { randomUUID } from 'node:crypto';
import { sql } from 'kysely';
import type request from 'supertest';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import type { TestApp } from '../setup/test-app';
import { insertBooking } from './console-support';
import { signedInAgent, signedInSitter } from './helpers';
import { setUpProofsDay } from './proofs-day';

type Agent = ReturnType<typeof request.agent>;

/**
 * The ownership half of the route matrix. A photographed day of one client (frames, a pick, a
 * booking, a roster) is the victim; a second client's coordinator and sitter, and a
 * photographer not on the day, call every route they may call, naming the victim's ids in
 * valid bodies. Each must be refused (403/404) and change nothing.
 */
export async function setUpOwnershipWorld(t: TestApp) {
  const ready = await setUpProofsDay(t, 1);
  const dayId = ready.day.dayId;
  const stationId = ready.day.stations[0]!.id;
  const sitter = ready.sitters[0]!;
  const proofs = (await sitter.agent.get(`/api/proofs/${dayId}`).expect(200)).body;
  const frameId: string = proofs.frames[0].id;
  await sitter.agent
    .put(`/api/proofs/${dayId}/picks`)
    .send({ picks: [{ frameId }] })
    .expect(200);
  const pickId = (await t.db.selectFrom('picks').select('id').executeTakeFirstOrThrow()).id;
  const office = await t.db
    .selectFrom('offices')
    .select('id')
    .where('clientId', '=', ready.client.id)
    .executeTakeFirstOrThrow();
  const booked = await insertPerson(t.db, ready.client.id, { officeId: office.id });
  const booking = await insertBooking(t.db, {
    dayId,
    stationId,
    personId: booked.id,
    startsAt: new Date('2027-03-04T11:00:00Z'),
  });
  const victimCoordinator = await insertStaff(t.db, {
    role: 'coordinator',
    clientId: ready.client.id,
  });

  const otherClient = await insertClient(t.db);
  const otherOffice = await insertOffice(t.db, otherClient.id);
  const otherPerson = await insertPerson(t.db, otherClient.id, { officeId: otherOffice.id });
  const outsiders: Record<'coordinator' | 'sitter' | 'photographer', Agent> = {
    coordinator: await signedInAgent(
      t,
      (await insertStaff(t.db, { role: 'coordinator', clientId: otherClient.id })).email,
    ),
    sitter: await signedInSitter(t, otherPerson.email),
    photographer: await signedInAgent(t, (await insertStaff(t.db, { role: 'photographer' })).email),
  };
  const victims = {
    sitter: sitter.agent,
    coordinator: await signedInAgent(t, victimCoordinator.email),
    photographer: ready.studio,
  };
  const ids = {
    clientId: ready.client.id,
    officeId: office.id,
    dayId,
    stationId,
    personId: sitter.id,
    bookedPersonId: booked.id,
    bookingId: booking.id,
    frameId,
    pickId,
    passToken: booking.passToken,
  };
  return { ids, outsiders, victims, victimEmail: sitter.email };
}

export type OwnershipIds = Awaited<ReturnType<typeof setUpOwnershipWorld>>['ids'];

/** Valid bodies that name the victim's ids, for every state-changing route an outsider may call. */
export function victimBodies(
  v: OwnershipIds,
  victimEmail: string,
  otherStationId: string,
): Record<string, object> {
  const person = { givenName: 'Ines', familyName: 'Okafor', email: 'ines.okafor@x.example' };
  const dayChanges = {
    date: '2027-03-04',
    address: '4 Quillfield Row, Leeds',
    opensAt: '09:00',
    closesAt: '13:00',
    breaks: [],
    slotMinutes: 5,
    bookingOpensAt: '2027-02-01T09:00:00Z',
    bookingClosesAt: '2027-03-03T17:00:00Z',
    changesCloseAt: '2027-03-03T17:00:00Z',
    stations: [{ id: v.stationId, name: 'Station A', photographerId: null }],
  };
  return {
    'POST /api/days/:dayId/changes/preview': dayChanges,
    'POST /api/days/:dayId/proposals': {
      kind: 'edit',
      changes: dayChanges,
      note: 'Later, please.',
    },
    'POST /api/bookings': {
      dayId: v.dayId,
      startsAt: '2027-03-04T10:00:00Z',
      personId: v.personId,
    },
    'PATCH /api/bookings/:bookingId': { startsAt: '2027-03-04T10:30:00Z' },
    'POST /api/days': {
      clientId: v.clientId,
      officeId: v.officeId,
      date: '2027-05-05',
      address: '4 Quillfield Row, Leeds',
      opensAt: '09:00',
      closesAt: '12:00',
      bookingOpensAt: '2027-04-01T09:00:00Z',
      bookingClosesAt: '2027-05-01T09:00:00Z',
      changesCloseAt: '2027-05-01T09:00:00Z',
      stations: [{ name: 'Station 1' }],
    },
    'POST /api/clients/:clientId/people': person,
    'PATCH /api/clients/:clientId/people/:personId': person,
    'POST /api/clients/:clientId/people/:personId/erasure': { confirmEmail: victimEmail },
    'PUT /api/clients/:clientId/roster/imports/:importId/mapping': { mapping: ['givenName'] },
    'POST /api/clients/:clientId/roster/imports/:importId/commit': { officeTimeZones: {} },
    'POST /api/days/:dayId/review/decisions': {
      action: 'move',
      frameIds: [v.frameId],
      personId: v.bookedPersonId,
    },
    'PUT /api/days/:dayId/proofs/studio-picks/:personId': { frameId: v.frameId },
    'PUT /api/days/:dayId/proofs/people/:personId/picks': { picks: [{ frameId: v.frameId }] },
    'PUT /api/proofs/:dayId/picks': { picks: [{ frameId: v.frameId }] },
    'PATCH /api/picks/:pickId': { status: 'done' },
    'PUT /api/picks/:pickId/eyes': { leftEye: { x: 10, y: 10 }, rightEye: { x: 30, y: 10 } },
    'POST /api/days/:dayId/frames/known': { files: [] },
    'POST /api/stations/:stationId/setup-card/copy': { fromStationId: otherStationId },
    'PUT /api/stations/:stationId/setup-card': {
      card: {
        lights: [{ role: 'key', power: 0.5, modifier: 'softbox', distanceMetres: 1.2 }],
        camera: {
          sensorFormat: 'full_frame',
          focalLengthMm: 85,
          aperture: 8,
          shutterSeconds: 1 / 125,
          iso: 100,
          flashSyncSeconds: 1 / 200,
          cameraToSitterMetres: 1.8,
          sitterToBackgroundMetres: 2,
        },
      },
    },
    'POST /api/days/:dayId/console/actions': {
      kind: 'check_in_person',
      idempotencyKey: randomUUID(),
      tabletAt: new Date().toISOString(),
      stationId: v.stationId,
      checkInId: randomUUID(),
      personId: v.bookedPersonId,
    },
  };
}

/** Query strings that make a GET valid, so only ownership can refuse it. */
export function victimQueries(v: OwnershipIds): Record<string, string> {
  return {
    'GET /api/clients/:clientId/look/names': '?template=%7Bgiven%7D',
    'GET /api/days/:dayId/console/roster': '?q=an',
    'GET /api/days/:dayId/console/events': `?stationId=${v.stationId}`,
  };
}

/**
 * A digest of every application table (and the job queue), to prove the outsiders changed
 * nothing. Counters of the per-address limits and the back-off are left out: they count.
 */
export async function tableDigest(t: TestApp): Promise<Record<string, string>> {
  const tables = await sql<{ name: string }>`
    select table_name as name from information_schema.tables
    where table_schema = 'public' and table_type = 'BASE TABLE'
      and table_name not in ('rate_limit_counters', 'sign_in_backoff', 'kysely_migration',
        'kysely_migration_lock')
    order by table_name`.execute(t.db);
  const digest: Record<string, string> = {};
  for (const { name } of tables.rows) {
    const row = await sql<{ d: string | null }>`
      select md5(string_agg(x::text, ',' order by x::text)) as d from ${sql.table(name)} x`.execute(
      t.db,
    );
    digest[name] = row.rows[0]?.d ?? 'empty';
  }
  const jobs = await sql<{ n: string }>`select count(*) as n from graphile_worker.jobs`.execute(
    t.db,
  );
  digest.jobs = String(jobs.rows[0]?.n);
  return digest;
}
