import { sql, type Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type { Database } from '../../db/types';
import type { MailingKind, MailingLog } from '../../schemas/days';

type Executor = Db | Transaction<Database>;

/** Inserts one mailing per person; a person who already has this kind and round is skipped. */
export async function insertMailings(
  trx: Transaction<Database>,
  dayId: string,
  personIds: string[],
  kind: MailingKind,
  round: number,
  queuedAt?: Date,
): Promise<string[]> {
  if (personIds.length === 0) return [];
  const rows = await trx
    .insertInto('dayMailings')
    .values(personIds.map((personId) => ({ dayId, personId, kind, round, queuedAt })))
    .onConflict((conflict) => conflict.columns(['dayId', 'personId', 'kind', 'round']).doNothing())
    .returning('id')
    .execute();
  return rows.map((row) => row.id);
}

/** The round after the day's last mailing of this kind (1 when there is none). */
export async function nextRound(trx: Transaction<Database>, dayId: string, kind: MailingKind) {
  const last = await trx
    .selectFrom('dayMailings')
    .select((eb) => eb.fn.max('round').as('round'))
    .where('dayId', '=', dayId)
    .where('kind', '=', kind)
    .executeTakeFirst();
  return (last?.round ?? 0) + 1;
}

export async function bumpReminderRound(trx: Transaction<Database>, dayId: string) {
  const row = await trx
    .updateTable('shootDays')
    .set((eb) => ({ reminderRounds: eb('reminderRounds', '+', 1) }))
    .where('id', '=', dayId)
    .returning('reminderRounds')
    .executeTakeFirstOrThrow();
  return row.reminderRounds;
}

export function findMailing(db: Executor, id: string) {
  return db
    .selectFrom('dayMailings')
    .innerJoin('people', 'people.id', 'dayMailings.personId')
    .select([
      'dayMailings.id',
      'dayMailings.dayId',
      'dayMailings.personId',
      'dayMailings.kind',
      'dayMailings.status',
      'people.email',
      'people.active',
      sql<string>`coalesce(people.preferred_name, people.given_name)`.as('name'),
    ])
    .where('dayMailings.id', '=', id)
    .executeTakeFirst();
}

export async function markMailing(
  db: Executor,
  id: string,
  status: 'sent' | 'failed',
  reason: string | null,
  now: Date,
) {
  await db
    .updateTable('dayMailings')
    .set({ status, reason, sentAt: status === 'sent' ? now : null })
    .where('id', '=', id)
    .execute();
}

export async function mailingLog(
  db: Executor,
  dayId: string,
): Promise<Omit<MailingLog, 'reminders'>> {
  const rows = await db
    .selectFrom('dayMailings')
    .innerJoin('people', 'people.id', 'dayMailings.personId')
    .select([
      'dayMailings.personId',
      sql<string>`coalesce(people.preferred_name, people.given_name) || ' ' || people.family_name`.as(
        'name',
      ),
      'people.email',
      'dayMailings.kind',
      'dayMailings.round',
      'dayMailings.status',
      'dayMailings.reason',
      sql<Date>`coalesce(day_mailings.sent_at, day_mailings.queued_at)`.as('updatedAt'),
    ])
    .where('dayMailings.dayId', '=', dayId)
    .orderBy('dayMailings.queuedAt', 'desc')
    .orderBy('people.familyName')
    .execute();
  const counts = { queued: 0, sent: 0, failed: 0 };
  for (const row of rows) counts[row.status] += 1;
  return {
    counts,
    entries: rows.map((row) => ({
      ...row,
      updatedAt: new Date(row.updatedAt).toISOString(),
      nextReminderAt: null,
    })),
  };
}

export async function personIdsWithMailing(db: Executor, dayId: string, kind: MailingKind) {
  const rows = await db
    .selectFrom('dayMailings')
    .select('personId')
    .where('dayId', '=', dayId)
    .where('kind', '=', kind)
    .execute();
  return new Set(rows.map((row) => row.personId));
}

export async function bookedPersonIds(db: Executor, dayId: string): Promise<Set<string>> {
  const rows = await db
    .selectFrom('bookings')
    .select('personId')
    .where('dayId', '=', dayId)
    .where('status', '=', 'active')
    .execute();
  return new Set(rows.map((row) => row.personId));
}

/** People who came to the day (checked in at a station, booked or not). */
export async function checkedInPersonIds(db: Executor, dayId: string): Promise<Set<string>> {
  const rows = await db
    .selectFrom('checkIns')
    .select('personId')
    .where('dayId', '=', dayId)
    .execute();
  return new Set(rows.map((row) => row.personId));
}

/** Confirmed days whose date is within the next two calendar days: candidates for day-before mail. */
export async function upcomingDayIds(db: Executor, now: Date): Promise<string[]> {
  const rows = await db
    .selectFrom('shootDays')
    .select('id')
    .where('status', '=', 'confirmed')
    .where(
      sql<boolean>`day_date between (${now}::timestamptz at time zone 'UTC')::date - 1 and (${now}::timestamptz at time zone 'UTC')::date + 2`,
    )
    .execute();
  return rows.map((row) => row.id);
}

/** When each person of the day was last reminded (queued), for the reminder cool-down. */
export async function lastRemindedAt(
  db: Executor,
  dayId: string,
  kind: 'reminder' | 'proofs_reminder' = 'reminder',
): Promise<Map<string, Date>> {
  const rows = await db
    .selectFrom('dayMailings')
    .select(['personId', (eb) => eb.fn.max('queuedAt').as('last')])
    .where('dayId', '=', dayId)
    .where('kind', '=', kind)
    .groupBy('personId')
    .execute();
  return new Map(rows.map((row) => [row.personId, new Date(row.last)]));
}
