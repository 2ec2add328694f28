import { randomUUID } from 'node:crypto';
import type { Db } from '../../server/db/database';
import { newPassToken } from '../../server/modules/booking/pass';

/**
 * A sitting as the station console leaves it (checked in by hand, started, maybe finished),
 * inserted directly: the console's own rules are tested in console-*.test.ts.
 */
export async function insertSitting(
  db: Db,
  input: {
    dayId: string;
    stationId: string;
    personId: string;
    startedAt: Date;
    finishedAt?: Date | null;
    firstFrame: number;
    lastFrame?: number | null;
    slateToken?: string;
  },
) {
  const checkInId = randomUUID();
  await db
    .insertInto('checkIns')
    .values({
      id: checkInId,
      dayId: input.dayId,
      personId: input.personId,
      bookingId: null,
      stationId: input.stationId,
      method: 'search',
      checkedInAt: input.startedAt,
      tabletAt: input.startedAt,
    })
    .execute();
  const sitting = {
    id: randomUUID(),
    dayId: input.dayId,
    stationId: input.stationId,
    personId: input.personId,
    checkInId,
    slateToken: input.slateToken ?? newPassToken(),
    firstFrame: input.firstFrame,
    lastFrame: input.lastFrame ?? null,
    startedAt: input.startedAt,
    tabletStartedAt: input.startedAt,
    finishedAt: input.finishedAt ?? null,
    tabletFinishedAt: input.finishedAt ?? null,
  };
  await db.insertInto('sittings').values(sitting).execute();
  return sitting;
}
