import type { Db } from '../../db/database';
import type { StaffUser } from '../../schemas/users';

const columns = [
  'users.id',
  'users.email',
  'users.displayName',
  'users.role',
  'users.clientId',
  'clients.name as clientName',
  'users.active',
  'users.passwordHash',
  'users.lastSignedInAt',
] as const;

type Row = {
  id: string;
  email: string;
  displayName: string;
  role: StaffUser['role'];
  clientId: string | null;
  clientName: string | null;
  active: boolean;
  passwordHash: string | null;
  lastSignedInAt: Date | null;
};

const toStaffUser = (row: Row): StaffUser => ({
  id: row.id,
  email: row.email,
  displayName: row.displayName,
  role: row.role,
  clientId: row.clientId,
  clientName: row.clientName,
  active: row.active,
  hasPassword: row.passwordHash !== null,
  lastSignedInAt: row.lastSignedInAt ? new Date(row.lastSignedInAt).toISOString() : null,
});

const base = (db: Db) =>
  db.selectFrom('users').leftJoin('clients', 'clients.id', 'users.clientId').select(columns);

export async function listStaff(db: Db): Promise<StaffUser[]> {
  const rows = await base(db).orderBy('users.role').orderBy('users.displayName').execute();
  return rows.map(toStaffUser);
}

export async function findStaff(db: Db, id: string): Promise<StaffUser | undefined> {
  const row = await base(db).where('users.id', '=', id).executeTakeFirst();
  return row ? toStaffUser(row) : undefined;
}

export async function emailTaken(db: Db, email: string): Promise<boolean> {
  const row = await db
    .selectFrom('users')
    .select('id')
    .where((eb) => eb(eb.fn('lower', ['email']), '=', email.toLowerCase()))
    .executeTakeFirst();
  return row !== undefined;
}

export async function insertStaff(
  db: Db,
  values: { email: string; displayName: string; role: StaffUser['role']; clientId: string | null },
): Promise<string> {
  const row = await db.insertInto('users').values(values).returning('id').executeTakeFirstOrThrow();
  return row.id;
}

export async function setActive(db: Db, id: string, active: boolean): Promise<void> {
  await db.updateTable('users').set({ active }).where('id', '=', id).execute();
}

export async function countActiveAdmins(db: Db): Promise<number> {
  const row = await db
    .selectFrom('users')
    .select((eb) => eb.fn.countAll<string>().as('count'))
    .where('role', '=', 'studio_admin')
    .where('active', '=', true)
    .executeTakeFirstOrThrow();
  return Number(row.count);
}

/** The active coordinators of a client: HR, told when something is ready for them. */
export async function activeCoordinators(db: Db, clientId: string) {
  return db
    .selectFrom('users')
    .select(['id', 'email', 'displayName'])
    .where('role', '=', 'coordinator')
    .where('clientId', '=', clientId)
    .where('active', '=', true)
    .execute();
}
