import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  insertClient,
  insertOffice,
  insertPerson,
  insertStaff,
  TEST_PASSWORD,
} from '../factories/accounts';
import { insertDayWithStations } from '../factories/shoot-days';
import { insertSitting } from '../factories/sittings';
import { insertBooking } from '../server/console-support';
import {
  seriousAxeViolations,
  signInWithPassword,
  startE2e,
  type E2eEnvironment,
} from './support/browser';

let env: E2eEnvironment;
let dayId: string;
let coordinatorEmail: string;
beforeAll(async () => {
  env = await startE2e();
  const db = env.testApp.db;
  const client = await insertClient(db, { name: 'Halvorsen & Pike Engineering' });
  const rotterdam = await insertOffice(db, client.id, 'Rotterdam', 'Europe/Amsterdam');
  const leeds = await insertOffice(db, client.id, 'Leeds', 'Europe/London');
  coordinatorEmail = (await insertStaff(db, { role: 'coordinator', clientId: client.id })).email;
  const day = await insertDayWithStations(db, {
    clientId: client.id,
    officeId: rotterdam.id,
    photographerIds: [null],
    date: '2027-03-09',
  });
  dayId = day.dayId;
  const stationId = day.stations[0]!.id;
  const person = async (officeId: string, department: string) => {
    const inserted = await insertPerson(db, client.id, { officeId });
    await db.updateTable('people').set({ department }).where('id', '=', inserted.id).execute();
    return inserted;
  };
  const at = (time: string) => new Date(`2027-03-09T${time}:00Z`);
  // Four invited (the Rotterdam office): photographed, no-show, booked only, not booked.
  const photographed = await person(rotterdam.id, 'Design');
  const noShow = await person(rotterdam.id, 'Design');
  const bookedOnly = await person(rotterdam.id, 'Finance');
  const notBooked = await person(rotterdam.id, 'Finance');
  // Invited means mailed: each of the four had their invitation sent.
  await db
    .insertInto('dayMailings')
    .values(
      [photographed, noShow, bookedOnly, notBooked].map((each) => ({
        dayId,
        personId: each.id,
        kind: 'invitation' as const,
        status: 'sent' as const,
        reason: null,
        sentAt: at('07:00'),
      })),
    )
    .execute();
  await insertBooking(db, { dayId, stationId, personId: photographed.id, startsAt: at('08:00') });
  const missed = await insertBooking(db, {
    dayId,
    stationId,
    personId: noShow.id,
    startsAt: at('08:05'),
  });
  await insertBooking(db, { dayId, stationId, personId: bookedOnly.id, startsAt: at('08:10') });
  await insertSitting(db, {
    dayId,
    stationId,
    personId: photographed.id,
    startedAt: at('08:01'),
    finishedAt: at('08:04'),
    firstFrame: 1,
    lastFrame: 12,
  });
  await db
    .insertInto('noShows')
    .values({
      id: randomUUID(),
      dayId,
      bookingId: missed.id,
      stationId,
      markedAt: at('08:20'),
      tabletAt: at('08:20'),
    })
    .execute();
  // A walk-in from the Leeds office, not invited to this day, photographed all the same.
  const walkIn = await person(leeds.id, 'Design');
  await insertSitting(db, {
    dayId,
    stationId,
    personId: walkIn.id,
    startedAt: at('08:30'),
    finishedAt: at('08:33'),
    firstFrame: 13,
    lastFrame: 25,
  });
});
afterAll(() => env?.close());

describe('coordinator progress', () => {
  it('counts invited, booked, checked in, photographed and no-shows, drawn as a chart', async () => {
    const context = await env.newContext({ viewport: { width: 1280, height: 1000 } });
    const page = await context.newPage();
    await signInWithPassword(page, coordinatorEmail, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Welcome,/ }).waitFor();

    await page.goto(`/days/${dayId}`);
    const byOffice = page.getByRole('img', { name: /^By office\./ });
    await byOffice.waitFor();
    // The no-show is not booked; the walk-in is checked in and photographed, though not invited.
    expect(await byOffice.getAttribute('aria-label')).toBe(
      'By office. Leeds: 0 invited, 0 booked, 1 checked in, 1 photographed, 0 no-show; ' +
        'Rotterdam: 4 invited, 2 booked, 1 checked in, 1 photographed, 1 no-show',
    );
    expect(await byOffice.locator('rect').count()).toBeGreaterThanOrEqual(8);
    const departments = page.getByRole('img', { name: /^By department\./ });
    expect(await departments.getAttribute('aria-label')).toBe(
      'By department. Design: 2 invited, 1 booked, 2 checked in, 2 photographed, 1 no-show; ' +
        'Finance: 2 invited, 1 booked, 0 checked in, 0 photographed, 0 no-show',
    );
    const totals = page.locator('dl').filter({ hasText: 'Photographed' });
    await totals.getByText('No-show').waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);

    // The venue's people see the cautions on the day page too.
    await page.getByRole('heading', { name: 'Safety at the venue' }).waitFor();
    await page.getByText(/every other station in the same room holds/).waitFor();

    // The client's overview names each day in full ("Rotterdam · 2027-03-09"), never cut short.
    await page.goto('/days');
    const byDay = page.getByRole('img', { name: /^By day\./ });
    await byDay.waitFor();
    expect(await byDay.getAttribute('aria-label')).toContain(
      'Rotterdam · 2027-03-09: 4 invited, 2 booked, 2 checked in, 2 photographed, 1 no-show',
    );
    await byDay.locator('text', { hasText: 'Rotterdam · 2027-03-09' }).waitFor();
    await page.getByRole('rowheader', { name: 'Rotterdam · 2027-03-09' }).waitFor();
    await context.close();
  });
});
