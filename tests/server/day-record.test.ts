import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertStaff } from '../factories/accounts';
import { startTestApp, type TestApp } from '../setup/test-app';
import { recordedDayScenario } from '../support/recorded-day';
import { signedInAgent } from './helpers';

let t: TestApp;
let scenario: Awaited<ReturnType<typeof recordedDayScenario>>;
beforeAll(async () => {
  t = await startTestApp();
  scenario = await recordedDayScenario(t);
});
afterAll(() => t.close());

describe('the day sheet after the day', () => {
  it('lists per station what the console recorded, walk-ins included, undone changes left out', async () => {
    const agent = await signedInAgent(t, scenario.photographer.email);
    const response = await agent.get(`/api/days/${scenario.day.id}/recorded`).expect(200);
    const [a, b] = response.body.stations as Array<{ name: string; rows: unknown[] }>;
    const pick = (row: Record<string, unknown>) => ({
      localTime: row.localTime,
      name: String(row.name).split(' ')[0],
      arrival: row.arrival,
      outcome: row.outcome,
      checkedInAt: row.checkedInAt,
      otherStationName: row.otherStationName,
      firstFrame: row.firstFrame,
      lastFrame: row.lastFrame,
    });
    expect(a!.name).toBe('Station A');
    expect(a!.rows.map((row) => pick(row as Record<string, unknown>))).toEqual([
      {
        localTime: '09:00',
        name: 'Aino',
        arrival: null,
        outcome: 'photographed',
        checkedInAt: '08:58',
        otherStationName: null,
        firstFrame: 101,
        lastFrame: 120,
      },
      {
        localTime: '09:05',
        name: 'Bram',
        arrival: null,
        outcome: 'no_show',
        checkedInAt: null,
        otherStationName: null,
        firstFrame: null,
        lastFrame: null,
      },
      {
        localTime: '09:07',
        name: 'Carla',
        arrival: 'walk_in',
        outcome: 'photographed',
        checkedInAt: '09:07',
        otherStationName: null,
        firstFrame: 121,
        lastFrame: 130,
      },
      {
        localTime: '09:10',
        name: 'Dries',
        arrival: null,
        outcome: 'photographed_elsewhere',
        checkedInAt: '09:09',
        otherStationName: 'Station B',
        firstFrame: null,
        lastFrame: null,
      },
      {
        localTime: '09:15',
        name: 'Edda',
        arrival: null,
        outcome: 'not_recorded',
        checkedInAt: null,
        otherStationName: null,
        firstFrame: null,
        lastFrame: null,
      },
    ]);
    expect(b!.rows.map((row) => pick(row as Record<string, unknown>))).toEqual([
      {
        localTime: '09:09',
        name: 'Dries',
        arrival: 'booked_elsewhere',
        outcome: 'photographed',
        checkedInAt: '09:09',
        otherStationName: null,
        firstFrame: 5,
        lastFrame: 9,
      },
    ]);
  });

  it("is not another client's coordinator's to read", async () => {
    const other = await insertClient(t.db, { name: 'Quillmoor Textiles' });
    const coordinator = await insertStaff(t.db, { role: 'coordinator', clientId: other.id });
    const agent = await signedInAgent(t, coordinator.email);
    await agent.get(`/api/days/${scenario.day.id}/recorded`).expect(404);
  });
});
