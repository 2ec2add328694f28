import { sql } from 'kysely';
import type { Db } from '../../db/database';
import type { Client } from '../../schemas/clients';

export async function findClientName(db: Db, id: string): Promise<string | undefined> {
  const row = await db.selectFrom('clients').select('name').where('id', '=', id).executeTakeFirst();
  return row?.name;
}

export async function listClients(db: Db, onlyId: string | null): Promise<Client[]> {
  let query = db
    .selectFrom('clients')
    .select((eb) => [
      'clients.id',
      'clients.name',
      'clients.slug',
      'clients.createdAt',
      eb
        .selectFrom('people')
        .select(eb.fn.countAll<string>().as('n'))
        .whereRef('people.clientId', '=', 'clients.id')
        .where('people.active', '=', true)
        .as('activePeople'),
      eb
        .selectFrom('users')
        .select(eb.fn.countAll<string>().as('n'))
        .whereRef('users.clientId', '=', 'clients.id')
        .where('users.active', '=', true)
        .as('coordinators'),
    ])
    .orderBy('clients.name');
  if (onlyId) query = query.where('clients.id', '=', onlyId);
  const rows = await query.execute();
  if (rows.length === 0) return [];

  const offices = await db
    .selectFrom('offices')
    .leftJoin('people', (join) =>
      join.onRef('people.officeId', '=', 'offices.id').on('people.active', '=', true),
    )
    .select((eb) => [
      'offices.id',
      'offices.clientId',
      'offices.name',
      'offices.timeZone',
      eb.fn.count<string>('people.id').as('activePeople'),
    ])
    .where(
      'offices.clientId',
      'in',
      rows.map((row) => row.id),
    )
    .groupBy('offices.id')
    .orderBy('offices.name')
    .execute();

  return rows.map((row) => ({
    id: row.id,
    name: row.name,
    slug: row.slug,
    createdAt: new Date(row.createdAt).toISOString(),
    activePeople: Number(row.activePeople ?? 0),
    coordinators: Number(row.coordinators ?? 0),
    offices: offices
      .filter((office) => office.clientId === row.id)
      .map((office) => ({
        id: office.id,
        name: office.name,
        timeZone: office.timeZone,
        activePeople: Number(office.activePeople),
      })),
  }));
}

export async function slugExists(db: Db, slug: string): Promise<boolean> {
  const row = await db
    .selectFrom('clients')
    .select('id')
    .where('slug', '=', slug)
    .executeTakeFirst();
  return row !== undefined;
}

export async function nameExists(db: Db, name: string): Promise<boolean> {
  const row = await db
    .selectFrom('clients')
    .select('id')
    .where(sql<string>`lower(name)`, '=', name.toLowerCase())
    .executeTakeFirst();
  return row !== undefined;
}

export async function insertClient(
  db: Db,
  values: { name: string; slug: string },
): Promise<string> {
  const row = await db
    .insertInto('clients')
    .values(values)
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}
