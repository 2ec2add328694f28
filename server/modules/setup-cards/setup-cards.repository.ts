import { sql } from 'kysely';
import type { Db } from '../../db/database';
import { staffedBy } from '../../db/day-scope';
import type { SetupCard } from '../../schemas/setup-card';

export async function listStationCards(db: Db, dayId: string) {
  const rows = await db
    .selectFrom('stations')
    .leftJoin('users', 'users.id', 'stations.photographerId')
    .leftJoin('setupCards', 'setupCards.stationId', 'stations.id')
    .select([
      'stations.id as stationId',
      'stations.name as stationName',
      'stations.position',
      'users.displayName as photographerName',
      'setupCards.card',
      'setupCards.updatedAt',
    ])
    .where('stations.dayId', '=', dayId)
    .orderBy('stations.position')
    .execute();
  return rows.map((row) => ({
    ...row,
    card: (row.card ?? null) as SetupCard | null,
    updatedAt: row.updatedAt ? new Date(row.updatedAt).toISOString() : null,
  }));
}

export async function findStation(db: Db, stationId: string) {
  return db
    .selectFrom('stations')
    .leftJoin('setupCards', 'setupCards.stationId', 'stations.id')
    .select(['stations.id', 'stations.dayId', 'setupCards.card'])
    .where('stations.id', '=', stationId)
    .executeTakeFirst();
}

export async function upsertCard(
  db: Db,
  stationId: string,
  card: SetupCard,
  userId: string,
): Promise<void> {
  const json = JSON.stringify(card);
  await db
    .insertInto('setupCards')
    .values({ stationId, card: json, updatedByUserId: userId })
    .onConflict((conflict) =>
      conflict
        .column('stationId')
        .doUpdateSet({ card: json, updatedByUserId: userId, updatedAt: sql`now()` }),
    )
    .execute();
}

/** Stations that have a card, for the "copy from" list; photographers see their own days only. */
export async function listCardSources(db: Db, onlyPhotographerId: string | null) {
  let query = db
    .selectFrom('setupCards')
    .innerJoin('stations', 'stations.id', 'setupCards.stationId')
    .innerJoin('shootDays', 'shootDays.id', 'stations.dayId')
    .innerJoin('clients', 'clients.id', 'shootDays.clientId')
    .innerJoin('offices', 'offices.id', 'shootDays.officeId')
    .select([
      'stations.id as stationId',
      'stations.name as stationName',
      sql<string>`to_char(shoot_days.day_date, 'YYYY-MM-DD')`.as('dayDate'),
      'clients.name as clientName',
      'offices.name as officeName',
    ])
    .orderBy('shootDays.dayDate', 'desc')
    .orderBy('stations.position')
    .limit(200);
  if (onlyPhotographerId) query = query.where(staffedBy(onlyPhotographerId));
  const rows = await query.execute();
  return rows.map((row) => ({
    stationId: row.stationId,
    label: `${row.dayDate} · ${row.clientName}, ${row.officeName} · ${row.stationName}`,
  }));
}
