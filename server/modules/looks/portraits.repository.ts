import { sql, type Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type { EyeStatus } from '../../db/look-types';
import type { Database } from '../../db/types';
import { sitterName } from '../matching/matching.repository';

type Executor = Db | Transaction<Database>;

/** A pick with the image it is delivered from: its final when there is one, else the original. */
export async function pickSource(db: Executor, pickId: string) {
  return db
    .selectFrom('picks')
    .innerJoin('frames', 'frames.id', 'picks.frameId')
    .innerJoin('shootDays', 'shootDays.id', 'picks.dayId')
    .where('picks.id', '=', pickId)
    .select([
      'picks.id',
      'picks.dayId',
      'picks.personId',
      'shootDays.clientId',
      sql<string>`coalesce(picks.final_key, frames.original_key)`.as('sourceKey'),
    ])
    .executeTakeFirst();
}

export async function eyesOf(db: Executor, pickId: string) {
  return db.selectFrom('portraitEyes').where('pickId', '=', pickId).selectAll().executeTakeFirst();
}

export async function saveEyes(
  db: Executor,
  eyes: {
    pickId: string;
    sourceKey: string;
    status: EyeStatus;
    left: { x: number; y: number } | null;
    right: { x: number; y: number } | null;
    rollDeg: number | null;
    confidence: number;
    imageWidth: number;
    imageHeight: number;
    markedByUserId: string | null;
  },
) {
  const values = {
    sourceKey: eyes.sourceKey,
    status: eyes.status,
    leftX: eyes.left?.x ?? null,
    leftY: eyes.left?.y ?? null,
    rightX: eyes.right?.x ?? null,
    rightY: eyes.right?.y ?? null,
    rollDeg: eyes.rollDeg,
    confidence: eyes.confidence,
    imageWidth: eyes.imageWidth,
    imageHeight: eyes.imageHeight,
    markedByUserId: eyes.markedByUserId,
  };
  await db
    .insertInto('portraitEyes')
    .values({ pickId: eyes.pickId, ...values })
    .onConflict((conflict) =>
      conflict.column('pickId').doUpdateSet({ ...values, updatedAt: sql`now()` }),
    )
    .execute();
}

export async function saveRendition(
  db: Executor,
  row: {
    pickId: string;
    renditionName: string;
    status: 'rendered' | 'refused';
    refusal: string | null;
    key: string | null;
    byteSize: number | null;
    sha256: string | null;
    width: number | null;
    height: number | null;
    sourceKey: string;
    lookVersion: number;
  },
) {
  const { pickId: _pick, renditionName: _name, ...rest } = row;
  await db
    .insertInto('portraitRenditions')
    .values(row)
    .onConflict((conflict) =>
      conflict
        .columns(['pickId', 'renditionName'])
        .doUpdateSet({ ...rest, renderedAt: sql`now()` }),
    )
    .execute();
}

/** A day's picks with their eyes and renditions, for the set's review grid. */
export async function daySet(db: Executor, dayId: string) {
  const picks = await db
    .selectFrom('picks')
    .innerJoin('people', 'people.id', 'picks.personId')
    .innerJoin('frames', 'frames.id', 'picks.frameId')
    .leftJoin('portraitEyes as eyes', 'eyes.pickId', 'picks.id')
    .where('picks.dayId', '=', dayId)
    .select([
      'picks.id as pickId',
      'picks.personId',
      sitterName('people').as('name'),
      'people.employeeId',
      'frames.cardPath',
      sql<boolean>`picks.final_key is not null`.as('hasFinal'),
      'eyes.status as eyeStatus',
      'eyes.leftX',
      'eyes.leftY',
      'eyes.rightX',
      'eyes.rightY',
      'eyes.imageWidth',
      'eyes.imageHeight',
      'eyes.sourceKey as eyesSourceKey',
      sql<string>`coalesce(picks.final_key, frames.original_key)`.as('sourceKey'),
    ])
    .orderBy('people.familyName')
    .orderBy('picks.position')
    .execute();
  const renditions = await db
    .selectFrom('portraitRenditions')
    .innerJoin('picks', 'picks.id', 'portraitRenditions.pickId')
    .where('picks.dayId', '=', dayId)
    .select([
      'portraitRenditions.pickId',
      'portraitRenditions.renditionName',
      'portraitRenditions.status',
      'portraitRenditions.refusal',
      'portraitRenditions.lookVersion',
      'portraitRenditions.sourceKey',
      'portraitRenditions.width',
      'portraitRenditions.height',
    ])
    .execute();
  return { picks, renditions };
}

export async function picksOfDay(db: Executor, dayId: string) {
  const rows = await db.selectFrom('picks').where('dayId', '=', dayId).select('id').execute();
  return rows.map((row) => row.id);
}

export async function renditionFile(db: Executor, pickId: string, renditionName: string) {
  return db
    .selectFrom('portraitRenditions')
    .innerJoin('picks', 'picks.id', 'portraitRenditions.pickId')
    .where('portraitRenditions.pickId', '=', pickId)
    .where('portraitRenditions.renditionName', '=', renditionName)
    .select(['portraitRenditions.key', 'portraitRenditions.byteSize', 'picks.dayId'])
    .executeTakeFirst();
}
