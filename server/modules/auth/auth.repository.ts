import type { Db } from '../../db/database';
import { reusableQuery } from '../../db/reusable-query';
import type { LinkPurpose } from '../../db/types';

type Executor = Db;

export interface StaffAccount {
  id: string;
  email: string;
  displayName: string;
  role: 'studio_admin' | 'photographer' | 'coordinator';
  clientId: string | null;
  clientName: string | null;
  passwordHash: string | null;
  active: boolean;
}

export interface SitterAccount {
  id: string;
  email: string;
  displayName: string;
  clientId: string;
  clientName: string;
  officeName: string | null;
  active: boolean;
}

export interface SessionRecord {
  id: string;
  expiresAt: Date;
  userId: string | null;
  personId: string | null;
}

export interface LinkRecord {
  id: string;
  purpose: LinkPurpose;
  userId: string | null;
  personId: string | null;
  expiresAt: Date;
  usedAt: Date | null;
}

const staffColumns = [
  'users.id',
  'users.email',
  'users.displayName',
  'users.role',
  'users.clientId',
  'clients.name as clientName',
  'users.passwordHash',
  'users.active',
] as const;

export async function findStaffByEmail(
  db: Executor,
  email: string,
): Promise<StaffAccount | undefined> {
  return db
    .selectFrom('users')
    .leftJoin('clients', 'clients.id', 'users.clientId')
    .select(staffColumns)
    .where((eb) => eb(eb.fn('lower', ['users.email']), '=', email.toLowerCase()))
    .executeTakeFirst();
}

export async function findStaffById(db: Executor, id: string): Promise<StaffAccount | undefined> {
  return db
    .selectFrom('users')
    .leftJoin('clients', 'clients.id', 'users.clientId')
    .select(staffColumns)
    .where('users.id', '=', id)
    .executeTakeFirst();
}

const sitterQuery = (db: Executor) =>
  db
    .selectFrom('people')
    .innerJoin('clients', 'clients.id', 'people.clientId')
    .leftJoin('offices', 'offices.id', 'people.officeId')
    .select((eb) => [
      'people.id',
      'people.email',
      eb.fn.coalesce('people.preferredName', 'people.givenName').as('firstName'),
      'people.familyName',
      'people.clientId',
      'clients.name as clientName',
      'offices.name as officeName',
      'people.active',
    ]);

function toSitter(row: {
  id: string;
  email: string;
  firstName: string;
  familyName: string;
  clientId: string;
  clientName: string;
  officeName: string | null;
  active: boolean;
}): SitterAccount {
  return {
    id: row.id,
    email: row.email,
    displayName: `${row.firstName} ${row.familyName}`,
    clientId: row.clientId,
    clientName: row.clientName,
    officeName: row.officeName,
    active: row.active,
  };
}

/** A person may be on several clients' rosters with one address: all active matches. */
export async function findActiveSittersByEmail(
  db: Executor,
  email: string,
): Promise<SitterAccount[]> {
  const rows = await sitterQuery(db)
    .where((eb) => eb(eb.fn('lower', ['people.email']), '=', email.toLowerCase()))
    .where('people.active', '=', true)
    .execute();
  return rows.map(toSitter);
}

export async function findSitterById(db: Executor, id: string): Promise<SitterAccount | undefined> {
  const row = await sitterQuery(db).where('people.id', '=', id).executeTakeFirst();
  return row ? toSitter(row) : undefined;
}

export async function insertSession(
  db: Executor,
  values: {
    tokenHash: string;
    userId: string | null;
    personId: string | null;
    expiresAt: Date;
    ipAddress: string | null;
    userAgent: string | null;
  },
): Promise<SessionRecord> {
  return db
    .insertInto('sessions')
    .values(values)
    .returning(['id', 'expiresAt', 'userId', 'personId'])
    .executeTakeFirstOrThrow();
}

/**
 * A live session with the account behind it, in one round trip: every API request resolves
 * its cookie, so this is the one query each request pays before its own work.
 */
const sessionAccountQuery = reusableQuery(
  (db: Executor, tokenHash: string, now: Date) =>
    db
      .selectFrom('sessions')
      .leftJoin('users', 'users.id', 'sessions.userId')
      .leftJoin('people', 'people.id', 'sessions.personId')
      .select((eb) => [
        'sessions.id',
        'sessions.expiresAt',
        'sessions.userId',
        'sessions.personId',
        'users.email as staffEmail',
        'users.displayName',
        'users.role',
        'users.clientId as staffClientId',
        'users.active as staffActive',
        'people.email as sitterEmail',
        eb.fn.coalesce('people.preferredName', 'people.givenName').as('firstName'),
        'people.familyName',
        'people.clientId as sitterClientId',
        'people.active as sitterActive',
      ])
      .where('sessions.tokenHash', '=', tokenHash)
      .where('sessions.expiresAt', '>', now),
  2,
);

export async function findSessionAccount(db: Executor, tokenHash: string, now: Date) {
  const [row] = await sessionAccountQuery(db, tokenHash, now);
  if (!row) return undefined;
  const session: SessionRecord = {
    id: row.id,
    expiresAt: row.expiresAt,
    userId: row.userId,
    personId: row.personId,
  };
  if (row.userId && row.staffEmail && row.role && row.displayName !== null) {
    const staff = {
      id: row.userId,
      email: row.staffEmail,
      displayName: row.displayName,
      role: row.role,
      clientId: row.staffClientId,
      active: row.staffActive === true,
    };
    return { session, staff, sitter: null };
  }
  if (row.personId && row.sitterEmail && row.sitterClientId && row.familyName !== null) {
    const sitter = {
      id: row.personId,
      email: row.sitterEmail,
      displayName: `${row.firstName} ${row.familyName}`,
      clientId: row.sitterClientId,
      active: row.sitterActive === true,
    };
    return { session, staff: null, sitter };
  }
  return { session, staff: null, sitter: null };
}

export async function deleteSession(db: Executor, id: string): Promise<void> {
  await db.deleteFrom('sessions').where('id', '=', id).execute();
}

export async function deleteSessionsOfUser(db: Executor, userId: string): Promise<void> {
  await db.deleteFrom('sessions').where('userId', '=', userId).execute();
}

export async function deleteExpiredSessions(db: Executor, now: Date): Promise<void> {
  await db.deleteFrom('sessions').where('expiresAt', '<=', now).execute();
}

export async function touchStaffSignIn(db: Executor, userId: string, at: Date): Promise<void> {
  await db.updateTable('users').set({ lastSignedInAt: at }).where('id', '=', userId).execute();
}

export async function insertLinkToken(
  db: Executor,
  values: {
    tokenHash: string;
    purpose: LinkPurpose;
    userId: string | null;
    personId: string | null;
    expiresAt: Date;
  },
): Promise<void> {
  await db.insertInto('linkTokens').values(values).execute();
}

/**
 * Marks a link used in one statement, so two simultaneous clicks cannot both succeed.
 * Returns undefined when the link is unknown, used, expired or of another purpose.
 */
export async function consumeLinkToken(
  db: Executor,
  tokenHash: string,
  purposes: readonly LinkPurpose[],
  now: Date,
): Promise<LinkRecord | undefined> {
  return db
    .updateTable('linkTokens')
    .set({ usedAt: now })
    .where('tokenHash', '=', tokenHash)
    .where('purpose', 'in', purposes)
    .where('usedAt', 'is', null)
    .where('expiresAt', '>', now)
    .returning(['id', 'purpose', 'userId', 'personId', 'expiresAt', 'usedAt'])
    .executeTakeFirst();
}

export async function findLinkToken(
  db: Executor,
  tokenHash: string,
): Promise<LinkRecord | undefined> {
  return db
    .selectFrom('linkTokens')
    .select(['id', 'purpose', 'userId', 'personId', 'expiresAt', 'usedAt'])
    .where('tokenHash', '=', tokenHash)
    .executeTakeFirst();
}

export async function setPasswordHash(
  db: Executor,
  userId: string,
  passwordHash: string,
): Promise<void> {
  await db.updateTable('users').set({ passwordHash }).where('id', '=', userId).execute();
}

/** Older unused links of the same purpose stop working once a new one is issued. */
export async function retireOpenLinks(
  db: Executor,
  subject: { userId?: string; personId?: string },
  purposes: readonly LinkPurpose[],
  now: Date,
): Promise<void> {
  let query = db
    .updateTable('linkTokens')
    .set({ usedAt: now })
    .where('usedAt', 'is', null)
    .where('purpose', 'in', purposes);
  if (subject.userId) query = query.where('userId', '=', subject.userId);
  if (subject.personId) query = query.where('personId', '=', subject.personId);
  await query.execute();
}

type SessionSubject = { userId: string } | { personId: string };

export async function listLiveSessions(db: Executor, subject: SessionSubject, now: Date) {
  const query = db
    .selectFrom('sessions')
    .select(['id', 'createdAt', 'expiresAt', 'ipAddress', 'userAgent'])
    .where('expiresAt', '>', now)
    .orderBy('createdAt', 'desc');
  return 'userId' in subject
    ? query.where('userId', '=', subject.userId).execute()
    : query.where('personId', '=', subject.personId).execute();
}

/** Deletes the subject's sessions except `keepId`; returns how many ended. */
export async function deleteOtherSessions(
  db: Executor,
  subject: SessionSubject,
  keepId: string,
): Promise<number> {
  const query = db.deleteFrom('sessions').where('id', '<>', keepId);
  const result = await (
    'userId' in subject
      ? query.where('userId', '=', subject.userId)
      : query.where('personId', '=', subject.personId)
  ).executeTakeFirst();
  return Number(result.numDeletedRows);
}
