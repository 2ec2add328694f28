import { sql } from 'kysely';
import type { Db } from '../../db/database';
import type { PeopleFilter, Person } from '../../schemas/people';

/** Evaluated once per query as a hashed set, so it stays cheap for 50,000 people. */
const hasBooking = sql<boolean>`people.id in (select person_id from bookings where status = 'active')`;

function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (match) => `\\${match}`);
}

/** The filtered set of one client's people, before paging. */
function filtered(
  db: Db,
  clientId: string,
  filter: Omit<PeopleFilter, 'page' | 'pageSize' | 'sort' | 'direction'>,
) {
  let query = db
    .selectFrom('people')
    .leftJoin('offices', 'offices.id', 'people.officeId')
    .where('people.clientId', '=', clientId);
  if (filter.status !== 'all')
    query = query.where('people.active', '=', filter.status === 'active');
  if (filter.officeId) query = query.where('people.officeId', '=', filter.officeId);
  if (filter.department) query = query.where('people.department', '=', filter.department);
  if (filter.booking !== 'any') {
    query = query.where(hasBooking, '=', filter.booking === 'booked');
  }
  if (filter.q) {
    const pattern = `%${escapeLike(filter.q)}%`;
    query = query.where((eb) =>
      eb.or([
        eb('people.givenName', 'ilike', pattern),
        eb('people.familyName', 'ilike', pattern),
        eb('people.preferredName', 'ilike', pattern),
        eb('people.email', 'ilike', pattern),
        eb('people.employeeId', 'ilike', pattern),
        eb(sql<string>`people.given_name || ' ' || people.family_name`, 'ilike', pattern),
      ]),
    );
  }
  return query;
}

const personColumns = [
  'people.id',
  'people.givenName',
  'people.familyName',
  'people.preferredName',
  'people.email',
  'people.employeeId',
  'people.department',
  'people.jobTitle',
  'people.officeId',
  'offices.name as officeName',
  'people.extras',
  'people.active',
  hasBooking.as('booked'),
  'people.updatedAt',
] as const;

type PersonRow = Omit<Person, 'updatedAt'> & { updatedAt: Date };
const toPerson = (row: PersonRow): Person => ({
  ...row,
  updatedAt: new Date(row.updatedAt).toISOString(),
});

const sortColumns = {
  name: ['people.familyName', 'people.givenName'],
  email: ['people.email'],
  employeeId: ['people.employeeId'],
  department: ['people.department'],
  jobTitle: ['people.jobTitle'],
  office: ['offices.name'],
  active: ['people.active'],
  updatedAt: ['people.updatedAt'],
} as const;

export async function listPeople(db: Db, clientId: string, filter: PeopleFilter) {
  let query = filtered(db, clientId, filter).select(personColumns);
  for (const column of sortColumns[filter.sort]) {
    query = query.orderBy(sql.ref(column), (order) =>
      filter.direction === 'asc' ? order.asc().nullsLast() : order.desc().nullsLast(),
    );
  }
  // People alike in the sorted column come in name order (then id, for a stable page).
  if (filter.sort !== 'name') {
    query = query.orderBy('people.familyName').orderBy('people.givenName');
  }
  // The page and the count run side by side on two connections: a search scans twice.
  const [rows, total] = await Promise.all([
    query
      .orderBy('people.id')
      .limit(filter.pageSize)
      .offset((filter.page - 1) * filter.pageSize)
      .execute() as Promise<PersonRow[]>,
    filtered(db, clientId, filter)
      .select((eb) => eb.fn.countAll<string>().as('n'))
      .executeTakeFirstOrThrow(),
  ]);
  return { people: rows.map(toPerson), total: Number(total.n) };
}

/** Every matching person for the CSV export, in name order. */
export async function allPeople(db: Db, clientId: string, filter: PeopleFilter): Promise<Person[]> {
  const rows = (await filtered(db, clientId, filter)
    .select(personColumns)
    .orderBy('people.familyName')
    .orderBy('people.givenName')
    .orderBy('people.id')
    .execute()) as PersonRow[];
  return rows.map(toPerson);
}

export async function listDepartments(db: Db, clientId: string): Promise<string[]> {
  const rows = await db
    .selectFrom('people')
    .select('department')
    .distinct()
    .where('clientId', '=', clientId)
    .where('department', 'is not', null)
    .orderBy('department')
    .limit(500)
    .execute();
  return rows.flatMap((row) => row.department ?? []);
}

export async function findPerson(
  db: Db,
  clientId: string,
  personId: string,
): Promise<Person | undefined> {
  const row = (await db
    .selectFrom('people')
    .leftJoin('offices', 'offices.id', 'people.officeId')
    .select(personColumns)
    .where('people.clientId', '=', clientId)
    .where('people.id', '=', personId)
    .executeTakeFirst()) as PersonRow | undefined;
  return row ? toPerson(row) : undefined;
}

export async function officeBelongsTo(db: Db, clientId: string, officeId: string) {
  const row = await db
    .selectFrom('offices')
    .select('id')
    .where('id', '=', officeId)
    .where('clientId', '=', clientId)
    .executeTakeFirst();
  return row !== undefined;
}

/** Who already holds an e-mail (case-insensitive) or employee id, other than `exceptId`. */
export async function findHolder(
  db: Db,
  clientId: string,
  values: { email: string; employeeId: string | null },
  exceptId: string | null,
) {
  let query = db
    .selectFrom('people')
    .select(['id', 'email', 'employeeId'])
    .where('clientId', '=', clientId)
    .where((eb) =>
      eb.or([
        eb(sql<string>`lower(email)`, '=', values.email.toLowerCase()),
        ...(values.employeeId ? [eb('employeeId', '=', values.employeeId)] : []),
      ]),
    );
  if (exceptId) query = query.where('id', '<>', exceptId);
  return query.executeTakeFirst();
}

export interface PersonValues {
  givenName: string;
  familyName: string;
  preferredName: string | null;
  email: string;
  employeeId: string | null;
  department: string | null;
  jobTitle: string | null;
  officeId: string | null;
}

export async function insertPerson(db: Db, clientId: string, values: PersonValues) {
  const row = await db
    .insertInto('people')
    .values({ clientId, ...values })
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

export async function updatePerson(
  db: Db,
  clientId: string,
  personId: string,
  values: Partial<PersonValues> & { active?: boolean },
) {
  await db
    .updateTable('people')
    .set({ ...values, updatedAt: sql`now()` })
    .where('clientId', '=', clientId)
    .where('id', '=', personId)
    .execute();
}

/** Erasure: the person row goes; bookings, sessions and link tokens follow by cascade. */
export async function deletePerson(db: Db, clientId: string, personId: string) {
  await db
    .deleteFrom('people')
    .where('clientId', '=', clientId)
    .where('id', '=', personId)
    .execute();
}
