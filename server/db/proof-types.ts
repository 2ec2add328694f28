import type { ColumnType } from 'kysely';

type DefaultedTimestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type OptionalTimestamp = ColumnType<
  Date | null,
  Date | string | null | undefined,
  Date | string | null
>;
type Defaulted<T> = ColumnType<T, T | undefined, T>;
type Optional<T> = ColumnType<T | null, T | null | undefined, T | null>;

export type PickChooser = 'sitter' | 'coordinator' | 'studio' | 'fallback';
export type RetouchStatus = 'to_do' | 'in_progress' | 'done';

export interface ClientProofSettingsTable {
  clientId: string;
  picksIncluded: Defaulted<number>;
  extraPicksAllowed: Defaulted<number>;
  extraPickPriceCents: Defaulted<number>;
  hrMayChoose: Defaulted<boolean>;
  updatedAt: DefaultedTimestamp;
}

export interface DayProofsTable {
  dayId: string;
  releasedAt: DefaultedTimestamp;
  releasedByUserId: string | null;
  picksCloseAt: ColumnType<Date, Date | string, Date | string>;
  reminderRounds: Defaulted<number>;
  settledAt: OptionalTimestamp;
}

export interface StudioPicksTable {
  dayId: string;
  personId: string;
  frameId: string;
  chosenByUserId: string | null;
  chosenAt: DefaultedTimestamp;
}

export interface PicksTable {
  id: string;
  dayId: string;
  personId: string;
  frameId: string;
  chosenBy: PickChooser;
  chosenByUserId: Optional<string>;
  note: Optional<string>;
  position: number;
  retouchStatus: Defaulted<RetouchStatus>;
  retouchUserId: Optional<string>;
  finalKey: Optional<string>;
  finalFileName: Optional<string>;
  /** bigint: pg hands it over as a string. */
  finalByteSize: Optional<string>;
  finalUploadedAt: OptionalTimestamp;
  finalUploadedByUserId: Optional<string>;
  /** The note as it was when the final was sent back. */
  noteAtFinal: Optional<string>;
  createdAt: DefaultedTimestamp;
  updatedAt: DefaultedTimestamp;
}
