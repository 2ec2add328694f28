import { sql, type Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type { DecisionAction } from '../../db/match-types';
import type { Database } from '../../db/types';
import { activeDecisionsQuery, sitterName } from './matching.repository';

type Executor = Db | Transaction<Database>;

export interface EffectiveFrameRow {
  id: string;
  stationId: string;
  cardPath: string;
  dcfFolder: number | null;
  dcfNumber: number | null;
  capturedLocal: string | null;
  cameraSerial: string | null;
  hasThumbnail: boolean;
  decisionAction: DecisionAction | null;
  decidedPersonId: string | null;
  decidedSittingId: string | null;
  autoPersonId: string | null;
  autoSittingId: string | null;
  autoReason: string | null;
  candidates: string[] | null;
}

/**
 * Every frame of the day (a raw file's JPEG stands for both) in shooting order per station,
 * with what the evidence said and the decision standing over it, if any.
 */
export async function effectiveFrames(db: Executor, dayId: string): Promise<EffectiveFrameRow[]> {
  return db
    .selectFrom('frames')
    .innerJoin('stations', 'stations.id', 'frames.stationId')
    .leftJoin('frameMatches as auto', 'auto.frameId', 'frames.id')
    .leftJoin(activeDecisionsQuery(db, dayId).as('decision'), 'decision.frameId', 'frames.id')
    .where('frames.dayId', '=', dayId)
    .where('frames.pairedWithFrameId', 'is', null)
    .select([
      'frames.id',
      'frames.stationId',
      'frames.cardPath',
      'frames.dcfFolder',
      'frames.dcfNumber',
      sql<string | null>`to_char(frames.captured_local, 'YYYY-MM-DD"T"HH24:MI:SS.MS')`.as(
        'capturedLocal',
      ),
      'frames.cameraSerial',
      sql<boolean>`frames.thumbnail_key is not null`.as('hasThumbnail'),
      'decision.action as decisionAction',
      'decision.personId as decidedPersonId',
      'decision.sittingId as decidedSittingId',
      'auto.personId as autoPersonId',
      'auto.sittingId as autoSittingId',
      'auto.reason as autoReason',
      'auto.candidates',
    ])
    .orderBy('stations.position')
    .orderBy('frames.capturedLocal', (order) => order.asc().nullsLast())
    .orderBy('frames.dcfFolder')
    .orderBy('frames.dcfNumber')
    .orderBy('frames.cardPath')
    .execute();
}

/** The day's sittings (undone ones left out) with their sitters, in shooting order. */
export async function daySittings(db: Executor, dayId: string) {
  return db
    .selectFrom('sittings')
    .innerJoin('people', 'people.id', 'sittings.personId')
    .where('sittings.dayId', '=', dayId)
    .where('sittings.undoneAt', 'is', null)
    .select([
      'sittings.id',
      'sittings.personId',
      'sittings.stationId',
      'sittings.startedAt',
      'sittings.firstFrame',
      'sittings.lastFrame',
      sitterName('people').as('name'),
      'people.employeeId',
    ])
    .orderBy('sittings.startedAt')
    .execute();
}

/** Booked for the day and never photographed. */
export async function bookedNotPhotographed(db: Executor, dayId: string) {
  return db
    .selectFrom('bookings')
    .innerJoin('people', 'people.id', 'bookings.personId')
    .where('bookings.dayId', '=', dayId)
    .where('bookings.status', '=', 'active')
    .where(({ not, exists, selectFrom }) =>
      not(
        exists(
          selectFrom('sittings')
            .select('sittings.id')
            .whereRef('sittings.personId', '=', 'bookings.personId')
            .where('sittings.dayId', '=', dayId)
            .where('sittings.undoneAt', 'is', null),
        ),
      ),
    )
    .select(['people.id as personId', sitterName('people').as('name'), 'people.employeeId'])
    .orderBy('bookings.startsAt')
    .execute();
}

export async function peopleByIds(db: Executor, ids: string[]) {
  if (ids.length === 0) return [];
  return db
    .selectFrom('people')
    .where('id', 'in', ids)
    .select(['id', 'clientId', sitterName('people').as('name'), 'employeeId'])
    .execute();
}

export async function framesOfDay(db: Executor, dayId: string, frameIds: string[]) {
  const rows = await db
    .selectFrom('frames')
    .where('dayId', '=', dayId)
    .where('id', 'in', frameIds)
    .where('pairedWithFrameId', 'is', null)
    .select('id')
    .execute();
  return new Set(rows.map((row) => row.id));
}

export async function insertDecisions(
  trx: Executor,
  rows: Array<{
    id: string;
    dayId: string;
    changeId: string;
    frameId: string;
    action: DecisionAction;
    personId: string | null;
    sittingId: string | null;
    decidedByUserId: string;
  }>,
) {
  for (let start = 0; start < rows.length; start += 5000) {
    await trx
      .insertInto('matchDecisions')
      .values(rows.slice(start, start + 5000))
      .execute();
  }
}

/**
 * Each frame's latest decision not taken back: a change that repeats them all (a second click)
 * is not recorded twice.
 */
export async function standingDecisions(db: Executor, dayId: string, frameIds: string[]) {
  const result = await sql<{
    frameId: string;
    changeId: string;
    action: DecisionAction;
    personId: string | null;
    sittingId: string | null;
  }>`
    select distinct on (frame_id) frame_id as "frameId", change_id as "changeId", action,
           person_id as "personId", sitting_id as "sittingId"
    from match_decisions
    where day_id = ${dayId}::uuid and frame_id = any(${frameIds}::uuid[]) and undone_at is null
    order by frame_id, decided_at desc, id`.execute(db);
  return new Map(result.rows.map((row) => [row.frameId, row]));
}

/** The latest change not yet taken back, of the day or of one person on it. */
export async function latestChange(db: Executor, dayId: string, userId?: string) {
  let query = db
    .selectFrom('matchDecisions')
    .where('dayId', '=', dayId)
    .where('undoneAt', 'is', null);
  if (userId) query = query.where('decidedByUserId', '=', userId);
  return query
    .groupBy(['changeId', 'action'])
    .select([
      'changeId',
      'action',
      (eb) => eb.fn.countAll<string>().as('frames'),
      (eb) => eb.fn.max('decidedAt').as('at'),
    ])
    .orderBy('at', 'desc')
    .limit(1)
    .executeTakeFirst();
}

export async function undoChange(trx: Executor, dayId: string, changeId: string) {
  const result = await trx
    .updateTable('matchDecisions')
    .set({ undoneAt: sql`now()` })
    .where('dayId', '=', dayId)
    .where('changeId', '=', changeId)
    .where('undoneAt', 'is', null)
    .executeTakeFirst();
  return Number(result.numUpdatedRows);
}

export async function cardNames(db: Executor, frameIds: string[]) {
  if (frameIds.length === 0) return new Map<string, string>();
  const rows = await db
    .selectFrom('frames')
    .where('id', 'in', frameIds)
    .select(['id', 'cardPath'])
    .execute();
  return new Map(rows.map((row) => [row.id, row.cardPath]));
}
