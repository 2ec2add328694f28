import type { ColumnType, Generated } from 'kysely';

/**
 * Table types of the roster import (migrations 2026-12-02T0900_roster_import and
 * 2026-12-11T1100_roster_conflicts_and_replays,
 * 2026-12-13T0900_roster_draft_rows_as_json, 2026-12-20T0900_roster_draft_file_bytes).
 */
type DefaultedTimestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type Json<T> = ColumnType<T, string, string>;

export interface RosterImportDraftsTable {
  id: Generated<string>;
  clientId: string;
  createdBy: string | null;
  fileName: string;
  encoding: string;
  delimiter: string;
  headers: Json<string[]>;
  /** Drafts from before file_bytes; new drafts keep the file's bytes instead. */
  rawRows: ColumnType<string[][] | null, string | null | undefined, string | null>;
  rowNumbers: ColumnType<number[] | null, string | null | undefined, string | null>;
  rowCount: number;
  sampleRows: Json<string[][]>;
  mapping: Json<string[]>;
  counts: Json<Record<string, number>>;
  rowsWithWarnings: ColumnType<number, number | undefined, number>;
  newOffices: Json<string[]>;
  rosterVersion: string;
  hadByteOrderMark: ColumnType<boolean, boolean | undefined, boolean>;
  decodeWarnings: ColumnType<DecodeWarning[], string | undefined, string>;
  guessedColumns: ColumnType<number[], string | undefined, string>;
  createdAt: DefaultedTimestamp;
  expiresAt: ColumnType<Date, Date | string, Date | string>;
}

/**
 * What decoding changed in a data row (row index from 0): control characters removed from a
 * cell (column index from 0), bytes of a mostly-UTF-8 file read as Windows-1252 in a cell, or
 * values past the header's last column left out.
 */
export type DecodeWarning =
  | { row: number; column: number; removed: number }
  | { row: number; column: number; strayBytes: number }
  | { row: number; beyondHeader: number };

/** The uploaded file of a draft, as it came (migration 2026-12-20T0900). */
export interface RosterImportFilesTable {
  draftId: string;
  bytes: Buffer;
}

export interface RosterImportRowsTable {
  draftId: string;
  position: number;
  rowNumber: number | null;
  kind: 'add' | 'update' | 'unchanged' | 'error' | 'missing' | 'conflict';
  personId: string | null;
  givenName: string | null;
  familyName: string | null;
  preferredName: string | null;
  email: string | null;
  employeeId: string | null;
  department: string | null;
  jobTitle: string | null;
  office: string | null;
  /** From the file's status column; null when it does not say. */
  active: boolean | null;
  extras: Json<Record<string, string> | null>;
  detail: Json<PreviewDetail | null>;
}

/** The preview's extra facts about a row, beside the values. */
export interface PreviewDetail {
  before?: Record<string, unknown> | null;
  changedFields?: string[];
  errors?: Record<string, string>;
  warnings?: Record<string, string>;
}

export interface RosterImportsTable {
  id: Generated<string>;
  clientId: string;
  importedBy: string | null;
  fileName: string;
  importedAt: DefaultedTimestamp;
  added: number;
  updated: number;
  unchanged: number;
  deactivated: number;
  skipped: number;
  officesCreated: number;
  draftId: string | null;
}

export interface RosterMappingsTable {
  clientId: string;
  mapping: Json<Record<string, string>>;
  updatedAt: DefaultedTimestamp;
}
