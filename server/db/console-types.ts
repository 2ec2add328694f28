import type { ColumnType, Generated } from 'kysely';

type Timestamp = ColumnType<Date, Date | string, Date | string>;
type OptionalTimestamp = ColumnType<
  Date | null,
  Date | string | null | undefined,
  Date | string | null
>;
type Json = ColumnType<unknown, string, string>;

export interface StationActionsTable {
  id: Generated<string>;
  idempotencyKey: string;
  dayId: string;
  stationId: string;
  userId: string | null;
  kind: string;
  payload: Json;
  result: Json;
  tabletAt: Timestamp;
  receivedAt: Timestamp;
}

export type CheckInMethod = 'pass' | 'search' | 'walk_in' | 'new_person';

export interface CheckInsTable {
  id: string;
  dayId: string;
  personId: string;
  bookingId: string | null;
  stationId: string;
  method: CheckInMethod;
  checkedInAt: Timestamp;
  tabletAt: Timestamp;
  byUserId: string | null;
  undoneAt: OptionalTimestamp;
}

export interface SittingsTable {
  id: string;
  dayId: string;
  stationId: string;
  personId: string;
  checkInId: string;
  slateToken: string;
  firstFrame: number;
  lastFrame: ColumnType<number | null, number | null | undefined, number | null>;
  startedAt: Timestamp;
  tabletStartedAt: Timestamp;
  startedByUserId: string | null;
  finishedAt: OptionalTimestamp;
  tabletFinishedAt: OptionalTimestamp;
  finishedByUserId: ColumnType<string | null, string | null | undefined, string | null>;
  undoneAt: OptionalTimestamp;
  /** What was typed on the keypad; firstFrame/lastFrame may since have been corrected. */
  typedFirstFrame: ColumnType<number | null, number | null | undefined, number | null>;
  typedLastFrame: ColumnType<number | null, number | null | undefined, number | null>;
  framesCorrectedAt: OptionalTimestamp;
  framesCorrectedByUserId: ColumnType<string | null, string | null | undefined, string | null>;
}

export interface NoShowsTable {
  id: string;
  dayId: string;
  bookingId: string;
  stationId: string;
  markedAt: Timestamp;
  tabletAt: Timestamp;
  byUserId: string | null;
  undoneAt: OptionalTimestamp;
}
