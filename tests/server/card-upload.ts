import { expect } from 'vitest';
import type { TestApp } from '../setup/test-app';
import { cardFileBytes, type CardPlan } from '../support/shoot-day-card';
import { runQueuedJobs } from './booking-jobs';
import { createUpload, patchUpload, type TusSession } from './tus-client';

/** Uploads a generated card through tus, then runs the jobs: read, then match. */
export async function uploadCardAndMatch(
  t: TestApp,
  session: TusSession,
  target: { dayId: string; stationId: string },
  plan: CardPlan,
) {
  for (const file of plan.files) {
    const bytes = await cardFileBytes(file);
    const created = await createUpload(
      session,
      { ...target, cardPath: file.cardPath },
      bytes.length,
    );
    expect(created.status, created.body).toBe(201);
    const finished = await patchUpload(session, created.url!, 0, bytes);
    expect(finished.status).toBe(204);
  }
  await runQueuedJobs(t);
}
