import { randomUUID } from 'node:crypto';
import type { Db } from '../../server/db/database';
import { newPassToken } from '../../server/modules/booking/pass';
import type { ConsoleAction } from '../../server/schemas/console';

/** A booking inserted directly (the booking rules are tested elsewhere). */
export async function insertBooking(
  db: Db,
  input: {
    dayId: string;
    stationId: string;
    personId: string;
    startsAt: Date;
    status?: 'active' | 'cancelled';
    flashSensitive?: boolean;
  },
) {
  return db
    .insertInto('bookings')
    .values({
      dayId: input.dayId,
      stationId: input.stationId,
      personId: input.personId,
      startsAt: input.startsAt,
      status: input.status ?? 'active',
      passToken: newPassToken(),
      calendarUid: `${randomUUID()}@likeness.test`,
      flashSensitive: input.flashSensitive ?? false,
    })
    .returning(['id', 'passToken'])
    .executeTakeFirstOrThrow();
}

type Body<K extends ConsoleAction['kind']> = Omit<
  Extract<ConsoleAction, { kind: K }>,
  'idempotencyKey' | 'tabletAt' | 'kind'
>;

/** A console action as a tablet would send it, with a fresh idempotency key. */
export function action<K extends ConsoleAction['kind']>(
  kind: K,
  body: Body<K>,
  tabletAt = new Date(),
): Extract<ConsoleAction, { kind: K }> {
  return {
    kind,
    idempotencyKey: randomUUID(),
    tabletAt: tabletAt.toISOString(),
    ...body,
  } as Extract<ConsoleAction, { kind: K }>;
}

export const slateToken = () => newPassToken();
