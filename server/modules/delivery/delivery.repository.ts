import { sql, type Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type { Database } from '../../db/types';
import type { DayRecord } from '../days/days.repository';
import { invitedPeopleQuery } from '../days/days.repository';

type Executor = Db | Transaction<Database>;

/** What a file name and the manifest say of the person (people joined with their office). */
const personColumns = [
  'people.employeeId',
  'people.email',
  'people.givenName',
  'people.familyName',
  'people.preferredName',
  'people.department',
  'offices.name as officeName',
] as const;

/** Every rendered rendition of a day's picks, with what a file name and the manifest need. */
export async function renderedSet(db: Executor, dayId: string, lookVersion: number) {
  return (
    db
      .selectFrom('portraitRenditions as rendition')
      .innerJoin('picks', 'picks.id', 'rendition.pickId')
      .innerJoin('people', 'people.id', 'picks.personId')
      .leftJoin('offices', 'offices.id', 'people.officeId')
      .innerJoin('frames', 'frames.id', 'picks.frameId')
      .innerJoin('stations', 'stations.id', 'frames.stationId')
      .where('picks.dayId', '=', dayId)
      .where('rendition.status', '=', 'rendered')
      .where('rendition.lookVersion', '=', lookVersion)
      // Rendered from what the pick is now: after a retouched final, the original's are stale.
      .where(sql<boolean>`rendition.source_key = coalesce(picks.final_key, frames.original_key)`)
      .select([
        'picks.id as pickId',
        'picks.personId',
        'picks.position',
        'rendition.renditionName',
        'rendition.key',
        'rendition.byteSize',
        'rendition.sha256',
        ...personColumns,
        'stations.name as stationName',
        sql<string | null>`to_char(frames.captured_local, 'YYYY-MM-DD"T"HH24:MI:SS')`.as(
          'capturedLocal',
        ),
      ])
      .orderBy('people.familyName')
      .orderBy('people.givenName')
      .orderBy('picks.position')
      .orderBy('rendition.renditionName')
      .execute()
  );
}

/**
 * The sitters with a pick lacking one of the look's renditions (rendered or refused) in this
 * look version from the pick's current source: a new final, or eyes still to be marked.
 */
export async function sittersNotRendered(
  db: Executor,
  dayId: string,
  lookVersion: number,
  renditionNames: readonly string[],
): Promise<string[]> {
  const result = await sql<{ name: string }>`
    select distinct people.family_name, people.given_name,
           people.given_name || ' ' || people.family_name as name
    from picks
    join people on people.id = picks.person_id
    join frames on frames.id = picks.frame_id
    where picks.day_id = ${dayId}::uuid
      and (select count(distinct r.rendition_name) from portrait_renditions r
           where r.pick_id = picks.id and r.look_version = ${lookVersion}
             and r.source_key = coalesce(picks.final_key, frames.original_key)
             and r.rendition_name = any(${renditionNames}::text[])) < ${renditionNames.length}
    order by people.family_name, people.given_name`.execute(db);
  return result.rows.map((row) => row.name);
}

export async function currentSet(db: Executor, dayId: string) {
  return db
    .selectFrom('deliveredRenditions as delivered')
    .innerJoin('people', 'people.id', 'delivered.personId')
    .leftJoin('offices', 'offices.id', 'people.officeId')
    .where('delivered.dayId', '=', dayId)
    .select([
      'delivered.id',
      'delivered.personId',
      'delivered.pickId',
      'delivered.renditionName',
      'delivered.fileName',
      'delivered.key',
      'delivered.byteSize',
      'delivered.sha256',
      'delivered.changed',
      ...personColumns,
    ])
    .orderBy('delivered.fileName')
    .execute();
}

export async function latestRelease(db: Executor, dayId: string) {
  return db
    .selectFrom('deliveries')
    .where('dayId', '=', dayId)
    .selectAll()
    .orderBy('release', 'desc')
    .limit(1)
    .executeTakeFirst();
}

export async function replaceSet(
  trx: Transaction<Database>,
  delivery: { id: string; dayId: string; release: number; userId: string; changed: number },
  rows: Array<{
    id: string;
    personId: string;
    pickId: string;
    renditionName: string;
    fileName: string;
    key: string;
    byteSize: string;
    sha256: string;
    changed: boolean;
  }>,
) {
  await trx
    .insertInto('deliveries')
    .values({
      id: delivery.id,
      dayId: delivery.dayId,
      release: delivery.release,
      releasedByUserId: delivery.userId,
      files: rows.length,
      changed: delivery.changed,
    })
    .execute();
  await trx.deleteFrom('deliveredRenditions').where('dayId', '=', delivery.dayId).execute();
  for (let start = 0; start < rows.length; start += 2000) {
    await trx
      .insertInto('deliveredRenditions')
      .values(
        rows
          .slice(start, start + 2000)
          .map((row) => ({ ...row, dayId: delivery.dayId, deliveryId: delivery.id })),
      )
      .execute();
  }
}

/** The day's invited people (and walk-ins photographed), for the list of who is missing. */
export async function expectedPeople(db: Executor, day: DayRecord) {
  const invited = await invitedPeopleQuery(db, day).execute();
  const photographed = await db
    .selectFrom('sittings')
    .innerJoin('people', 'people.id', 'sittings.personId')
    .where('sittings.dayId', '=', day.id)
    .where('sittings.undoneAt', 'is', null)
    .select('people.id')
    .distinct()
    .execute();
  const picks = await db
    .selectFrom('picks')
    .where('dayId', '=', day.id)
    .select(['id', 'personId'])
    .execute();
  const picksOf = new Map<string, string[]>();
  for (const pick of picks)
    picksOf.set(pick.personId, [...(picksOf.get(pick.personId) ?? []), pick.id]);
  return {
    invitedIds: invited.map((person) => person.id),
    photographed: new Set(photographed.map((row) => row.id)),
    picked: new Set(picksOf.keys()),
    /** Each person's picks now, to find who has only some of them in the set. */
    picksOf,
  };
}

export async function peopleByIds(db: Executor, ids: string[]) {
  if (ids.length === 0) return [];
  return db
    .selectFrom('people')
    .leftJoin('offices', 'offices.id', 'people.officeId')
    .where('people.id', 'in', ids)
    .select([
      'people.id',
      'people.employeeId',
      'people.email',
      'people.givenName',
      'people.familyName',
      'people.preferredName',
      'people.department',
      'offices.name as officeName',
    ])
    .orderBy('people.familyName')
    .execute();
}
