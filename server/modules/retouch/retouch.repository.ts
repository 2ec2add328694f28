import { sql, type Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type { RetouchStatus } from '../../db/proof-types';
import type { Database } from '../../db/types';
import type { RetouchQuery, RetouchRow, RetouchStatusName } from '../../schemas/proofs';
import { sitterName } from '../matching/matching.repository';

type Executor = Db | Transaction<Database>;

function queueBase(db: Executor, dayId: string, query: Pick<RetouchQuery, 'stationId' | 'q'>) {
  let base = db
    .selectFrom('picks')
    .innerJoin('frames', 'frames.id', 'picks.frameId')
    .innerJoin('stations', 'stations.id', 'frames.stationId')
    .innerJoin('people', 'people.id', 'picks.personId')
    .where('picks.dayId', '=', dayId);
  if (query.stationId) base = base.where('frames.stationId', '=', query.stationId);
  if (query.q) {
    const needle = `%${query.q.replace(/[\\%_]/g, (match) => `\\${match}`)}%`;
    base = base.where((eb) =>
      eb.or([
        eb(sitterName('people'), 'ilike', needle),
        eb('people.employeeId', 'ilike', needle),
        eb('frames.cardPath', 'ilike', needle),
      ]),
    );
  }
  return base;
}

const sortColumns = {
  sitter: sql`people.family_name`,
  station: sql`stations.position`,
  status: sql`picks.retouch_status`,
  picked: sql`picks.updated_at`,
} as const;

/** One page of a day's retouch queue, filtered and sorted in SQL (the table runs in manual mode). */
export async function retouchPage(
  db: Executor,
  dayId: string,
  viewerId: string,
  query: RetouchQuery,
): Promise<{ rows: RetouchRow[]; total: number }> {
  let filtered = queueBase(db, dayId, query);
  if (query.status) filtered = filtered.where('picks.retouchStatus', '=', query.status);
  const [rows, count] = await Promise.all([
    filtered
      .leftJoin('users as taker', 'taker.id', 'picks.retouchUserId')
      .select([
        'picks.id as pickId',
        'picks.personId',
        sitterName('people').as('sitterName'),
        'people.employeeId',
        'stations.name as stationName',
        'picks.frameId',
        'frames.cardPath',
        'picks.chosenBy',
        'picks.note',
        'picks.retouchStatus as status',
        'taker.displayName as takenBy',
        'picks.retouchUserId',
        'picks.finalKey',
        'picks.finalFileName',
        'picks.noteAtFinal',
        'picks.updatedAt',
        sql<boolean>`coalesce((select b.flash_sensitive from bookings b where b.day_id = picks.day_id and b.person_id = picks.person_id and b.status = 'active' limit 1), false)`.as(
          'flashSensitive',
        ),
        sql<boolean>`coalesce((select b.glasses from bookings b where b.day_id = picks.day_id and b.person_id = picks.person_id and b.status = 'active' limit 1), false)`.as(
          'glasses',
        ),
      ])
      .orderBy(sortColumns[query.sort], query.dir)
      .orderBy('people.familyName')
      .orderBy('picks.position')
      .orderBy('picks.id')
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize)
      .execute(),
    filtered.select((eb) => eb.fn.countAll<string>().as('total')).executeTakeFirstOrThrow(),
  ]);
  return {
    rows: rows.map((row) => ({
      pickId: row.pickId,
      personId: row.personId,
      sitterName: row.sitterName,
      employeeId: row.employeeId,
      stationName: row.stationName,
      frameId: row.frameId,
      fileName: row.cardPath.split('/').pop() ?? row.cardPath,
      chosenBy: row.chosenBy,
      note: row.note,
      flashSensitive: row.flashSensitive,
      glasses: row.glasses,
      status: row.status,
      takenBy: row.takenBy,
      takenByMe: row.retouchUserId === viewerId,
      hasFinal: row.finalKey !== null,
      finalFileName: row.finalFileName,
      // Null and '' are both "no note": only a real change of words counts.
      noteChangedSinceFinal: row.finalKey !== null && (row.note ?? '') !== (row.noteAtFinal ?? ''),
      noteAtFinal: row.finalKey !== null ? row.noteAtFinal : null,
      pickedAt: row.updatedAt.toISOString(),
    })),
    total: Number(count.total),
  };
}

export async function statusCounts(
  db: Executor,
  dayId: string,
  query: Pick<RetouchQuery, 'stationId' | 'q'>,
) {
  const rows = await queueBase(db, dayId, query)
    .groupBy('picks.retouchStatus')
    .select(['picks.retouchStatus as status', (eb) => eb.fn.countAll<string>().as('count')])
    .execute();
  const counts: Record<RetouchStatusName, number> = { to_do: 0, in_progress: 0, done: 0 };
  for (const row of rows) counts[row.status] = Number(row.count);
  return counts;
}

export async function findPick(db: Executor, pickId: string) {
  return db
    .selectFrom('picks')
    .innerJoin('frames', 'frames.id', 'picks.frameId')
    .where('picks.id', '=', pickId)
    .select([
      'picks.id',
      'picks.dayId',
      'picks.personId',
      'picks.frameId',
      'picks.retouchStatus',
      'picks.retouchUserId',
      'picks.finalKey',
      'picks.finalFileName',
      'frames.cardPath',
      'frames.originalKey',
      'frames.format',
    ])
    .executeTakeFirst();
}

/** Who has taken the pick (with their name), the pick's row locked until the transaction ends. */
export async function pickHolderForUpdate(db: Executor, pickId: string) {
  return db
    .selectFrom('picks')
    .leftJoin('users', 'users.id', 'picks.retouchUserId')
    .select(['picks.retouchUserId', 'users.displayName'])
    .where('picks.id', '=', pickId)
    .forUpdate('picks')
    .executeTakeFirst();
}

export async function updatePick(
  db: Executor,
  pickId: string,
  change: { retouchStatus?: RetouchStatus; retouchUserId?: string | null },
) {
  await db
    .updateTable('picks')
    .set({ ...change, updatedAt: sql`now()` })
    .where('id', '=', pickId)
    .execute();
}

export async function saveFinal(
  db: Executor,
  pickId: string,
  final: { key: string; fileName: string; byteSize: number; userId: string | null },
) {
  await db
    .updateTable('picks')
    .set({
      finalKey: final.key,
      finalFileName: final.fileName,
      finalByteSize: String(final.byteSize),
      finalUploadedAt: sql`now()`,
      finalUploadedByUserId: final.userId,
      // The final answers the note as it stands now: a later change of it is shown.
      noteAtFinal: sql`note`,
      retouchStatus: 'done',
      updatedAt: sql`now()`,
    })
    .where('id', '=', pickId)
    .execute();
}

/** Every pick of a day with its original, for the archive. */
export async function picksWithOriginals(db: Executor, dayId: string) {
  return db
    .selectFrom('picks')
    .innerJoin('frames', 'frames.id', 'picks.frameId')
    .innerJoin('people', 'people.id', 'picks.personId')
    .where('picks.dayId', '=', dayId)
    .select([
      'picks.id',
      'frames.cardPath',
      'frames.originalKey',
      'people.familyName',
      'people.givenName',
      'people.employeeId',
    ])
    .orderBy('people.familyName')
    .orderBy('picks.position')
    .execute();
}
