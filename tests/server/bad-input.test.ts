import { randomUUID } from 'node:crypto';
import { sql } from 'kysely';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { startTestApp, type TestApp } from '../setup/test-app';
import { insertBooking } from './console-support';
import { signedInAgent, signedInSitter } from './helpers';

// Bad input at each route family: a NUL, other control characters, huge strings, wrong types and
// numbers at and past their bounds. Each must answer 4xx naming the field, never 500, and write
// nothing. (post-shutter-bad-input.test.ts does the same for frames, proofs, looks, delivery.)
type Agent = ReturnType<typeof request.agent> | ReturnType<typeof request>;
type Who = 'anyone' | 'admin' | 'coordinator' | 'photographer' | 'sitter';
interface Case {
  name: string;
  who: Who;
  send: (agent: Agent) => request.Test;
  /** The field the answer must name, where the fault is in one field. */
  field?: string;
}

const NUL = '\u0000';
const urlNul = encodeURIComponent(NUL);
const bell = 'Ana\u0007';
const escape = 'Ana\u001b[31m';
const c1 = 'Ana\u0085';
const huge = 'x'.repeat(200_000);
// URLs stay under Node's 16 KB header limit (past it Node itself answers 431).
const longQuery = 'x'.repeat(10_000);

let t: TestApp;
let agents: Record<Who, Agent>;
let ids: { client: string; office: string; day: string; station: string; person: string };
let booking: { id: string; passToken: string };

const tables = [
  'clients',
  'users',
  'people',
  'shootDays',
  'bookings',
  'sessions',
  'linkTokens',
  'stationActions',
  'checkIns',
  'rosterImports',
] as const;

async function counts(): Promise<Record<string, number>> {
  const result: Record<string, number> = {};
  for (const table of tables) {
    const row = await t.db
      .selectFrom(table)
      .select((eb) => eb.fn.countAll<string>().as('n'))
      .executeTakeFirstOrThrow();
    result[table] = Number(row.n);
  }
  const jobs = await sql<{ n: string }>`select count(*) as n from graphile_worker.jobs`.execute(
    t.db,
  );
  result.jobs = Number(jobs.rows[0]?.n);
  return result;
}

beforeAll(async () => {
  t = await startTestApp({
    env: { RATE_LIMIT_PER_ADDRESS: '10000', RATE_LIMIT_PER_ACCOUNT: '10000' },
  });
  const client = await insertClient(t.db);
  const office = await insertOffice(t.db, client.id);
  const photographer = await insertStaff(t.db, { role: 'photographer' });
  const coordinator = await insertStaff(t.db, { role: 'coordinator', clientId: client.id });
  const admin = await insertStaff(t.db, { role: 'studio_admin' });
  const person = await insertPerson(t.db, client.id, { officeId: office.id });
  const day = await insertDay(t.db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [photographer.id],
  });
  const station = day.stations[0]!.id;
  booking = await insertBooking(t.db, {
    dayId: day.id,
    stationId: station,
    personId: person.id,
    startsAt: new Date(`${day.date}T09:00:00Z`),
  });
  ids = { client: client.id, office: office.id, day: day.id, station, person: person.id };
  agents = {
    anyone: request(t.app),
    admin: await signedInAgent(t, admin.email),
    coordinator: await signedInAgent(t, coordinator.email),
    photographer: await signedInAgent(t, photographer.email),
    sitter: await signedInSitter(t, person.email),
  };
});
afterAll(() => t?.close());

const checkIn = (passToken: unknown) => ({
  kind: 'check_in_pass',
  idempotencyKey: randomUUID(),
  tabletAt: new Date().toISOString(),
  stationId: ids.station,
  checkInId: randomUUID(),
  passToken,
});

function cases(): Case[] {
  const day = ids.day;
  const client = ids.client;
  const person = { givenName: 'Ana', familyName: 'Reyes', email: 'ana.reyes@x.example' };
  return [
    // Sign-in and links
    {
      name: 'sign-in, NUL in the e-mail',
      who: 'anyone',
      send: (a) => a.post('/api/session').send({ email: `a${NUL}@x.example`, password: 'p' }),
      field: 'email',
    },
    {
      name: 'sign-in, NUL in the password',
      who: 'anyone',
      send: (a) => a.post('/api/session').send({ email: 'a@x.example', password: `p${NUL}` }),
      field: 'password',
    },
    {
      name: 'sign-in, password as a number',
      who: 'anyone',
      send: (a) => a.post('/api/session').send({ email: 'a@x.example', password: 12345 }),
      field: 'password',
    },
    {
      name: 'sign-in, huge password',
      who: 'anyone',
      send: (a) => a.post('/api/session').send({ email: 'a@x.example', password: huge }),
      field: 'password',
    },
    {
      name: 'sign-in link, escape sequence in the e-mail',
      who: 'anyone',
      send: (a) => a.post('/api/sign-in-links').send({ email: `a${escape}@x.example` }),
      field: 'email',
    },
    {
      name: 'link redeem, NUL in the token',
      who: 'anyone',
      send: (a) => a.post('/api/sign-in-links/redeem').send({ token: `${'A'.repeat(30)}${NUL}` }),
      field: 'token',
    },
    {
      name: 'link redeem, token as an object',
      who: 'anyone',
      send: (a) => a.post('/api/sign-in-links/redeem').send({ token: { $ne: '' } }),
      field: 'token',
    },
    {
      name: 'password reset, e-mail as an array',
      who: 'anyone',
      send: (a) => a.post('/api/password-resets').send({ email: ['a@x.example'] }),
      field: 'email',
    },
    {
      name: 'set password, NUL in the token',
      who: 'anyone',
      send: (a) =>
        a.post('/api/passwords').send({
          token: `${'A'.repeat(30)}${NUL}`,
          password: 'long enough password',
          confirmPassword: 'long enough password',
        }),
      field: 'token',
    },
    // Staff and clients
    {
      name: 'invite staff, bell in the name',
      who: 'admin',
      send: (a) =>
        a
          .post('/api/users')
          .send({ email: 'n@x.example', displayName: bell, role: 'photographer' }),
      field: 'displayName',
    },
    {
      name: 'invite staff, line break in the name',
      who: 'admin',
      send: (a) =>
        a
          .post('/api/users')
          .send({ email: 'n@x.example', displayName: 'Ana\nReyes', role: 'photographer' }),
      field: 'displayName',
    },
    {
      name: 'deactivate staff, active as a string',
      who: 'admin',
      send: (a) => a.patch(`/api/users/${randomUUID()}`).send({ active: 'false' }),
    },
    {
      name: 'new client, NUL in the name',
      who: 'admin',
      send: (a) => a.post('/api/clients').send({ name: `Wharf${NUL}side` }),
      field: 'name',
    },
    {
      name: 'new client, C1 control in the name',
      who: 'admin',
      send: (a) => a.post('/api/clients').send({ name: c1 }),
      field: 'name',
    },
    {
      name: 'new client, huge name',
      who: 'admin',
      send: (a) => a.post('/api/clients').send({ name: huge }),
      field: 'name',
    },
    {
      name: 'client id with a NUL in the path',
      who: 'admin',
      send: (a) => a.get(`/api/clients/${client}${urlNul}`),
    },
    // People and the roster
    {
      name: 'people search, NUL in q',
      who: 'coordinator',
      send: (a) => a.get(`/api/clients/${client}/people?q=${urlNul}`),
      field: 'q',
    },
    {
      name: 'people search, tab in q',
      who: 'coordinator',
      send: (a) => a.get(`/api/clients/${client}/people?q=Ana%09Reyes`),
      field: 'q',
    },
    {
      name: 'people search, huge q',
      who: 'coordinator',
      send: (a) => a.get(`/api/clients/${client}/people?q=${longQuery}`),
      field: 'q',
    },
    {
      name: 'people list, page size past the bound',
      who: 'coordinator',
      send: (a) => a.get(`/api/clients/${client}/people?pageSize=201`),
      field: 'pageSize',
    },
    {
      name: 'people list, page 0',
      who: 'coordinator',
      send: (a) => a.get(`/api/clients/${client}/people?page=0`),
      field: 'page',
    },
    {
      name: 'new person, NUL in the family name',
      who: 'coordinator',
      send: (a) =>
        a.post(`/api/clients/${client}/people`).send({ ...person, familyName: `Re${NUL}yes` }),
      field: 'familyName',
    },
    {
      name: 'new person, escape in the department',
      who: 'coordinator',
      send: (a) => a.post(`/api/clients/${client}/people`).send({ ...person, department: escape }),
      field: 'department',
    },
    {
      name: 'edit person, given name as a number',
      who: 'coordinator',
      send: (a) =>
        a.patch(`/api/clients/${client}/people/${ids.person}`).send({ ...person, givenName: 7 }),
      field: 'givenName',
    },
    {
      name: 'roster mapping, NUL in a target',
      who: 'coordinator',
      send: (a) =>
        a
          .put(`/api/clients/${client}/roster/imports/${randomUUID()}/mapping`)
          .send({ mapping: [NUL] }),
      field: 'mapping.0',
    },
    {
      name: 'open import, a NUL for the client id',
      who: 'coordinator',
      send: (a) => a.get('/api/clients/%00/roster/open-import'),
    },
    {
      name: 'open import, a huge string for the client id',
      who: 'coordinator',
      send: (a) => a.get(`/api/clients/${'x'.repeat(5000)}/roster/open-import`),
    },
    // Days and bookings
    {
      name: 'new day, NUL in the address',
      who: 'coordinator',
      send: (a) => a.post('/api/days').send({ clientId: client, address: `1 Wharf${NUL}` }),
      field: 'address',
    },
    {
      name: 'new day, slot minutes below the bound',
      who: 'coordinator',
      send: (a) => a.post('/api/days').send({ clientId: client, slotMinutes: 2 }),
      field: 'slotMinutes',
    },
    {
      name: 'booking, NUL in the access needs',
      who: 'sitter',
      send: (a) =>
        a.post('/api/bookings').send({
          dayId: day,
          startsAt: `2030-03-14T10:00:00Z`,
          accessNeeds: `step-free${NUL}`,
        }),
      field: 'accessNeeds',
    },
    {
      name: 'booking, huge preferred name',
      who: 'sitter',
      send: (a) =>
        a
          .post('/api/bookings')
          .send({ dayId: day, startsAt: `2030-03-14T10:00:00Z`, preferredName: huge }),
      field: 'preferredName',
    },
    {
      name: 'move booking, start as a number',
      who: 'sitter',
      send: (a) => a.patch(`/api/bookings/${booking.id}`).send({ startsAt: 1_900_000_000 }),
      field: 'startsAt',
    },
    // The station console
    {
      name: 'pass scan, NUL in the token',
      who: 'photographer',
      send: (a) =>
        a.post(`/api/days/${day}/console/actions`).send(checkIn(`${booking.passToken}${NUL}`)),
      field: 'passToken',
    },
    {
      name: 'pass scan, escape sequence in the token',
      who: 'photographer',
      send: (a) => a.post(`/api/days/${day}/console/actions`).send(checkIn(escape)),
      field: 'passToken',
    },
    {
      name: 'pass scan, huge token',
      who: 'photographer',
      send: (a) => a.post(`/api/days/${day}/console/actions`).send(checkIn(huge)),
    },
    {
      name: 'pass scan, token as a number',
      who: 'photographer',
      send: (a) => a.post(`/api/days/${day}/console/actions`).send(checkIn(42)),
    },
    {
      name: 'console roster search, NUL in q',
      who: 'photographer',
      send: (a) => a.get(`/api/days/${day}/console/roster?q=${urlNul}`),
      field: 'q',
    },
    {
      name: 'console events, NUL in the station',
      who: 'photographer',
      send: (a) => a.get(`/api/days/${day}/console/events?stationId=${urlNul}`),
      field: 'stationId',
    },
    // Links and passes in the path
    {
      name: 'portrait link, NUL in the token',
      who: 'anyone',
      send: (a) => a.get(`/api/portraits/${'A'.repeat(40)}${urlNul}`),
    },
    {
      name: 'pass image, escape in the booking id',
      who: 'sitter',
      send: (a) => a.get(`/api/bookings/${booking.id}${encodeURIComponent('\u001b')}/pass.png`),
    },
    {
      name: 'invoice price list, NUL in the currency',
      who: 'admin',
      send: (a) => a.put(`/api/clients/${client}/price-list`).send({ currency: `EU${NUL}` }),
      field: 'currency',
    },
  ];
}

describe('bad input at every route family', () => {
  it('answers each with a 4xx naming the field, and writes nothing', async () => {
    const before = await counts();
    const failures: string[] = [];
    for (const item of cases()) {
      const response = await item.send(agents[item.who]);
      const fields = Object.keys(
        (response.body as { error?: { details?: { fieldErrors?: object } } }).error?.details
          ?.fieldErrors ?? {},
      );
      if (response.status < 400 || response.status >= 500) {
        failures.push(`${item.name}: ${response.status} ${JSON.stringify(response.body)}`);
      } else if (item.field && !fields.includes(item.field)) {
        failures.push(`${item.name}: names ${fields.join(', ') || 'no field'}, not ${item.field}`);
      }
    }
    expect(failures).toEqual([]);
    expect(await counts()).toEqual(before);
  });
});
