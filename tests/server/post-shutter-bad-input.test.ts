import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertStaff } from '../factories/accounts';
import { startTestApp, type TestApp } from '../setup/test-app';
import { signedInAgent } from './helpers';
import { setUpProofsDay } from './proofs-day';

// Bad input at every route added after the shutter: a NUL, other control characters, a huge
// string, a wrong type or another client's ids get a 4xx with a message, never a 500.
let t: TestApp;
let ready: Awaited<ReturnType<typeof setUpProofsDay>>;
let admin: request.Agent;
let pickId: string;
const nul = encodeURIComponent('\u0000');
const rawNul = '\u0000';
// URLs stay under Node's 16 KB header limit (past it Node itself answers 431); bodies go larger.
const long = 'x'.repeat(10_000);
const huge = 'x'.repeat(100_000);

beforeAll(async () => {
  t = await startTestApp();
  ready = await setUpProofsDay(t, 1);
  admin = await signedInAgent(t, (await insertStaff(t.db, { role: 'studio_admin' })).email);
  const sitter = ready.sitters[0]!;
  const proofs = (await sitter.agent.get(`/api/proofs/${ready.day.dayId}`).expect(200)).body;
  await sitter.agent
    .put(`/api/proofs/${ready.day.dayId}/picks`)
    .send({ picks: [{ frameId: proofs.frames[0].id }] })
    .expect(200);
  pickId = (await t.db.selectFrom('picks').select('id').executeTakeFirstOrThrow()).id;
}, 120_000);
afterAll(() => t?.close());

type Call = [string, (agent: request.Agent) => request.Test];

describe('bad input after the shutter', () => {
  it('answers every bad request with a 4xx and a message', async () => {
    const day = ready.day.dayId;
    const client = ready.client.id;
    const calls: Call[] = [
      ['frames list, bad format', (a) => a.get(`/api/days/${day}/frames?format=${nul}`)],
      ['frames list, huge page', (a) => a.get(`/api/days/${day}/frames?page=${long}`)],
      [
        'decision with NUL action',
        (a) =>
          a.post(`/api/days/${day}/review/decisions`).send({ action: rawNul, frameIds: [pickId] }),
      ],
      [
        'decision with a number for ids',
        (a) =>
          a.post(`/api/days/${day}/review/decisions`).send({ action: 'test_frame', frameIds: 5 }),
      ],
      [
        'decision with huge ids',
        (a) =>
          a
            .post(`/api/days/${day}/review/decisions`)
            .send({ action: 'test_frame', frameIds: [huge] }),
      ],
      [
        'release with a NUL date',
        (a) =>
          a.post(`/api/days/${day}/proofs/release`).send({ picksCloseOn: `2027-03-1${rawNul}` }),
      ],
      [
        'release in the past',
        (a) => a.post(`/api/days/${day}/proofs/release`).send({ picksCloseOn: '2020-01-01' }),
      ],
      [
        'studio pick of a stranger frame',
        (a) =>
          a
            .put(`/api/days/${day}/proofs/studio-picks/${ready.sitters[0]!.id}`)
            .send({ frameId: '00000000-0000-4000-8000-000000000009' }),
      ],
      [
        'proof image with a NUL signature',
        (a) => a.get(`/api/proof-images/${pickId}?p=${ready.sitters[0]!.id}&e=1&s=${nul}`),
      ],
      [
        'proof settings with strings',
        (a) =>
          a.put(`/api/clients/${client}/proof-settings`).send({
            picksIncluded: 'many',
            extraPicksAllowed: 0,
            extraPickPriceCents: 0,
            hrMayChoose: 'yes',
          }),
      ],
      ['retouch search with NUL', (a) => a.get(`/api/days/${day}/retouch?q=${nul}`)],
      ['retouch search, huge', (a) => a.get(`/api/days/${day}/retouch?q=${long}`)],
      [
        'pick update with a NUL status',
        (a) => a.patch(`/api/picks/${pickId}`).send({ status: rawNul }),
      ],
      [
        'look with a NUL name',
        (a) =>
          a
            .put(`/api/clients/${client}/look`)
            .send({ name: `Look${rawNul}`, renditions: [], fileNameTemplate: '{family}' }),
      ],
      [
        'look with a NUL template',
        (a) =>
          a
            .put(`/api/clients/${client}/look`)
            .send({ name: 'Look', renditions: [], fileNameTemplate: `{family}${rawNul}` }),
      ],
      ['name preview with NUL', (a) => a.get(`/api/clients/${client}/look/names?template=${nul}`)],
      ['name preview, huge', (a) => a.get(`/api/clients/${client}/look/names?template=${long}`)],
      ['rendition with a NUL name', (a) => a.get(`/api/picks/${pickId}/renditions/bad${nul}`)],
      ['rendition with a huge name', (a) => a.get(`/api/picks/${pickId}/renditions/${long}`)],
      [
        'eye marks as strings',
        (a) =>
          a
            .put(`/api/picks/${pickId}/eyes`)
            .send({ leftEye: { x: 'a', y: 1 }, rightEye: { x: 2, y: 2 } }),
      ],
      [
        'eye marks far outside',
        (a) =>
          a
            .put(`/api/picks/${pickId}/eyes`)
            .send({ leftEye: { x: 1e308, y: 1 }, rightEye: { x: 2, y: 2 } }),
      ],
      [
        'delivery zip for a NUL office',
        (a) => a.get(`/api/days/${day}/delivery.zip?office=${nul}`),
      ],
      ['delivery zip, unknown parameter', (a) => a.get(`/api/days/${day}/delivery.zip?colour=red`)],
      ['portrait link with NUL', (a) => a.get(`/api/portraits/${nul}`)],
      ['portrait link, huge', (a) => a.get(`/api/portraits/${long}`)],
      ['a day that is not an id', (a) => a.get(`/api/days/${nul}/set`)],
    ];
    for (const [what, call] of calls) {
      const response = await call(admin);
      expect({ what, status: response.status }).toEqual({ what, status: expect.any(Number) });
      expect(response.status, what).toBeGreaterThanOrEqual(400);
      expect(response.status, what).toBeLessThan(500);
      expect(response.body?.error?.message, what).toEqual(expect.any(String));
    }
  });

  it('keeps another client’s coordinator out of this day’s proofs, set and downloads', async () => {
    const other = await t.db
      .insertInto('clients')
      .values({ name: 'Quarrybank Mills', slug: `quarrybank-${Date.now()}` })
      .returning('id')
      .executeTakeFirstOrThrow();
    const stranger = await signedInAgent(
      t,
      (await insertStaff(t.db, { role: 'coordinator', clientId: other.id })).email,
    );
    const day = ready.day.dayId;
    for (const path of [
      `/api/days/${day}/proofs`,
      `/api/days/${day}/delivery`,
      `/api/days/${day}/delivery.zip`,
      `/api/days/${day}/frames`,
      `/api/clients/${ready.client.id}/look`,
      `/api/days/${day}/proofs/people/${ready.sitters[0]!.id}`,
    ]) {
      const response = await stranger.get(path);
      expect({ path, status: response.status }).toEqual({ path, status: 404 });
    }
  });
});
