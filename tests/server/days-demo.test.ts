import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadDemoPhotographedDay } from '../../scripts/lib/demo-photographed-day';
import { planCrop } from '../../server/modules/looks/crop-geometry';
import { lookPresets } from '../../server/modules/looks/look-presets';
import { startingEyeMarks } from '../../server/schemas/looks';
import { DEMO_PASSWORD, loadDemoScenario } from '../../scripts/lib/demo-scenario';
import { runQueuedJobs } from './booking-jobs';
import { startTestApp, type TestApp } from '../setup/test-app';
import request from 'supertest';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.close());

describe('demo shoot days', () => {
  it('load once: one day per office in its own zone, staffed by the demo photographers', async () => {
    expect(await loadDemoScenario(t.db)).toBe(true);
    expect(await loadDemoScenario(t.db)).toBe(false);
    const tomas = request.agent(t.app);
    await tomas
      .post('/api/session')
      .send({ email: 'tomas@northlight.example', password: DEMO_PASSWORD })
      .expect(201);
    const days = (await tomas.get('/api/days').expect(200)).body.days;
    expect(days.map((day: { officeName: string }) => day.officeName)).toEqual(['Leeds', 'Porto']);
    expect(days[0]).toMatchObject({ timeZone: 'Europe/London', status: 'confirmed' });
    expect(days[0].seats).toBeGreaterThan(0);
    const all = await t.db.selectFrom('shootDays').select('timeZone').execute();
    expect(all.map((day) => day.timeZone).sort()).toEqual([
      'Europe/Amsterdam',
      'Europe/Lisbon',
      'Europe/London',
    ]);
  });

  it("yesterday's photographed day: its card is read and every frame after a slate matched to its sitter", async () => {
    const loaded = await loadDemoPhotographedDay({
      db: t.db,
      storage: t.storage,
      limits: t.config.uploads,
      now: t.clock.now(),
    });
    expect(loaded).not.toBeNull();
    await runQueuedJobs(t);
    const tomas = request.agent(t.app);
    await tomas
      .post('/api/session')
      .send({ email: 'tomas@northlight.example', password: DEMO_PASSWORD })
      .expect(201);
    const days = (await tomas.get('/api/days').expect(200)).body.days;
    expect(days.map((day: { officeName: string }) => day.officeName)).toContain('York');
    const matches = await t.db
      .selectFrom('frameMatches')
      .select(['personId', 'reason'])
      .where('dayId', '=', loaded!.dayId)
      .execute();
    expect(matches).toHaveLength(loaded!.frames);
    const perPerson = new Map<string, number>();
    for (const match of matches)
      if (match.personId) perPerson.set(match.personId, (perPerson.get(match.personId) ?? 0) + 1);
    const aldermoor = await t.db
      .selectFrom('people')
      .innerJoin('clients', 'clients.id', 'people.clientId')
      .select('people.id')
      .where('clients.slug', '=', 'aldermoor-housing-trust')
      .execute();
    // Six sitters, each with a slate and four frames (the generated card's plan).
    expect([...perPerson.keys()].sort()).toEqual(aldermoor.map((person) => person.id).sort());
    for (const count of perPerson.values()) expect(count).toBe(5);

    // The day's figures agree page to page: six invited, booked, checked in, photographed.
    const coordinator = request.agent(t.app);
    await coordinator
      .post('/api/session')
      .send({ email: 'hr@aldermoor.example', password: DEMO_PASSWORD })
      .expect(201);
    const progress = await coordinator.get(`/api/days/${loaded!.dayId}/progress`).expect(200);
    expect(progress.body).toMatchObject({
      invited: 6,
      booked: 6,
      checkedIn: 6,
      photographed: 6,
      unbooked: 0,
    });

    // Tried at once: with the hand marks where they start, every preset rendition fits the
    // demo's frames (the refusals are the look's own rules, see crop-geometry.ts).
    const sizes = await t.db
      .selectFrom('frames')
      .select(['pixelWidth as width', 'pixelHeight as height'])
      .where('dayId', '=', loaded!.dayId)
      .execute();
    expect(sizes.length).toBeGreaterThan(0);
    for (const { width, height } of sizes) {
      expect(width, 'frame read').not.toBeNull();
      const marks = startingEyeMarks(width!, height!);
      for (const { rendition } of lookPresets) {
        const plan = planCrop({
          imageWidth: width!,
          imageHeight: height!,
          leftEye: marks.left,
          rightEye: marks.right,
          rendition,
        });
        expect(plan.ok ? 'fits' : plan.message, rendition.name).toBe('fits');
      }
    }
  });
});
