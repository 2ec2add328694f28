import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SetupCardInput } from '../../server/schemas/setup-card';
import { insertClient, insertOffice, insertStaff } from '../factories/accounts';
import { insertDayWithStations } from '../factories/shoot-days';
import { startTestApp, type TestApp } from '../setup/test-app';
import { signedInAgent } from './helpers';

// A typical key-plus-fill headshot set (common practice).
const card: SetupCardInput = {
  lights: [
    { role: 'key', power: 0.5, modifier: 'shoot-through umbrella', distanceMetres: 1.2 },
    { role: 'fill', power: 1 / 32, modifier: 'small diffuser', distanceMetres: 1.5 },
  ],
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
};

let t: TestApp;
let day: Awaited<ReturnType<typeof insertDayWithStations>>;
let otherDay: Awaited<ReturnType<typeof insertDayWithStations>>;
let admin: ReturnType<typeof signedInAgent> extends Promise<infer A> ? A : never;
let assigned: typeof admin;
let unassigned: typeof admin;
let coordinator: typeof admin;

beforeAll(async () => {
  t = await startTestApp();
  const client = await insertClient(t.db);
  const office = await insertOffice(t.db, client.id);
  const photographer = await insertStaff(t.db, { role: 'photographer' });
  const stranger = await insertStaff(t.db, { role: 'photographer' });
  day = await insertDayWithStations(t.db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [photographer.id, null],
  });
  otherDay = await insertDayWithStations(t.db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [stranger.id],
    date: '2027-03-05',
  });
  admin = await signedInAgent(t, (await insertStaff(t.db)).email);
  assigned = await signedInAgent(t, photographer.email);
  unassigned = await signedInAgent(t, stranger.email);
  coordinator = await signedInAgent(
    t,
    (await insertStaff(t.db, { role: 'coordinator', clientId: client.id })).email,
  );
});
afterAll(() => t.close());

const stationId = (index: number) => day.stations[index]?.id ?? '';

describe('setup cards', () => {
  it('lists every station of the day, without a card at first', async () => {
    const response = await admin.get(`/api/days/${day.dayId}/setup-cards`).expect(200);
    expect(response.body.stations.map((s: { stationName: string }) => s.stationName)).toEqual([
      'Station 1',
      'Station 2',
    ]);
    expect(response.body.stations[0].card).toBeNull();
  });

  it('lets the assigned photographer save a card and reads it back', async () => {
    await assigned
      .put(`/api/stations/${stationId(0)}/setup-card`)
      .send({ card })
      .expect(204);
    const response = await assigned.get(`/api/days/${day.dayId}/setup-cards`).expect(200);
    expect(response.body.stations[0].card.lights[0]).toMatchObject({ role: 'key', power: 0.5 });
    expect(response.body.stations[0].updatedAt).not.toBeNull();
  });

  it('copies a card to another station of the day', async () => {
    await admin
      .post(`/api/stations/${stationId(1)}/setup-card/copy`)
      .send({ fromStationId: stationId(0) })
      .expect(204);
    const response = await admin.get(`/api/days/${day.dayId}/setup-cards`).expect(200);
    expect(response.body.stations[1].card).toEqual(response.body.stations[0].card);
  });

  it('refuses an invalid card with field errors and keeps the saved one', async () => {
    const broken = { ...card, lights: [{ role: 'fill', power: 3, distanceMetres: -1 }] };
    const response = await assigned
      .put(`/api/stations/${stationId(0)}/setup-card`)
      .send({ card: broken });
    expect(response.status).toBe(400);
    const stored = await assigned.get(`/api/days/${day.dayId}/setup-cards`).expect(200);
    expect(stored.body.stations[0].card.lights).toHaveLength(2);
  });

  it('refuses to copy from a station that has no card', async () => {
    const empty = otherDay.stations[0]?.id ?? '';
    const response = await admin
      .post(`/api/stations/${stationId(0)}/setup-card/copy`)
      .send({ fromStationId: empty });
    expect(response.status).toBe(409);
  });

  it('keeps a photographer off days they are not assigned to', async () => {
    await unassigned.get(`/api/days/${day.dayId}/setup-cards`).expect(403);
    await unassigned
      .put(`/api/stations/${stationId(0)}/setup-card`)
      .send({ card })
      .expect(403);
    const sources = await unassigned.get('/api/setup-card-sources').expect(200);
    expect(sources.body.sources).toEqual([]);
  });

  it('is not for coordinators, and answers 404 for an unknown day', async () => {
    await coordinator.get(`/api/days/${day.dayId}/setup-cards`).expect(403);
    await admin.get('/api/days/00000000-0000-4000-8000-000000000000/setup-cards').expect(404);
  });
});
