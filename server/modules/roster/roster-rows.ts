import type { DecodeWarning } from '../../db/roster-types';
import { hasKeys } from '../../lib/has-keys';
import { z } from 'zod';
import {
  personTextLimit,
  readStatus,
  rosterFields,
  rosterRowSchema,
  type ColumnMapping,
  type RosterField,
  type RosterRow,
} from '../../schemas/roster';

export interface CheckedRow {
  /** The record's row as a spreadsheet shows it: the header is row 1, blank lines count. */
  rowNumber: number;
  /** Trimmed, case-folded values when valid; the raw cells otherwise. */
  values: Partial<Record<RosterField, string | null>>;
  row: RosterRow | null;
  extras: Record<string, string>;
  /** What the status column says: active or not; null when there is none or it is blank. */
  active: boolean | null;
  errors: Record<string, string>;
  /** Per field (or extra column's header): what decoding or matching changed or kept. */
  warnings: Record<string, string>;
}

/** Shared by the rows that have none; frozen so no row can change another's. */
const none: Record<string, string> = Object.freeze({}) as Record<string, string>;

/** The extra columns' values of one row; empty ones are dropped (equal to a missing key). */
function extrasOf(headers: readonly string[], cells: readonly string[], columns: number[]) {
  if (columns.length === 0) return none;
  const extras: Record<string, string> = {};
  for (const index of columns) {
    const value = (cells[index] ?? '').trim();
    if (value !== '') extras[headers[index] ?? `Column ${index + 1}`] = value;
  }
  return hasKeys(extras) ? extras : none;
}

type FieldOutcome = string | null | { message: string };

/**
 * The cells rosterRowSchema plainly accepts, told without zod: a cell whose trimmed text is
 * within personTextLimit in UTF-16 units (never more lenient than zod's code points: a longer
 * cell goes to zod) and not blank for a required field, an e-mail matching zod's own pattern
 * (z.regexes.email, what z.email() tests) once trimmed and lower-cased. At 50,000 rows zod's
 * parse per cell was twice papaparse's whole parse. Anything else goes to zod, so every message
 * and every refusal is still the schema's (tests/unit/roster-rows.test.ts holds the two side
 * by side).
 */
function plainAcceptor(
  field: RosterField,
): (cell: string | undefined) => string | null | undefined {
  if (field === 'email') {
    return (cell) => {
      if (cell === undefined) return undefined;
      const value = cell.trim().toLowerCase();
      return z.regexes.email.test(value) ? value : undefined;
    };
  }
  // Required or not as the schema says: an optional field takes a blank cell.
  const min = rosterRowSchema.shape[field].safeParse('').success ? 0 : 1;
  return (cell) => {
    if (cell === undefined) return min === 0 ? null : undefined;
    const value = cell.trim();
    if (value.length < min || value.length > personTextLimit) return undefined;
    return value === '' ? null : value;
  };
}

/** One field's check: the plain acceptance above, else that field's own zod schema. */
function fieldChecker(field: RosterField) {
  const schema = rosterRowSchema.shape[field];
  const accept = plainAcceptor(field);
  return (cell: string | undefined): FieldOutcome => {
    const accepted = accept(cell);
    if (accepted !== undefined) return accepted;
    const result = schema.safeParse(cell);
    return result.success
      ? result.data
      : { message: result.error.issues[0]?.message ?? 'Check this value.' };
  };
}

/** The column each field reads (a valid mapping has at most one per field) and the extras. */
function columnsOf(mapping: ColumnMapping) {
  const fieldColumns = new Map<RosterField, number>();
  const extraColumns: number[] = [];
  let statusColumn: number | undefined;
  mapping.forEach((target, index) => {
    if (target === 'extra') extraColumns.push(index);
    else if (target === 'status') statusColumn = index;
    else if (target !== 'ignore') fieldColumns.set(target, index);
  });
  return { fieldColumns, extraColumns, statusColumn };
}

/** The warnings' key for values the header gives no column to (the preview shows it as is). */
export const beyondHeaderKey = 'Past the last column';

/**
 * Decoding's warnings by row index: removed control characters per field or extra column (none
 * for an ignored column), values past the header's last column per row.
 */
function warningsByRow(
  headers: readonly string[],
  mapping: ColumnMapping,
  decodeWarnings: readonly DecodeWarning[],
) {
  const byRow = new Map<number, Record<string, string>>();
  for (const warning of decodeWarnings) {
    if ('beyondHeader' in warning) {
      const entry = byRow.get(warning.row) ?? {};
      entry[beyondHeaderKey] =
        warning.beyondHeader === 1
          ? '1 value was left out: the header has no column for it. Add a column name to the header, or remove the value.'
          : `${warning.beyondHeader} values were left out: the header has no columns for them. Add column names to the header, or remove the values.`;
      byRow.set(warning.row, entry);
      continue;
    }
    const target = mapping[warning.column];
    if (!target || target === 'ignore') continue;
    const key =
      target === 'extra'
        ? (headers[warning.column] ?? `Column ${warning.column + 1}`)
        : target === 'status'
          ? 'active'
          : target;
    const entry = byRow.get(warning.row) ?? {};
    entry[key] =
      'strayBytes' in warning
        ? 'This value holds a character that is not UTF-8 like the rest of the file; it was read as Windows-1252. Check its spelling.'
        : warning.removed === 1
          ? 'A control character (not allowed in text) was removed from this value.'
          : `${warning.removed} control characters (not allowed in text) were removed from this value.`;
    byRow.set(warning.row, entry);
  }
  return byRow;
}

/**
 * The check of one row after another, in file order: each row by the zod schema the hand-edit
 * form uses (field by field, see fieldChecker), then repeats of an e-mail (case-insensitive)
 * or employee id inside the file are flagged: the first occurrence wins. One row at a time, so
 * a large file is checked as its preview is stored rather than all before it.
 */
export function createRowChecker(
  headers: readonly string[],
  mapping: ColumnMapping,
  decodeWarnings: readonly DecodeWarning[] = [],
  rowNumbers: readonly number[] | null = null,
): (cells: readonly string[], index: number) => CheckedRow {
  const seenEmails = new Map<string, number>();
  const seenIds = new Map<string, number>();
  const rowWarnings = warningsByRow(headers, mapping, decodeWarnings);
  const { fieldColumns, extraColumns, statusColumn } = columnsOf(mapping);
  const fieldCheck = (field: RosterField) => ({
    field,
    column: fieldColumns.get(field),
    check: fieldChecker(field),
  });
  const checks = Object.fromEntries(rosterFields.map((field) => [field, fieldCheck(field)])) as {
    [field in RosterField]: ReturnType<typeof fieldCheck>;
  };
  // The row being checked, and what its fields' checks found so far.
  let cells: readonly string[] = [];
  let errors: Record<string, string> | null = null;
  let warnings = none;
  const read = ({ field, column, check }: ReturnType<typeof fieldCheck>): string | null => {
    let cell = column === undefined ? undefined : (cells[column] ?? '');
    // A quoted line break inside a name or a title (RFC 4180 allows it) is one line here:
    // the field holds one line, as the hand-edit form does.
    if (cell !== undefined && (cell.includes('\n') || cell.includes('\r'))) {
      cell = cell.replace(/\s*[\r\n]+\s*/g, ' ');
      warnings = { ...warnings, [field]: 'The line break in this value was made a space.' };
    }
    const outcome = check(cell);
    if (outcome === null || typeof outcome !== 'object') return outcome;
    (errors ??= {})[field] = outcome.message;
    return null;
  };
  return (rowCells, index) => {
    cells = rowCells;
    errors = null;
    warnings = rowWarnings.get(index) ?? none;
    const rowNumber = rowNumbers?.[index] ?? index + 2;
    const extras = extrasOf(headers, cells, extraColumns);
    // Written out field by field, in the schema's order (which orders the errors too): every
    // row then has one shape, where a row filled by a loop over the field names was a
    // dictionary that each later step read slowly.
    const row = {
      givenName: read(checks.givenName),
      familyName: read(checks.familyName),
      preferredName: read(checks.preferredName),
      email: read(checks.email),
      employeeId: read(checks.employeeId),
      department: read(checks.department),
      jobTitle: read(checks.jobTitle),
      office: read(checks.office),
    };
    const active = statusColumn === undefined ? null : readStatus(cells[statusColumn]);
    if (active === undefined) {
      // Keyed "active" as the preview names that field "Status".
      (errors ??= {}).active = 'Write Active or Inactive here, or leave it blank.';
    }
    if (errors) {
      const values: Partial<Record<RosterField, string>> = {};
      for (const [field, column] of fieldColumns) values[field] = cells[column] ?? '';
      // "Enter a valid e-mail address" or "Enter the given name" read wrong for a blank cell in
      // a file: say what is missing, the same way for each field.
      if (errors.email && (values.email ?? '').trim() === '')
        errors.email = 'The e-mail is missing.';
      if (errors.givenName && (values.givenName ?? '').trim() === '')
        errors.givenName = 'The given name is missing.';
      if (errors.familyName && (values.familyName ?? '').trim() === '')
        errors.familyName = 'The family name is missing.';
      return { rowNumber, values, row: null, extras, active: active ?? null, errors, warnings };
    }
    const valid = row as RosterRow;
    const earlierEmail = seenEmails.get(valid.email);
    if (earlierEmail) errors = { email: `The same e-mail is on row ${earlierEmail}.` };
    else seenEmails.set(valid.email, rowNumber);
    if (valid.employeeId) {
      const earlierId = seenIds.get(valid.employeeId);
      if (earlierId) (errors ??= {}).employeeId = `The same employee id is on row ${earlierId}.`;
      else seenIds.set(valid.employeeId, rowNumber);
    }
    return {
      rowNumber,
      values: errors ? { ...valid } : valid,
      row: errors ? null : valid,
      extras,
      active: active ?? null,
      errors: errors ?? none,
      warnings,
    };
  };
}

/** Every row checked at once (see createRowChecker). */
export function checkRows(
  headers: readonly string[],
  rows: readonly (readonly string[])[],
  mapping: ColumnMapping,
  decodeWarnings: readonly DecodeWarning[] = [],
  rowNumbers: readonly number[] | null = null,
): CheckedRow[] {
  const check = createRowChecker(headers, mapping, decodeWarnings, rowNumbers);
  return rows.map((cells, index) => check(cells, index));
}
