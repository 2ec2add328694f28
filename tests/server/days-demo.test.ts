import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, loadDemoScenario } from '../../scripts/lib/demo-scenario';
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
});
