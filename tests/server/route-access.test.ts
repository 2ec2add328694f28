import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../server/schemas/common';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { startTestApp, type TestApp } from '../setup/test-app';
import { signedInAgent, signedInSitter } from './helpers';
import {
  setUpOwnershipWorld,
  tableDigest,
  victimBodies,
  victimQueries,
} from './route-ownership-world';

/**
 * The role x route matrix. Every API route must have a line here saying who may call it;
 * a route added without one fails the first test. "public" routes answer anyone.
 */
const expectedAccess: Record<string, readonly Role[] | 'public'> = {
  'GET /api/health': 'public',
  'GET /api/ready': 'public',
  'POST /api/session': 'public',
  'GET /api/session': ['studio_admin', 'photographer', 'coordinator', 'sitter'],
  'DELETE /api/session': 'public',
  'GET /api/sessions': ['studio_admin', 'photographer', 'coordinator', 'sitter'],
  'DELETE /api/sessions': ['studio_admin', 'photographer', 'coordinator', 'sitter'],
  'POST /api/sign-in-links': 'public',
  'POST /api/sign-in-links/redeem': 'public',
  'POST /api/password-resets': 'public',
  'POST /api/passwords': 'public',
  'GET /api/users': ['studio_admin'],
  'POST /api/users': ['studio_admin'],
  'PATCH /api/users/:userId': ['studio_admin'],
  'POST /api/users/:userId/invitation': ['studio_admin'],
  'GET /api/clients': ['studio_admin', 'coordinator'],
  'POST /api/clients': ['studio_admin'],
  'GET /api/clients/:clientId': ['studio_admin', 'coordinator'],
  'GET /api/sitters/me': ['sitter'],
  'GET /api/dev/mailbox': ['studio_admin'],
  'GET /api/dev/mailbox/:messageId': ['studio_admin'],
  'GET /api/dev/mailbox/:messageId/attachments/:index': ['studio_admin'],
  'POST /api/clients/:clientId/roster/imports': ['studio_admin', 'coordinator'],
  'GET /api/clients/:clientId/roster/imports/:importId': ['studio_admin', 'coordinator'],
  'PUT /api/clients/:clientId/roster/imports/:importId/mapping': ['studio_admin', 'coordinator'],
  'GET /api/clients/:clientId/roster/imports/:importId/rows': ['studio_admin', 'coordinator'],
  'GET /api/clients/:clientId/roster/imports/:importId/errors.csv': ['studio_admin', 'coordinator'],
  'POST /api/clients/:clientId/roster/imports/:importId/commit': ['studio_admin', 'coordinator'],
  'GET /api/clients/:clientId/roster/history': ['studio_admin', 'coordinator'],
  'GET /api/clients/:clientId/roster/open-import': ['studio_admin', 'coordinator'],
  'GET /api/clients/:clientId/people': ['studio_admin', 'coordinator'],
  'GET /api/clients/:clientId/people/export.csv': ['studio_admin', 'coordinator'],
  'POST /api/clients/:clientId/people': ['studio_admin', 'coordinator'],
  'PATCH /api/clients/:clientId/people/:personId': ['studio_admin', 'coordinator'],
  'POST /api/clients/:clientId/people/:personId/erasure': ['studio_admin', 'coordinator'],
  'GET /api/days/:dayId/setup-cards': ['studio_admin', 'photographer'],
  'GET /api/setup-card-sources': ['studio_admin', 'photographer'],
  'GET /api/days/:dayId/frames/overview': ['studio_admin', 'photographer'],
  'GET /api/days/:dayId/frames': ['studio_admin', 'photographer', 'coordinator'],
  'GET /api/days/:dayId/review': ['studio_admin', 'photographer'],
  'POST /api/days/:dayId/review/decisions': ['studio_admin', 'photographer'],
  'POST /api/days/:dayId/review/undo': ['studio_admin', 'photographer'],
  'POST /api/days/:dayId/review/run': ['studio_admin', 'photographer'],
  'GET /api/proofs': ['sitter'],
  'GET /api/proofs/:dayId': ['sitter'],
  'PUT /api/proofs/:dayId/picks': ['sitter'],
  'GET /api/proof-images/:frameId': 'public',
  'GET /api/days/:dayId/proofs': ['studio_admin', 'photographer', 'coordinator'],
  'POST /api/days/:dayId/proofs/release': ['studio_admin', 'photographer'],
  'POST /api/days/:dayId/proofs/remind': ['studio_admin', 'photographer', 'coordinator'],
  'PUT /api/days/:dayId/proofs/studio-picks/:personId': ['studio_admin', 'photographer'],
  'GET /api/days/:dayId/proofs/people/:personId': ['coordinator'],
  'PUT /api/days/:dayId/proofs/people/:personId/picks': ['coordinator'],
  'GET /api/clients/:clientId/proof-settings': ['studio_admin'],
  'GET /api/days/:dayId/retouch': ['studio_admin', 'photographer'],
  'PATCH /api/picks/:pickId': ['studio_admin', 'photographer'],
  'GET /api/days/:dayId/retouch/originals.zip': ['studio_admin', 'photographer'],
  'GET /api/picks/:pickId/final': ['studio_admin', 'photographer'],
  'GET /api/days/:dayId/delivery': ['studio_admin', 'photographer', 'coordinator'],
  'POST /api/days/:dayId/delivery/release': ['studio_admin', 'photographer'],
  'GET /api/days/:dayId/delivery.zip': ['studio_admin', 'coordinator'],
  'DELETE /api/days/:dayId/delivery/links/:personId': ['studio_admin', 'photographer'],
  'GET /api/portraits/:token': 'public',
  'GET /api/portraits/:token/files/:fileId': 'public',
  'GET /api/my-portraits/:dayId': ['sitter'],
  'GET /api/my-portraits/:dayId/files/:fileId': ['sitter'],
  'GET /api/clients/:clientId/look': ['studio_admin', 'coordinator'],
  'PUT /api/clients/:clientId/look': ['studio_admin'],
  'GET /api/clients/:clientId/look/names': ['studio_admin', 'coordinator'],
  'GET /api/days/:dayId/set': ['studio_admin', 'photographer'],
  'POST /api/days/:dayId/set/prepare': ['studio_admin', 'photographer'],
  'PUT /api/picks/:pickId/eyes': ['studio_admin', 'photographer'],
  'GET /api/picks/:pickId/source-preview': ['studio_admin', 'photographer'],
  'GET /api/picks/:pickId/renditions/:name': ['studio_admin', 'photographer'],
  'PUT /api/clients/:clientId/proof-settings': ['studio_admin'],
  'POST /api/days/:dayId/frames/known': ['studio_admin', 'photographer'],
  'GET /api/frames/:frameId/thumbnail': ['studio_admin', 'photographer'],
  'GET /api/frames/:frameId/preview': ['studio_admin', 'photographer'],
  'GET /api/frames/:frameId/original': ['studio_admin', 'photographer'],
  'PUT /api/stations/:stationId/setup-card': ['studio_admin', 'photographer'],
  'POST /api/stations/:stationId/setup-card/copy': ['studio_admin', 'photographer'],
  'GET /api/days': ['studio_admin', 'coordinator', 'photographer'],
  'POST /api/days': ['studio_admin', 'coordinator'],
  'GET /api/days/:dayId': ['studio_admin', 'coordinator', 'photographer'],
  'POST /api/days/:dayId/confirmation': ['studio_admin'],
  'POST /api/days/:dayId/changes/preview': ['studio_admin', 'coordinator'],
  'PATCH /api/days/:dayId': ['studio_admin'],
  'POST /api/days/:dayId/cancellation': ['studio_admin'],
  'GET /api/days/:dayId/proposals': ['studio_admin', 'coordinator'],
  'POST /api/days/:dayId/proposals': ['coordinator'],
  'POST /api/days/:dayId/proposals/:proposalId/decline': ['studio_admin'],
  'GET /api/days/:dayId/slots': ['studio_admin', 'coordinator', 'photographer', 'sitter'],
  'GET /api/sitters/me/days': ['sitter'],
  'POST /api/bookings': ['sitter', 'coordinator', 'studio_admin'],
  'PATCH /api/bookings/:bookingId': ['sitter', 'coordinator', 'studio_admin'],
  'DELETE /api/bookings/:bookingId': ['sitter', 'coordinator', 'studio_admin'],
  'PUT /api/bookings/:bookingId/answers': ['sitter', 'coordinator', 'studio_admin'],
  'GET /api/bookings/:bookingId/calendar.ics': ['sitter', 'coordinator', 'studio_admin'],
  'GET /api/bookings/:bookingId/pass.png': [
    'sitter',
    'coordinator',
    'studio_admin',
    'photographer',
  ],
  'GET /api/days/:dayId/progress': ['studio_admin', 'coordinator'],
  'GET /api/clients/:clientId/progress': ['studio_admin', 'coordinator'],
  'GET /api/days/:dayId/schedule': ['studio_admin', 'coordinator', 'photographer'],
  'GET /api/days/:dayId/recorded': ['studio_admin', 'coordinator', 'photographer'],
  'GET /api/days/:dayId/schedule.csv': ['studio_admin', 'coordinator', 'photographer'],
  'POST /api/days/:dayId/invitations': ['studio_admin', 'coordinator'],
  'POST /api/days/:dayId/reminders': ['studio_admin', 'coordinator'],
  'GET /api/days/:dayId/mailings': ['studio_admin', 'coordinator'],
  'GET /api/console/days': ['studio_admin', 'photographer', 'coordinator'],
  'GET /api/days/:dayId/console': ['studio_admin', 'photographer', 'coordinator'],
  'GET /api/days/:dayId/console/roster': ['studio_admin', 'photographer', 'coordinator'],
  'POST /api/days/:dayId/console/actions': ['studio_admin', 'photographer'],
  'GET /api/days/:dayId/summary': ['studio_admin', 'coordinator'],
  'GET /api/clients/:clientId/summary': ['studio_admin', 'coordinator'],
  'GET /api/clients/:clientId/price-list': ['studio_admin', 'coordinator'],
  'PUT /api/clients/:clientId/price-list': ['studio_admin'],
  'POST /api/days/:dayId/invoice': ['studio_admin'],
  'GET /api/invoices/:invoiceId': ['studio_admin', 'coordinator'],
  'GET /api/invoices/:invoiceId/invoice.pdf': ['studio_admin', 'coordinator'],
  'GET /api/invoices/:invoiceId/invoice.csv': ['studio_admin', 'coordinator'],
  // Without ?stationId= an allowed caller gets 400 instead of an endless event stream.
  'GET /api/days/:dayId/console/events': ['studio_admin', 'photographer', 'coordinator'],
};

const allRoles: Role[] = ['studio_admin', 'photographer', 'coordinator', 'sitter'];

let t: TestApp;
let agents: Record<Role, ReturnType<typeof request.agent>>;
let params: Record<string, string>;

beforeAll(async () => {
  t = await startTestApp({
    env: { RATE_LIMIT_PER_ADDRESS: '10000', RATE_LIMIT_PER_ACCOUNT: '10000' },
  });
  const client = await insertClient(t.db);
  const office = await insertOffice(t.db, client.id);
  const admin = await insertStaff(t.db, { role: 'studio_admin' });
  const photographer = await insertStaff(t.db, { role: 'photographer' });
  const coordinator = await insertStaff(t.db, { role: 'coordinator', clientId: client.id });
  const person = await insertPerson(t.db, client.id, { officeId: office.id });
  const target = await insertStaff(t.db, { role: 'photographer' });
  // Not the sitter: roster routes may change this person without ending the sitter's session.
  const rosterPerson = await insertPerson(t.db, client.id);
  // A day staffed by the signed-in photographer, inviting the sitter, who holds a booking.
  const day = await insertDay(t.db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [photographer.id],
  });
  const booking = await t.db
    .insertInto('bookings')
    .values({
      dayId: day.id,
      stationId: day.stations[0]!.id,
      personId: person.id,
      startsAt: new Date(`${day.date}T09:00:00Z`),
      passToken: 'ABCDEFGHIJKLMNOPQRSTUVWXYZ',
      calendarUid: 'route-access@likeness',
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  agents = {
    studio_admin: await signedInAgent(t, admin.email),
    photographer: await signedInAgent(t, photographer.email),
    coordinator: await signedInAgent(t, coordinator.email),
    sitter: await signedInSitter(t, person.email),
  };
  // Ids that exist and that each role could legitimately ask about, so a refusal means the role rule.
  params = {
    clientId: client.id,
    userId: target.id,
    messageId: t.mail.list()[0]?.id ?? 'none',
    personId: rosterPerson.id,
    // An import that does not exist: allowed roles get 404, which is past the role check.
    importId: '00000000-0000-4000-8000-000000000000',
    dayId: day.id,
    stationId: day.stations[0]!.id,
    bookingId: booking.id,
    // A frame that does not exist: as for imports, allowed roles get 404.
    frameId: '00000000-0000-4000-8000-000000000001',
    pickId: '00000000-0000-4000-8000-000000000002',
    invoiceId: '00000000-0000-4000-8000-000000000003',
    proposalId: '00000000-0000-4000-8000-000000000004',
    token: 'A'.repeat(43),
    fileId: '00000000-0000-4000-8000-000000000003',
    name: 'portrait',
    index: '0',
  };
});
afterAll(() => t.close());

function concretePath(path: string): string {
  return path.replace(/:(\w+)/g, (_match, name: string) => {
    const value = params[name];
    if (!value) throw new Error(`The matrix test has no sample value for :${name}`);
    return value;
  });
}

// Sending the mutating requests empty keeps the matrix from changing data: an allowed caller
// gets past the role check and is stopped by validation (400) instead.
function call(
  agent: ReturnType<typeof request.agent> | ReturnType<typeof request>,
  method: string,
  path: string,
) {
  const verb = method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete';
  const pending = agent[verb](concretePath(path));
  return verb === 'get' || verb === 'delete' ? pending : pending.send({});
}

describe('role x route matrix', () => {
  it('has an entry for every route the app serves, and no stale ones', () => {
    const served = t.routeTable
      .map((route) => `${route.method.toUpperCase()} ${route.path}`)
      .sort();
    expect(served).toEqual(Object.keys(expectedAccess).sort());
  });

  it('declares the same access in the app as in this matrix', () => {
    for (const route of t.routeTable) {
      const key = `${route.method.toUpperCase()} ${route.path}`;
      expect(route.access, key).toEqual(expectedAccess[key]);
    }
  });

  const routes = Object.entries(expectedAccess).filter(([key]) => key !== 'DELETE /api/session');
  for (const [key, access] of routes) {
    const [method = 'GET', path = '/'] = key.split(' ');
    it(`${key}: signed out is ${access === 'public' ? 'allowed' : 'refused with 401'}`, async () => {
      const response = await call(request(t.app), method, path);
      if (access === 'public') expect([401, 403]).not.toContain(response.status);
      else expect(response.status).toBe(401);
    });
    for (const role of allRoles) {
      const allowed = access === 'public' || access.includes(role);
      it(`${key}: ${role} is ${allowed ? 'allowed' : 'refused with 403'}`, async () => {
        const response = await call(agents[role], method, path);
        if (allowed)
          expect([401, 403], JSON.stringify(response.body)).not.toContain(response.status);
        else expect(response.status).toBe(403);
      });
    }
  }
});

/**
 * Routes that act only on the caller's own data (no id of anyone else in the path): an outsider
 * is answered, but nothing of the victim's may appear in the answer.
 */
const callerScoped = new Set([
  'GET /api/session',
  'GET /api/sessions',
  'DELETE /api/sessions',
  'GET /api/sitters/me',
  'GET /api/sitters/me/days',
  'GET /api/proofs',
  'GET /api/clients',
  'GET /api/days',
  'GET /api/console/days',
  'GET /api/setup-card-sources',
  // The caller's own delivered files for the day named: none, for someone not on it.
  'GET /api/my-portraits/:dayId',
]);

describe('ownership: another client’s coordinator and sitter, and a photographer not on the day', () => {
  let world: Awaited<ReturnType<typeof setUpOwnershipWorld>>;
  let ownershipParams: Record<string, string>;
  beforeAll(async () => {
    world = await setUpOwnershipWorld(t);
    ownershipParams = {
      ...params,
      ...world.ids,
      name: 'portrait',
      // Not yet made on this day; an owner would get 404 here too, so only the state check counts.
      importId: '00000000-0000-4000-8000-000000000000',
      invoiceId: '00000000-0000-4000-8000-000000000003',
      fileId: '00000000-0000-4000-8000-000000000003',
    };
  }, 120_000);

  const outsiderRoles = ['coordinator', 'sitter', 'photographer'] as const;

  it('refuses every route that names the victim’s ids with 403 or 404, and changes nothing', async () => {
    const bodies = victimBodies(world.ids, world.victimEmail, params.stationId!);
    const queries = victimQueries(world.ids);
    const victimIds = Object.values(world.ids);
    const before = await tableDigest(t);
    const failures: string[] = [];
    for (const [key, access] of Object.entries(expectedAccess)) {
      if (access === 'public') continue;
      const [method = 'GET', path = '/'] = key.split(' ');
      const concrete = path.replace(/:(\w+)/g, (_match, name: string) => {
        const value = ownershipParams[name];
        if (!value) throw new Error(`The ownership matrix has no value for :${name}`);
        return value;
      });
      for (const role of outsiderRoles.filter((outsider) => access.includes(outsider))) {
        const verb = method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete';
        const pending = world.outsiders[role][verb](concrete + (queries[key] ?? ''));
        const response = await (verb === 'get' ? pending : pending.send(bodies[key] ?? {}));
        if (callerScoped.has(key)) {
          // An id the caller itself sent may be echoed; anything else of the victim's may not.
          const leaked = victimIds.filter(
            (id) => !concrete.includes(id) && JSON.stringify(response.body).includes(id),
          );
          if (leaked.length > 0) failures.push(`${key} as ${role}: shows ${leaked.join(', ')}`);
        } else if (![403, 404].includes(response.status)) {
          failures.push(`${key} as ${role}: ${response.status} ${JSON.stringify(response.body)}`);
        }
      }
    }
    expect(failures).toEqual([]);
    expect(await tableDigest(t)).toEqual(before);
  });

  it('DELETE /api/session and DELETE /api/sessions end only the caller’s own sessions', async () => {
    for (const role of outsiderRoles) {
      await world.outsiders[role].delete('/api/sessions').expect(200);
      await world.outsiders[role].delete('/api/session').expect(204);
      await world.outsiders[role].get('/api/session').expect(401);
    }
    for (const victim of Object.values(world.victims)) await victim.get('/api/session').expect(200);
  });
});
