import { sql, type Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type { MatchCause, MatchChange } from '../../db/match-types';
import type { Database } from '../../db/types';
import type { ManualDecision, MatchFrame, MatchSitting } from './match-frames';

type Executor = Db | Transaction<Database>;

/** The frame a raw file shares with its JPEG: the JPEG's id is the one matched. */
export const matchedFrameKey = sql<string>`coalesce(frames.paired_with_frame_id, frames.id)`;

/**
 * The person a frame belongs to now: a standing decision, else what the matcher found. Needs
 * the frame_matches row joined as `auto` and the active decision as `decision`.
 */
export const effectivePersonId = sql<string>`case
  when decision.action = 'test_frame' then null
  when decision.action is not null then decision.person_id
  else auto.person_id end`;

export const sitterName = (table: string) =>
  sql<string>`coalesce(${sql.ref(`${table}.preferred_name`)}, ${sql.ref(`${table}.given_name`)}) || ' ' || ${sql.ref(`${table}.family_name`)}`;

/** The camera's unzoned wall clock ('YYYY-MM-DD HH:MM:SS.fff') read as if it were UTC. */
export function wallClockMs(capturedLocal: string | null): number | null {
  if (capturedLocal === null) return null;
  const ms = Date.parse(`${capturedLocal.replace(' ', 'T')}Z`);
  return Number.isNaN(ms) ? null : ms;
}

/** Frames that are read (or could not be read), one per shot: a raw file's JPEG stands for it. */
export async function framesToMatch(db: Executor, dayId: string): Promise<MatchFrame[]> {
  const rows = await db
    .selectFrom('frames')
    .where('dayId', '=', dayId)
    .where('pairedWithFrameId', 'is', null)
    .where('ingestStatus', 'in', ['read', 'failed'])
    .select([
      'id',
      'stationId',
      'cameraSerial',
      'dcfFolder',
      'dcfNumber',
      'capturedLocal',
      'slateToken',
    ])
    .execute();
  return rows.map((row) => ({
    id: row.id,
    stationId: row.stationId,
    cameraSerial: row.cameraSerial,
    folder: row.dcfFolder,
    number: row.dcfNumber,
    capturedAt: wallClockMs(row.capturedLocal),
    slateToken: row.slateToken,
  }));
}

export async function sittingsToMatch(db: Executor, dayId: string): Promise<MatchSitting[]> {
  const rows = await db
    .selectFrom('sittings')
    .where('dayId', '=', dayId)
    .where('undoneAt', 'is', null)
    .select([
      'id',
      'personId',
      'stationId',
      'slateToken',
      'firstFrame',
      'lastFrame',
      'startedAt',
      'finishedAt',
    ])
    .execute();
  return rows.map((row) => ({
    ...row,
    startedAt: row.startedAt.getTime(),
    finishedAt: row.finishedAt?.getTime() ?? null,
  }));
}

/** Each frame's standing decision: the latest one not taken back. */
export function activeDecisionsQuery(db: Executor, dayId: string) {
  return db
    .selectFrom('matchDecisions')
    .where('dayId', '=', dayId)
    .where('undoneAt', 'is', null)
    .distinctOn('frameId')
    .select(['frameId', 'personId', 'sittingId', 'action', 'changeId'])
    .orderBy('frameId')
    .orderBy('decidedAt', 'desc')
    .orderBy('id', 'desc');
}

export async function activeDecisions(db: Executor, dayId: string): Promise<ManualDecision[]> {
  const rows = await activeDecisionsQuery(db, dayId).execute();
  return rows.map(({ frameId, personId, sittingId }) => ({ frameId, personId, sittingId }));
}

export async function previousMatches(db: Executor, dayId: string) {
  const rows = await db
    .selectFrom('frameMatches')
    .where('dayId', '=', dayId)
    .select(['frameId', 'personId', 'reason'])
    .execute();
  return new Map(rows.map((row) => [row.frameId, row]));
}

/** One run at a time per day: a second run waits for the first to commit. */
export async function lockDayForMatching(trx: Transaction<Database>, dayId: string) {
  await sql`select pg_advisory_xact_lock(hashtextextended(${`match:${dayId}`}, 0))`.execute(trx);
}

export interface AutomaticMatch {
  frameId: string;
  sittingId: string | null;
  personId: string | null;
  reason: MatchChange['toReason'];
  confidence: number;
  candidates: string[];
}

export async function replaceMatches(
  trx: Transaction<Database>,
  run: {
    id: string;
    dayId: string;
    cause: MatchCause;
    requestedByUserId: string | null;
    counts: { frames: number; matched: number; conflicts: number; leftovers: number };
    changed: number;
    changes: MatchChange[];
    cameraOffsets: Record<string, number>;
    typedFrameMismatches: Array<{ sittingId: string; typed: number; slateFrame: number }>;
  },
  matches: AutomaticMatch[],
) {
  await trx
    .insertInto('matchRuns')
    .values({
      id: run.id,
      dayId: run.dayId,
      cause: run.cause,
      requestedByUserId: run.requestedByUserId,
      ...run.counts,
      changed: run.changed,
      changes: JSON.stringify(run.changes),
      cameraOffsets: JSON.stringify(run.cameraOffsets),
      typedFrameMismatches: JSON.stringify(run.typedFrameMismatches),
    })
    .execute();
  await trx.deleteFrom('frameMatches').where('dayId', '=', run.dayId).execute();
  // 7 parameters a row: 5,000 rows stay well under PostgreSQL's 65,535 parameters.
  for (let start = 0; start < matches.length; start += 5000) {
    await trx
      .insertInto('frameMatches')
      .values(
        matches.slice(start, start + 5000).map((match) => ({
          ...match,
          dayId: run.dayId,
          runId: run.id,
        })),
      )
      .execute();
  }
}

export async function latestRun(db: Executor, dayId: string) {
  return db
    .selectFrom('matchRuns')
    .where('dayId', '=', dayId)
    .selectAll()
    .orderBy('finishedAt', 'desc')
    .limit(1)
    .executeTakeFirst();
}

/** Whether a match of the day waits in the queue or is running now. */
export async function matchQueued(db: Executor, dayId: string): Promise<boolean> {
  const result = await sql<{ queued: boolean }>`
    select exists (select 1 from graphile_worker.jobs where key = ${`match:${dayId}`} and attempts < max_attempts) as queued`.execute(
    db,
  );
  return result.rows[0]?.queued ?? false;
}
