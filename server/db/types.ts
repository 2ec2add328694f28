import type { ColumnType, Generated, Insertable, Selectable } from 'kysely';

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type DefaultedTimestamp = ColumnType<Date, Date | string | undefined, Date | string>;

export type StaffRole = 'studio_admin' | 'photographer' | 'coordinator';
export type LinkPurpose =
  'sitter_sign_in' | 'sitter_invitation' | 'set_password' | 'reset_password';

export interface ClientsTable {
  id: Generated<string>;
  name: string;
  slug: string;
  createdAt: DefaultedTimestamp;
}

export interface UsersTable {
  id: Generated<string>;
  email: string;
  displayName: string;
  role: StaffRole;
  clientId: string | null;
  passwordHash: string | null;
  active: Generated<boolean>;
  createdAt: DefaultedTimestamp;
  lastSignedInAt: Timestamp | null;
}

export interface OfficesTable {
  id: Generated<string>;
  clientId: string;
  name: string;
  timeZone: string;
  createdAt: DefaultedTimestamp;
}

export interface PeopleTable {
  id: Generated<string>;
  clientId: string;
  officeId: string | null;
  givenName: string;
  familyName: string;
  preferredName: string | null;
  email: string;
  employeeId: string | null;
  department: string | null;
  jobTitle: string | null;
  active: Generated<boolean>;
  createdAt: DefaultedTimestamp;
  updatedAt: DefaultedTimestamp;
}

export interface SessionsTable {
  id: Generated<string>;
  tokenHash: string;
  userId: string | null;
  personId: string | null;
  createdAt: DefaultedTimestamp;
  expiresAt: Timestamp;
  ipAddress: string | null;
  userAgent: string | null;
}

export interface LinkTokensTable {
  id: Generated<string>;
  tokenHash: string;
  purpose: LinkPurpose;
  userId: string | null;
  personId: string | null;
  createdAt: DefaultedTimestamp;
  expiresAt: Timestamp;
  usedAt: Timestamp | null;
}

export interface RateLimitCountersTable {
  key: string;
  hits: number;
  resetsAt: Timestamp;
}

export interface AuditEventsTable {
  id: Generated<string>;
  occurredAt: DefaultedTimestamp;
  actorUserId: string | null;
  action: string;
  subjectType: string;
  subjectId: string | null;
  details: ColumnType<unknown, string | undefined, string>;
}

export interface InstallationFactsTable {
  name: string;
  value: string;
  recordedAt: DefaultedTimestamp;
}

export interface Database {
  clients: ClientsTable;
  users: UsersTable;
  offices: OfficesTable;
  people: PeopleTable;
  sessions: SessionsTable;
  linkTokens: LinkTokensTable;
  rateLimitCounters: RateLimitCountersTable;
  auditEvents: AuditEventsTable;
  installationFacts: InstallationFactsTable;
}

export type UserRow = Selectable<UsersTable>;
export type PersonRow = Selectable<PeopleTable>;
export type NewPerson = Insertable<PeopleTable>;
