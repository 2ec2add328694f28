import { sql, type Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type { PickChooser } from '../../db/proof-types';
import type { Database } from '../../db/types';
import {
  activeDecisionsQuery,
  effectivePersonId,
  sitterName,
} from '../matching/matching.repository';

type Executor = Db | Transaction<Database>;

export interface ProofSettings {
  picksIncluded: number;
  extraPicksAllowed: number;
  extraPickPriceCents: number;
  hrMayChoose: boolean;
}

export const defaultProofSettings: ProofSettings = {
  picksIncluded: 1,
  extraPicksAllowed: 0,
  extraPickPriceCents: 0,
  hrMayChoose: false,
};

export async function proofSettings(db: Executor, clientId: string): Promise<ProofSettings> {
  const row = await db
    .selectFrom('clientProofSettings')
    .where('clientId', '=', clientId)
    .select(['picksIncluded', 'extraPicksAllowed', 'extraPickPriceCents', 'hrMayChoose'])
    .executeTakeFirst();
  return row ?? defaultProofSettings;
}

export async function saveProofSettings(db: Executor, clientId: string, settings: ProofSettings) {
  await db
    .insertInto('clientProofSettings')
    .values({ clientId, ...settings })
    .onConflict((conflict) =>
      conflict.column('clientId').doUpdateSet({ ...settings, updatedAt: sql`now()` }),
    )
    .execute();
}

export async function dayProofs(db: Executor, dayId: string) {
  return db.selectFrom('dayProofs').where('dayId', '=', dayId).selectAll().executeTakeFirst();
}

/**
 * A day's frames with the person each belongs to now, as proofs: one per shot (a raw file's
 * JPEG stands for it), with a preview, and never a slate.
 */
export function proofFramesQuery(db: Executor, dayId: string) {
  return db
    .selectFrom('frames')
    .leftJoin('frameMatches as auto', 'auto.frameId', 'frames.id')
    .leftJoin(activeDecisionsQuery(db, dayId).as('decision'), 'decision.frameId', 'frames.id')
    .where('frames.dayId', '=', dayId)
    .where('frames.pairedWithFrameId', 'is', null)
    .where('frames.slateToken', 'is', null)
    .where('frames.previewKey', 'is not', null);
}

/** The people who have proofs on a day, with how many frames each. */
export async function peopleWithProofs(db: Executor, dayId: string) {
  const rows = await db
    .selectFrom(proofFramesQuery(db, dayId).select(effectivePersonId.as('personId')).as('proof'))
    .innerJoin('people', 'people.id', 'proof.personId')
    .where('people.active', '=', true)
    .groupBy(['people.id', 'people.email', 'people.givenName', 'people.preferredName'])
    .select([
      'people.id',
      'people.email',
      sql<string>`coalesce(people.preferred_name, people.given_name)`.as('firstName'),
      (eb) => eb.fn.countAll<string>().as('frames'),
    ])
    .execute();
  return rows.map((row) => ({ ...row, frames: Number(row.frames) }));
}

export async function proofFramesOf(db: Executor, dayId: string, personId: string) {
  return proofFramesQuery(db, dayId)
    .where(effectivePersonId, '=', personId)
    .select([
      'frames.id',
      'frames.cardPath',
      'frames.dcfNumber',
      'frames.pixelWidth',
      'frames.pixelHeight',
      'frames.previewKey',
      sql<string | null>`to_char(frames.captured_local, 'YYYY-MM-DD"T"HH24:MI:SS.MS')`.as(
        'capturedLocal',
      ),
    ])
    .orderBy('frames.capturedLocal', (order) => order.asc().nullsLast())
    .orderBy('frames.dcfFolder')
    .orderBy('frames.dcfNumber')
    .execute();
}

export async function picksOf(db: Executor, dayId: string, personId: string) {
  return db
    .selectFrom('picks')
    .where('dayId', '=', dayId)
    .where('personId', '=', personId)
    .select(['id', 'frameId', 'note', 'chosenBy', 'position', 'retouchStatus', 'finalKey'])
    .orderBy('position')
    .execute();
}

/** Replaces a person's picks in one go; a pick kept keeps its retouch state and final. */
export async function replacePicks(
  trx: Transaction<Database>,
  input: {
    dayId: string;
    personId: string;
    chosenBy: PickChooser;
    chosenByUserId: string | null;
    picks: Array<{ id: string; frameId: string; note: string | null }>;
  },
) {
  const keep = input.picks.map((pick) => pick.frameId);
  // The finals of picks let go are set aside: choosing the same frame again brings them back.
  await sql`
    insert into set_aside_finals (day_id, person_id, frame_id, final_key, final_file_name,
      final_byte_size, final_uploaded_at, final_uploaded_by_user_id, retouch_user_id,
      note_at_final)
    select day_id, person_id, frame_id, final_key, final_file_name, final_byte_size,
           final_uploaded_at, final_uploaded_by_user_id, retouch_user_id, note_at_final
    from picks
    where day_id = ${input.dayId}::uuid and person_id = ${input.personId}::uuid
      and final_key is not null and not (frame_id = any(${keep}::uuid[]))
    on conflict (day_id, person_id, frame_id) do update set
      final_key = excluded.final_key, final_file_name = excluded.final_file_name,
      final_byte_size = excluded.final_byte_size, final_uploaded_at = excluded.final_uploaded_at,
      final_uploaded_by_user_id = excluded.final_uploaded_by_user_id,
      retouch_user_id = excluded.retouch_user_id, note_at_final = excluded.note_at_final,
      set_aside_at = now()`.execute(trx);
  let removal = trx
    .deleteFrom('picks')
    .where('dayId', '=', input.dayId)
    .where('personId', '=', input.personId);
  if (keep.length > 0) removal = removal.where('frameId', 'not in', keep);
  await removal.execute();
  for (const [index, pick] of input.picks.entries()) {
    await trx
      .insertInto('picks')
      .values({
        id: pick.id,
        dayId: input.dayId,
        personId: input.personId,
        frameId: pick.frameId,
        chosenBy: input.chosenBy,
        chosenByUserId: input.chosenByUserId,
        note: pick.note,
        position: index + 1,
      })
      .onConflict((conflict) =>
        conflict.columns(['dayId', 'personId', 'frameId']).doUpdateSet({
          note: pick.note,
          position: index + 1,
          chosenBy: input.chosenBy,
          chosenByUserId: input.chosenByUserId,
          updatedAt: sql`now()`,
        }),
      )
      .execute();
  }
  await sql`
    with restored as (
      delete from set_aside_finals s
      using picks p
      where s.day_id = p.day_id and s.person_id = p.person_id and s.frame_id = p.frame_id
        and p.day_id = ${input.dayId}::uuid and p.person_id = ${input.personId}::uuid
        and p.final_key is null
      returning s.*
    )
    update picks p set
      final_key = r.final_key, final_file_name = r.final_file_name,
      final_byte_size = r.final_byte_size, final_uploaded_at = r.final_uploaded_at,
      final_uploaded_by_user_id = r.final_uploaded_by_user_id,
      retouch_user_id = r.retouch_user_id, note_at_final = r.note_at_final,
      retouch_status = 'done', updated_at = now()
    from restored r
    where p.day_id = r.day_id and p.person_id = r.person_id and p.frame_id = r.frame_id`.execute(
    trx,
  );
}

/** How many of the people with proofs have picked, per day. */
export async function pickedPersonIds(db: Executor, dayId: string) {
  const rows = await db
    .selectFrom('picks')
    .where('dayId', '=', dayId)
    .where('chosenBy', 'in', ['sitter', 'coordinator'])
    .select('personId')
    .distinct()
    .execute();
  return new Set(rows.map((row) => row.personId));
}

export async function releasedDaysOf(db: Executor, personId: string) {
  return db
    .selectFrom('dayProofs')
    .innerJoin('shootDays', 'shootDays.id', 'dayProofs.dayId')
    .innerJoin('clients', 'clients.id', 'shootDays.clientId')
    .innerJoin('people', 'people.clientId', 'shootDays.clientId')
    .where('people.id', '=', personId)
    .select([
      'dayProofs.dayId',
      sql<string>`to_char(shoot_days.day_date, 'YYYY-MM-DD')`.as('date'),
      'clients.name as clientName',
      'dayProofs.picksCloseAt',
    ])
    .orderBy('shootDays.dayDate', 'desc')
    .execute();
}

export async function studioPicks(db: Executor, dayId: string) {
  return db
    .selectFrom('studioPicks')
    .innerJoin('people', 'people.id', 'studioPicks.personId')
    .where('studioPicks.dayId', '=', dayId)
    .select(['studioPicks.personId', 'studioPicks.frameId', sitterName('people').as('name')])
    .execute();
}

export async function saveStudioPick(
  db: Executor,
  pick: { dayId: string; personId: string; frameId: string; chosenByUserId: string },
) {
  await db
    .insertInto('studioPicks')
    .values(pick)
    .onConflict((conflict) =>
      conflict.columns(['dayId', 'personId']).doUpdateSet({
        frameId: pick.frameId,
        chosenByUserId: pick.chosenByUserId,
        chosenAt: sql`now()`,
      }),
    )
    .execute();
}
