import { sql, type Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type { Database } from '../../db/types';
import type { DayChangeProposal, DayChanges } from '../../schemas/day-changes';

type Executor = Db | Transaction<Database>;
type Trx = Transaction<Database>;

export async function updateDayFields(trx: Trx, dayId: string, changes: DayChanges) {
  await trx
    .updateTable('shootDays')
    .set({
      dayDate: changes.date,
      address: changes.address,
      room: changes.room,
      opensAt: changes.opensAt,
      closesAt: changes.closesAt,
      breaks: JSON.stringify(changes.breaks),
      slotMinutes: changes.slotMinutes,
      bookingOpensAt: changes.bookingOpensAt,
      bookingClosesAt: changes.bookingClosesAt,
      changesCloseAt: changes.changesCloseAt,
    })
    .where('id', '=', dayId)
    .execute();
}

/** Locks the day's stations: a booking claimed meanwhile waits for the edit (its FK check). */
export async function lockStations(trx: Trx, dayId: string) {
  await trx.selectFrom('stations').select('id').where('dayId', '=', dayId).forUpdate().execute();
}

/** Stations that hold what the console recorded (check-ins, sittings, frames): never removed. */
export async function stationsWithHistory(
  db: Executor,
  stationIds: string[],
): Promise<Set<string>> {
  if (stationIds.length === 0) return new Set();
  const result = await sql<{ id: string }>`
    select id from stations where id = any(${stationIds}::uuid[]) and (
      exists (select 1 from check_ins where check_ins.station_id = stations.id)
      or exists (select 1 from sittings where sittings.station_id = stations.id)
      or exists (select 1 from frames where frames.station_id = stations.id))`.execute(db);
  return new Set(result.rows.map((row) => row.id));
}

/**
 * Writes the stations as edited and returns the id of each (new ones get theirs here).
 * Positions are parked out of the way first: the unique (day, position) holds at every step.
 */
export async function saveStations(
  trx: Trx,
  dayId: string,
  stations: Array<{ id?: string | undefined; name: string; photographerId: string | null }>,
): Promise<string[]> {
  await trx
    .updateTable('stations')
    .set((eb) => ({ position: eb('position', '+', 1000) }))
    .where('dayId', '=', dayId)
    .execute();
  const ids: string[] = [];
  for (const [index, station] of stations.entries()) {
    if (station.id) {
      await trx
        .updateTable('stations')
        .set({ name: station.name, photographerId: station.photographerId, position: index + 1 })
        .where('id', '=', station.id)
        .where('dayId', '=', dayId)
        .execute();
      ids.push(station.id);
    } else {
      const row = await trx
        .insertInto('stations')
        .values({
          dayId,
          position: index + 1,
          name: station.name,
          photographerId: station.photographerId,
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      ids.push(row.id);
    }
  }
  return ids;
}

/**
 * Removes stations the edit dropped. Their cancelled bookings are history the mail log and
 * calendar cancellations still need, so they move to a remaining station first (the cascade
 * would delete them otherwise); active ones were moved or cancelled by the caller.
 */
export async function removeStations(trx: Trx, dayId: string, removed: string[], keep: string) {
  if (removed.length === 0) return;
  await trx
    .updateTable('bookings')
    .set({ stationId: keep })
    .where('dayId', '=', dayId)
    .where('stationId', 'in', removed)
    .where('status', '=', 'cancelled')
    .execute();
  await trx.deleteFrom('stations').where('id', 'in', removed).where('dayId', '=', dayId).execute();
}

export async function rebookSeat(
  trx: Trx,
  bookingId: string,
  stationId: string,
  startsAt: Date,
  now: Date,
) {
  await trx
    .updateTable('bookings')
    .set((eb) => ({ stationId, startsAt, sequence: eb('sequence', '+', 1), updatedAt: now }))
    .where('id', '=', bookingId)
    .execute();
}

/** A booking keeps its seat but its invitation changes: the calendar needs a higher SEQUENCE. */
export async function raiseSequence(trx: Trx, bookingIds: string[], now: Date) {
  if (bookingIds.length === 0) return;
  await trx
    .updateTable('bookings')
    .set((eb) => ({ sequence: eb('sequence', '+', 1), updatedAt: now }))
    .where('id', 'in', bookingIds)
    .execute();
}

export async function markDayCancelled(trx: Trx, dayId: string) {
  await trx.updateTable('shootDays').set({ status: 'cancelled' }).where('id', '=', dayId).execute();
}

export async function notifyConsoles(trx: Trx, dayId: string) {
  await sql`select pg_notify('station_console', ${dayId})`.execute(trx);
}

export async function insertProposal(
  trx: Trx,
  values: { dayId: string; kind: 'edit' | 'cancel'; changes: DayChanges | null; note: string },
  userId: string,
): Promise<string> {
  const row = await trx
    .insertInto('dayChangeProposals')
    .values({
      dayId: values.dayId,
      kind: values.kind,
      changes: JSON.stringify(values.changes ?? {}),
      note: values.note,
      proposedByUserId: userId,
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

function proposalQuery(db: Executor) {
  return db
    .selectFrom('dayChangeProposals')
    .leftJoin('users', 'users.id', 'dayChangeProposals.proposedByUserId')
    .select([
      'dayChangeProposals.id',
      'dayChangeProposals.dayId',
      'dayChangeProposals.kind',
      'dayChangeProposals.changes',
      'dayChangeProposals.note',
      'dayChangeProposals.status',
      'users.displayName as proposedBy',
      'dayChangeProposals.createdAt',
      'dayChangeProposals.decidedAt',
    ]);
}

type ProposalRow = Awaited<ReturnType<ReturnType<typeof proposalQuery>['executeTakeFirstOrThrow']>>;
const toProposal = (row: ProposalRow): DayChangeProposal => ({
  ...row,
  changes: row.kind === 'edit' ? (row.changes as DayChanges) : null,
  createdAt: new Date(row.createdAt).toISOString(),
  decidedAt: row.decidedAt ? new Date(row.decidedAt).toISOString() : null,
});

export async function listProposals(db: Executor, dayId: string): Promise<DayChangeProposal[]> {
  const rows = await proposalQuery(db)
    .where('dayChangeProposals.dayId', '=', dayId)
    .orderBy('dayChangeProposals.createdAt', 'desc')
    .execute();
  return rows.map(toProposal);
}

/** Locks a waiting proposal of the day, so it is applied or declined once. */
export async function lockWaitingProposal(
  trx: Trx,
  dayId: string,
  id: string,
): Promise<DayChangeProposal | undefined> {
  const row = await proposalQuery(trx)
    .where('dayChangeProposals.id', '=', id)
    .where('dayChangeProposals.dayId', '=', dayId)
    .where('dayChangeProposals.status', '=', 'waiting')
    .forUpdate('dayChangeProposals')
    .executeTakeFirst();
  return row ? toProposal(row) : undefined;
}

export async function decideProposal(
  trx: Trx,
  id: string,
  status: 'applied' | 'declined',
  userId: string,
  now: Date,
) {
  await trx
    .updateTable('dayChangeProposals')
    .set({ status, decidedByUserId: userId, decidedAt: now })
    .where('id', '=', id)
    .execute();
}
