import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { wallClockAt, zonedTimeToInstant } from '../../server/modules/days/zoned-time';
import {
  insertClient,
  insertOffice,
  insertPerson,
  insertStaff,
  TEST_PASSWORD,
} from '../factories/accounts';
import { insertDay } from '../factories/days';
import { runQueuedJobs } from '../server/booking-jobs';
import {
  seriousAxeViolations,
  signInWithPassword,
  startE2e,
  type E2eEnvironment,
} from './support/browser';

let env: E2eEnvironment;
beforeAll(async () => {
  env = await startE2e();
});
afterAll(() => env?.close());

describe('a coordinator on the day itself', () => {
  it('is not offered begun slots, picks a station, sees only mailed people as invited, and the reminder cool-down', async () => {
    const t = env.testApp;
    // The test clock stands at 12:02 in Leeds today, during the day's opening hours.
    const today = wallClockAt(t.clock.now().getTime(), 'Europe/London').date;
    t.clock.advance(zonedTimeToInstant(today, '12:02', 'Europe/London') - t.clock.now().getTime());
    const client = await insertClient(t.db);
    const office = await insertOffice(t.db, client.id, 'Leeds', 'Europe/London');
    const first = await insertStaff(t.db, { role: 'photographer' });
    const second = await insertStaff(t.db, { role: 'photographer' });
    const day = await insertDay(t.db, {
      clientId: client.id,
      officeId: office.id,
      photographerIds: [first.id, second.id],
      date: today,
      opensAt: '09:00',
      closesAt: '17:00',
      // Sitters may still book themselves this afternoon, so a reminder still makes sense.
      bookingClosesAt: new Date(zonedTimeToInstant(today, '16:00', 'Europe/London')),
    });
    await insertPerson(t.db, client.id, { officeId: office.id, givenName: 'Oskar' });
    await insertPerson(t.db, client.id, { officeId: office.id, givenName: 'Wren' });
    const coordinator = await insertStaff(t.db, { role: 'coordinator', clientId: client.id });

    const context = await env.newContext();
    const page = await context.newPage();
    await signInWithPassword(page, coordinator.email, TEST_PASSWORD);
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    await page.goto(`/days/${day.id}`);
    const invitedTile = page.locator('dt', { hasText: 'Invited (mailed)' }).locator('xpath=../dd');
    await invitedTile.waitFor();
    // Two people are on the list, but nothing has been sent yet.
    expect(await invitedTile.innerText()).toBe('0');

    const bookFor = page.getByRole('form', { name: 'Book for someone' });
    await bookFor.getByRole('radio', { name: '12:05' }).waitFor({ state: 'attached' });
    expect(await bookFor.getByRole('radio', { name: '12:00' }).count()).toBe(0);
    expect(await bookFor.getByRole('radio', { name: '09:00' }).count()).toBe(0);
    const person = await bookFor
      .getByLabel('Person')
      .locator('option')
      .nth(1)
      .getAttribute('value');
    await bookFor.getByLabel('Person').selectOption(person ?? '');
    await bookFor.getByRole('radio', { name: '12:05' }).check({ force: true });
    await bookFor.getByLabel('Station').selectOption({ label: 'Station B' });
    await bookFor.getByRole('button', { name: 'Book for them' }).click();
    await bookFor.getByText(/^Booked .* at 12:05 \(Station B\)/).waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);

    await page.getByRole('button', { name: 'Send invitations' }).click();
    await page.getByText('2 queued').waitFor();
    await runQueuedJobs(t);
    await page.reload();
    await invitedTile.waitFor();
    expect(await invitedTile.innerText()).toBe('2');

    await page.getByRole('button', { name: 'Remind the unbooked (1)' }).click();
    await page.getByText('1 queued').waitFor();
    await page.getByText('the next reminder is possible from', { exact: false }).waitFor();
    const remindAgain = page.getByRole('button', { name: 'Remind the unbooked' });
    expect(await remindAgain.isDisabled()).toBe(true);
    await page.getByText('Next reminder from', { exact: false }).first().waitFor();
    await context.close();
  });
});
