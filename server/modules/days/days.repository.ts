import { sql, type RawBuilder, type Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type { Database } from '../../db/types';
import type { CreateDayInput } from '../../schemas/days';
import { staffedBy } from '../../db/day-scope';
import { reusableQuery } from '../../db/reusable-query';

type Executor = Db | Transaction<Database>;

export interface DayRecord {
  id: string;
  clientId: string;
  clientName: string;
  officeId: string;
  officeName: string;
  date: string;
  timeZone: string;
  address: string;
  room: string;
  opensAt: string;
  closesAt: string;
  breaks: Array<{ start: string; end: string }>;
  slotMinutes: number;
  bookingOpensAt: Date;
  bookingClosesAt: Date;
  changesCloseAt: Date;
  inviteBy: 'office' | 'department' | 'list';
  inviteDepartments: string[];
  status: 'proposed' | 'confirmed' | 'cancelled';
  reminderRounds: number;
  stations: Array<{
    id: string;
    name: string;
    photographerId: string | null;
    photographerName: string | null;
  }>;
}

export interface DayFilter {
  clientId?: string | null;
  photographerId?: string | null;
  dayIds?: string[];
}

function dayQuery(db: Executor) {
  return db
    .selectFrom('shootDays')
    .innerJoin('clients', 'clients.id', 'shootDays.clientId')
    .innerJoin('offices', 'offices.id', 'shootDays.officeId')
    .select([
      'shootDays.id',
      'shootDays.clientId',
      'clients.name as clientName',
      'shootDays.officeId',
      'offices.name as officeName',
      sql<string>`to_char(shoot_days.day_date, 'YYYY-MM-DD')`.as('date'),
      'shootDays.timeZone',
      'shootDays.address',
      'shootDays.room',
      'shootDays.opensAt',
      'shootDays.closesAt',
      'shootDays.breaks',
      'shootDays.slotMinutes',
      'shootDays.bookingOpensAt',
      'shootDays.bookingClosesAt',
      'shootDays.changesCloseAt',
      'shootDays.inviteBy',
      'shootDays.inviteDepartments',
      'shootDays.status',
      'shootDays.reminderRounds',
      // Stations come along in the same round trip: every booking request reads a day.
      sql<DayRecord['stations']>`(
        select coalesce(jsonb_agg(jsonb_build_object(
          'id', stations.id, 'name', stations.name,
          'photographerId', stations.photographer_id, 'photographerName', users.display_name
        ) order by stations.position), '[]'::jsonb)
        from stations left join users on users.id = stations.photographer_id
        where stations.day_id = shoot_days.id)`.as('stations'),
    ]);
}

export async function listDays(db: Executor, filter: DayFilter): Promise<DayRecord[]> {
  let query = dayQuery(db).orderBy('shootDays.dayDate').orderBy('offices.name');
  if (filter.clientId) query = query.where('shootDays.clientId', '=', filter.clientId);
  if (filter.dayIds) {
    if (filter.dayIds.length === 0) return [];
    query = query.where('shootDays.id', 'in', filter.dayIds);
  }
  if (filter.photographerId) query = query.where(staffedBy(filter.photographerId));
  return query.execute();
}

export async function findDay(db: Executor, id: string): Promise<DayRecord | undefined> {
  const [day] = await listDays(db, { dayIds: [id] });
  return day;
}

/** The parts of a day its invitation rule reads: its columns in a query, or values. */
type InviteTerms = Record<
  'id' | 'clientId' | 'officeId' | 'inviteBy' | 'inviteDepartments',
  RawBuilder<unknown>
>;

const dayRowTerms: InviteTerms = {
  id: sql`shoot_days.id`,
  clientId: sql`shoot_days.client_id`,
  officeId: sql`shoot_days.office_id`,
  inviteBy: sql`shoot_days.invite_by`,
  inviteDepartments: sql`shoot_days.invite_departments`,
};

const dayValueTerms = (
  day: Pick<DayRecord, 'id' | 'clientId' | 'officeId' | 'inviteBy' | 'inviteDepartments'>,
): InviteTerms => ({
  id: sql`${day.id}::uuid`,
  clientId: sql`${day.clientId}::uuid`,
  officeId: sql`${day.officeId}::uuid`,
  inviteBy: sql`${day.inviteBy}::text`,
  inviteDepartments: sql`${JSON.stringify(day.inviteDepartments)}::jsonb`,
});

/**
 * Who a day invites, as one condition on a `people` row: the client's active people of the
 * day's office, of its named departments, or on its hand-picked list. Read live, so roster
 * changes count. The one rule both for the list of a day's invitees (invitedPeopleQuery) and
 * for one person's yes or no next to the day's own row (personIsInvited).
 */
function invites(day: InviteTerms) {
  return sql<boolean>`(people.client_id = ${day.clientId}
    and people.active
    and case ${day.inviteBy}
      when 'office' then people.office_id = ${day.officeId}
      when 'department' then ${day.inviteDepartments} ? people.department
      else exists (
        select 1 from day_invitees
        where day_invitees.day_id = ${day.id} and day_invitees.person_id = people.id)
    end)`;
}

/** Whether the day of the enclosing query's shoot_days row invites this person. */
export function personIsInvited(personId: string) {
  return sql<boolean>`exists (
    select 1 from people where people.id = ${personId}::uuid and ${invites(dayRowTerms)})`;
}

/**
 * A day with whether this person is invited to it, and the version of its row (PostgreSQL's
 * xmin, new with every update): what a booking reads first, and checks again as it books.
 */
export async function findDayForPerson(
  db: Executor,
  id: string,
  personId: string,
): Promise<(DayRecord & { invited: boolean; version: string }) | undefined> {
  const [day] = await dayForPersonQuery(db, id, personId);
  return day;
}

const dayForPersonQuery = reusableQuery(
  (db: Db, id: string, personId: string) =>
    dayQuery(db)
      .select([
        personIsInvited(personId).as('invited'),
        sql<string>`shoot_days.xmin::text`.as('version'),
      ])
      .where('shootDays.id', '=', id),
  2,
);

/** Locks the day row: used when a change must not race with another change to the day. */
export async function lockDay(trx: Transaction<Database>, id: string): Promise<void> {
  await trx.selectFrom('shootDays').select('id').where('id', '=', id).forUpdate().execute();
}

/**
 * Reads the day's hours under a shared lock: bookings take it so that a day edit (which locks
 * the row for update) cannot change the hours between a booking's slot check and its insert.
 */
export async function lockDayHoursShared(trx: Transaction<Database>, id: string) {
  const row = await trx
    .selectFrom('shootDays')
    .select([
      sql<string>`to_char(day_date, 'YYYY-MM-DD')`.as('date'),
      'timeZone',
      'opensAt',
      'closesAt',
      'breaks',
      'slotMinutes',
      'status',
    ])
    .where('id', '=', id)
    .forShare()
    .executeTakeFirst();
  return row;
}

export async function officeTimeZone(
  db: Executor,
  officeId: string,
  clientId: string,
): Promise<string | undefined> {
  const row = await db
    .selectFrom('offices')
    .select('timeZone')
    .where('id', '=', officeId)
    .where('clientId', '=', clientId)
    .executeTakeFirst();
  return row?.timeZone;
}

export async function activePhotographerIds(db: Executor, ids: string[]): Promise<Set<string>> {
  if (ids.length === 0) return new Set();
  const rows = await db
    .selectFrom('users')
    .select('id')
    .where('id', 'in', ids)
    .where('role', '=', 'photographer')
    .where('active', '=', true)
    .execute();
  return new Set(rows.map((row) => row.id));
}

export async function peopleOfClient(db: Executor, clientId: string, ids: string[]) {
  if (ids.length === 0) return [];
  return db
    .selectFrom('people')
    .select('id')
    .where('clientId', '=', clientId)
    .where('id', 'in', ids)
    .execute();
}

export async function insertDay(
  trx: Transaction<Database>,
  input: CreateDayInput & { timeZone: string; status: 'proposed' | 'confirmed' },
  createdByUserId: string,
): Promise<string> {
  const row = await trx
    .insertInto('shootDays')
    .values({
      clientId: input.clientId,
      officeId: input.officeId,
      dayDate: input.date,
      timeZone: input.timeZone,
      address: input.address,
      room: input.room,
      opensAt: input.opensAt,
      closesAt: input.closesAt,
      breaks: JSON.stringify(input.breaks),
      slotMinutes: input.slotMinutes,
      bookingOpensAt: input.bookingOpensAt,
      bookingClosesAt: input.bookingClosesAt,
      changesCloseAt: input.changesCloseAt,
      inviteBy: input.inviteBy,
      inviteDepartments: JSON.stringify(input.inviteDepartments),
      status: input.status,
      createdByUserId,
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  await trx
    .insertInto('stations')
    .values(
      input.stations.map((station, index) => ({
        dayId: row.id,
        position: index + 1,
        name: station.name,
        photographerId: station.photographerId,
      })),
    )
    .execute();
  if (input.inviteBy === 'list' && input.invitePersonIds.length > 0) {
    await trx
      .insertInto('dayInvitees')
      .values([...new Set(input.invitePersonIds)].map((personId) => ({ dayId: row.id, personId })))
      .execute();
  }
  return row.id;
}

export async function assignPhotographers(
  trx: Transaction<Database>,
  dayId: string,
  assignments: Array<{ id: string; photographerId: string }>,
): Promise<void> {
  for (const assignment of assignments) {
    await trx
      .updateTable('stations')
      .set({ photographerId: assignment.photographerId })
      .where('id', '=', assignment.id)
      .where('dayId', '=', dayId)
      .execute();
  }
  await trx.updateTable('shootDays').set({ status: 'confirmed' }).where('id', '=', dayId).execute();
}

export interface InvitedPerson {
  id: string;
  name: string;
  email: string;
  department: string | null;
  officeName: string | null;
}

/** The people a day invites (see invites), with what invitations and the day's lists show. */
export function invitedPeopleQuery(
  db: Executor,
  day: Pick<DayRecord, 'id' | 'clientId' | 'officeId' | 'inviteBy' | 'inviteDepartments'>,
) {
  return db
    .selectFrom('people')
    .leftJoin('offices', 'offices.id', 'people.officeId')
    .select([
      'people.id',
      sql<string>`coalesce(people.preferred_name, people.given_name) || ' ' || people.family_name`.as(
        'name',
      ),
      'people.email',
      'people.department',
      'offices.name as officeName',
    ])
    .where(invites(dayValueTerms(day)));
}

export async function bookedCounts(db: Executor, dayIds: string[]): Promise<Map<string, number>> {
  if (dayIds.length === 0) return new Map();
  const rows = await db
    .selectFrom('bookings')
    .select(['dayId', db.fn.countAll<string>().as('n')])
    .where('dayId', 'in', dayIds)
    .where('status', '=', 'active')
    .groupBy('dayId')
    .execute();
  return new Map(rows.map((row) => [row.dayId, Number(row.n)]));
}
