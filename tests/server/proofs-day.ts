import { mailIdentity } from '../../server/config';
import request from 'supertest';
import { createSmtpMailer } from '../../server/adapters/mail/mailer';
import { createLogger } from '../../server/lib/logger';
import { createAuthService } from '../../server/modules/auth/auth.service';
import { proofsServiceFor } from '../../server/modules/proofs/proofs-wiring';
import { expect } from 'vitest';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDayWithStations } from '../factories/shoot-days';
import { insertSitting } from '../factories/sittings';
import type { TestApp } from '../setup/test-app';
import { planCard } from '../support/shoot-day-card';
import { runQueuedJobs } from './booking-jobs';
import { uploadCardAndMatch } from './card-upload';
import { linkTokenFrom, signedInAgent } from './helpers';
import { openTusSession } from './tus-client';

/**
 * A photographed day ready for proofs: sitters with a sitting each, their card uploaded and
 * matched, the proofs released, and each sitter signed in from their proofs mail.
 */
export async function setUpProofsDay(
  t: TestApp,
  sittings = 2,
  options: { redeemLinks?: boolean } = {},
) {
  const matched = await setUpMatchedDay(t, sittings);
  const { day, people, studio } = matched;
  const released = await studio.post(`/api/days/${day.dayId}/proofs/release`).send({}).expect(201);
  expect(released.body).toMatchObject({ queued: sittings, alreadySent: 0 });
  await runQueuedJobs(t);
  const sitters = [];
  for (const person of people) {
    const mail = await t.mail.waitFor(person.email);
    const agent = request.agent(t.app);
    // A browser test opens the link itself: it can be used once.
    if (options.redeemLinks !== false)
      await agent
        .post('/api/sign-in-links/redeem')
        .send({ token: linkTokenFrom(mail.text, 'link') })
        .expect(201);
    sitters.push({ id: person.id, email: person.email, agent, mail });
  }
  return { ...matched, sitters };
}

/** A day photographed and matched, its proofs not sent yet. */
export async function setUpMatchedDay(t: TestApp, sittings = 2) {
  const client = await insertClient(t.db);
  const office = await insertOffice(t.db, client.id);
  const photographer = await insertStaff(t.db, { role: 'photographer' });
  const day = await insertDayWithStations(t.db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [photographer.id],
  });
  const plan = planCard({
    firstSittingAt: new Date('2027-03-04T09:00:00Z'),
    sittings,
    framesPerSitting: 3,
    clockOffsetMs: 0,
    firstNumber: 120,
  });
  const people = [];
  for (const sitting of plan.sittings) {
    const person = await insertPerson(t.db, client.id);
    people.push(person);
    await insertSitting(t.db, {
      dayId: day.dayId,
      stationId: day.stations[0]!.id,
      personId: person.id,
      ...sitting,
    });
  }
  const session = await openTusSession(t, photographer.email);
  await uploadCardAndMatch(t, session, { dayId: day.dayId, stationId: day.stations[0]!.id }, plan);
  const studio = await signedInAgent(t, photographer.email);
  return { client, day, plan, photographer, session, studio, people };
}

/** Runs the deadline's settling now, as the settle-picks job would at the deadline. */
export async function settlePicksNow(t: TestApp, dayId: string) {
  const mailer = createSmtpMailer({ smtpUrl: t.mail.smtpUrl, ...mailIdentity(t.config) });
  try {
    const logger = createLogger('silent');
    const auth = createAuthService({ db: t.db, clock: t.clock, mailer, config: t.config, logger });
    await proofsServiceFor({ db: t.db, clock: t.clock, mailer, auth }).settle(dayId);
  } finally {
    mailer.close();
  }
}
