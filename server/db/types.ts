import type { ColumnType, Generated, Insertable, Selectable } from 'kysely';
import type {
  CheckInsTable,
  NoShowsTable,
  SittingsTable,
  StationActionsTable,
} from './console-types';
import type { DayChangeProposalsTable } from './day-change-types';
import type { FrameUploadsTable, FramesTable } from './frame-types';
import type { InvoiceSequencesTable, InvoicesTable, PriceListsTable } from './invoice-types';
import type {
  ClientLooksTable,
  DeliveredRenditionsTable,
  DeliveriesTable,
  PortraitEyesTable,
  PortraitRenditionsTable,
  SitterDownloadLinksTable,
} from './look-types';
import type { FrameMatchesTable, MatchDecisionsTable, MatchRunsTable } from './match-types';
import type {
  ClientProofSettingsTable,
  DayProofsTable,
  PicksTable,
  StudioPicksTable,
} from './proof-types';
import type { CaughtMailsTable } from './mailbox-types';
import type { SetupCardsTable } from './setup-card-types';
import type {
  RosterImportDraftsTable,
  RosterImportFilesTable,
  RosterImportRowsTable,
  RosterImportsTable,
  RosterMappingsTable,
} from './roster-types';

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
  /** Roster columns kept as they came (see roster-types.ts). */
  extras: ColumnType<Record<string, string>, string | undefined, string>;
  /** Set for walk-ins added at a station: the day they joined the roster. */
  addedOnDayId: ColumnType<string | null, string | null | undefined, string | null>;
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

export interface SignInBackoffTable {
  key: string;
  attempts: number;
  lastAttemptAt: Timestamp;
  nextAllowedAt: Timestamp | null;
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

export interface ShootDaysTable {
  id: Generated<string>;
  clientId: string;
  officeId: string;
  /** A calendar date; repositories read it with to_char(day_date, 'YYYY-MM-DD'). */
  dayDate: ColumnType<string, string, string>;
  timeZone: string;
  address: string;
  room: Generated<string>;
  opensAt: string;
  closesAt: string;
  breaks: ColumnType<Array<{ start: string; end: string }>, string | undefined, string>;
  slotMinutes: Generated<number>;
  bookingOpensAt: Timestamp;
  bookingClosesAt: Timestamp;
  changesCloseAt: Timestamp;
  inviteBy: 'office' | 'department' | 'list';
  inviteDepartments: ColumnType<string[], string | undefined, string>;
  status: 'proposed' | 'confirmed' | 'cancelled';
  reminderRounds: Generated<number>;
  noShowGraceMinutes: Generated<number>;
  createdByUserId: string | null;
  createdAt: DefaultedTimestamp;
}

export interface StationsTable {
  id: Generated<string>;
  dayId: string;
  position: number;
  name: string;
  photographerId: string | null;
}

export interface DayInviteesTable {
  dayId: string;
  personId: string;
}

export interface BookingsTable {
  id: Generated<string>;
  dayId: string;
  stationId: string;
  personId: string;
  startsAt: Timestamp;
  status: Generated<'active' | 'cancelled'>;
  passToken: string;
  calendarUid: string;
  sequence: Generated<number>;
  preferredName: string | null;
  glasses: Generated<boolean>;
  accessNeeds: string | null;
  flashSensitive: Generated<boolean>;
  bookedByUserId: string | null;
  createdAt: DefaultedTimestamp;
  updatedAt: DefaultedTimestamp;
}

export interface DayMailingsTable {
  id: Generated<string>;
  dayId: string;
  personId: string;
  kind:
    | 'invitation'
    | 'reminder'
    | 'day_before'
    | 'proofs'
    | 'proofs_reminder'
    | 'proofs_deadline'
    | 'portraits_ready';
  round: Generated<number>;
  status: Generated<'queued' | 'sent' | 'failed'>;
  reason: string | null;
  queuedAt: DefaultedTimestamp;
  sentAt: Timestamp | null;
}

export interface Database {
  clients: ClientsTable;
  users: UsersTable;
  offices: OfficesTable;
  people: PeopleTable;
  sessions: SessionsTable;
  linkTokens: LinkTokensTable;
  rateLimitCounters: RateLimitCountersTable;
  signInBackoff: SignInBackoffTable;
  auditEvents: AuditEventsTable;
  installationFacts: InstallationFactsTable;
  setupCards: SetupCardsTable;
  rosterImportDrafts: RosterImportDraftsTable;
  rosterImportFiles: RosterImportFilesTable;
  rosterImportRows: RosterImportRowsTable;
  rosterImports: RosterImportsTable;
  rosterMappings: RosterMappingsTable;
  shootDays: ShootDaysTable;
  stations: StationsTable;
  dayInvitees: DayInviteesTable;
  bookings: BookingsTable;
  dayMailings: DayMailingsTable;
  stationActions: StationActionsTable;
  checkIns: CheckInsTable;
  sittings: SittingsTable;
  noShows: NoShowsTable;
  frameUploads: FrameUploadsTable;
  frames: FramesTable;
  matchRuns: MatchRunsTable;
  frameMatches: FrameMatchesTable;
  matchDecisions: MatchDecisionsTable;
  clientProofSettings: ClientProofSettingsTable;
  dayProofs: DayProofsTable;
  studioPicks: StudioPicksTable;
  picks: PicksTable;
  clientLooks: ClientLooksTable;
  portraitEyes: PortraitEyesTable;
  portraitRenditions: PortraitRenditionsTable;
  deliveries: DeliveriesTable;
  deliveredRenditions: DeliveredRenditionsTable;
  sitterDownloadLinks: SitterDownloadLinksTable;
  priceLists: PriceListsTable;
  invoiceSequences: InvoiceSequencesTable;
  invoices: InvoicesTable;
  dayChangeProposals: DayChangeProposalsTable;
  caughtMails: CaughtMailsTable;
}

export type UserRow = Selectable<UsersTable>;
export type PersonRow = Selectable<PeopleTable>;
export type NewPerson = Insertable<PeopleTable>;
