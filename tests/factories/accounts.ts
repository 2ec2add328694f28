import { randomBytes } from 'node:crypto';
import type { Db } from '../../server/db/database';
import type { StaffRole } from '../../server/schemas/common';
import { hashPassword } from '../../server/lib/secrets';

export const TEST_PASSWORD = 'correct horse battery';
const unique = () => randomBytes(4).toString('hex');

let cachedHash: Promise<string> | undefined;
const passwordHash = () => (cachedHash ??= hashPassword(TEST_PASSWORD));

export async function insertClient(db: Db, overrides: { name?: string } = {}) {
  const suffix = unique();
  return db
    .insertInto('clients')
    .values({ name: overrides.name ?? `Client ${suffix}`, slug: `client-${suffix}` })
    .returning(['id', 'name'])
    .executeTakeFirstOrThrow();
}

export async function insertStaff(
  db: Db,
  overrides: {
    role?: StaffRole;
    clientId?: string | null;
    email?: string;
    active?: boolean;
    withPassword?: boolean;
  } = {},
) {
  const role = overrides.role ?? 'studio_admin';
  return db
    .insertInto('users')
    .values({
      email: overrides.email ?? `${role}.${unique()}@studio.example`,
      displayName: `Test ${role}`,
      role,
      clientId: role === 'coordinator' ? (overrides.clientId ?? null) : null,
      passwordHash: overrides.withPassword === false ? null : await passwordHash(),
      active: overrides.active ?? true,
    })
    .returning(['id', 'email', 'role', 'clientId'])
    .executeTakeFirstOrThrow();
}

export async function insertOffice(
  db: Db,
  clientId: string,
  name = 'Leeds',
  timeZone = 'Europe/London',
) {
  return db
    .insertInto('offices')
    .values({ clientId, name, timeZone })
    .returning(['id', 'name'])
    .executeTakeFirstOrThrow();
}

export async function insertPerson(
  db: Db,
  clientId: string,
  overrides: {
    email?: string;
    officeId?: string | null;
    active?: boolean;
    givenName?: string;
  } = {},
) {
  const suffix = unique();
  return db
    .insertInto('people')
    .values({
      clientId,
      officeId: overrides.officeId ?? null,
      givenName: overrides.givenName ?? 'Robin',
      familyName: `Sample-${suffix}`,
      email: overrides.email ?? `robin.${suffix}@client.example`,
      employeeId: `E-${suffix}`,
      active: overrides.active ?? true,
    })
    .returning(['id', 'email', 'clientId'])
    .executeTakeFirstOrThrow();
}
