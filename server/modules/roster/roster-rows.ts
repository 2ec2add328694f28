import { z } from 'zod';
import type { DecodeWarning } from '../../db/roster-types';
import {
  rosterRowSchema,
  type ColumnMapping,
  type RosterField,
  type RosterRow,
} from '../../schemas/roster';

export interface CheckedRow {
  /** Line of the record in the file, counting the header as row 1. */
  rowNumber: number;
  /** Trimmed, case-folded values when valid; the raw cells otherwise. */
  values: Partial<Record<RosterField, string | null>>;
  row: RosterRow | null;
  extras: Record<string, string>;
  errors: Record<string, string>;
  /** Per field (or extra column's header): what decoding or matching changed or kept. */
  warnings: Record<string, string>;
}

/** Puts each cell where the mapping says; extras keep their header as the key. */
function pick(headers: readonly string[], cells: readonly string[], mapping: ColumnMapping) {
  const fields: Partial<Record<RosterField, string>> = {};
  const extras: Record<string, string> = {};
  mapping.forEach((target, index) => {
    const cell = cells[index] ?? '';
    if (target === 'ignore') return;
    if (target === 'extra') {
      // Empty extras are dropped so "no value" compares equal to a missing key.
      const value = cell.trim();
      if (value !== '') extras[headers[index] ?? `Column ${index + 1}`] = value;
      return;
    }
    fields[target] = cell;
  });
  return { fields, extras };
}

/** Decoding's warnings by row index, worded per field or extra column. */
function warningsByRow(
  headers: readonly string[],
  mapping: ColumnMapping,
  decodeWarnings: readonly DecodeWarning[],
) {
  const byRow = new Map<number, Record<string, string>>();
  for (const warning of decodeWarnings) {
    const target = mapping[warning.column];
    if (!target || target === 'ignore') continue;
    const key =
      target === 'extra' ? (headers[warning.column] ?? `Column ${warning.column + 1}`) : target;
    const entry = byRow.get(warning.row) ?? {};
    entry[key] =
      warning.removed === 1
        ? 'A control character (not allowed in text) was removed from this value.'
        : `${warning.removed} control characters (not allowed in text) were removed from this value.`;
    byRow.set(warning.row, entry);
  }
  return byRow;
}

/**
 * Validates every row with the same zod schema the hand-edit form uses, then flags repeats of
 * an e-mail (case-insensitive) or employee id inside the file: the first occurrence wins.
 */
export function checkRows(
  headers: readonly string[],
  rows: readonly (readonly string[])[],
  mapping: ColumnMapping,
  decodeWarnings: readonly DecodeWarning[] = [],
): CheckedRow[] {
  const seenEmails = new Map<string, number>();
  const seenIds = new Map<string, number>();
  const rowWarnings = warningsByRow(headers, mapping, decodeWarnings);
  return rows.map((cells, index) => {
    const rowNumber = index + 2;
    const warnings = { ...rowWarnings.get(index) };
    const { fields, extras } = pick(headers, cells, mapping);
    const result = rosterRowSchema.safeParse(fields);
    if (!result.success) {
      const errors: Record<string, string> = {};
      for (const [field, messages] of Object.entries(z.flattenError(result.error).fieldErrors)) {
        const first = (messages as string[] | undefined)?.[0];
        if (first) errors[field] = first;
      }
      // "Enter a valid e-mail address" reads wrong for a blank cell in a file.
      if (errors.email && (fields.email ?? '').trim() === '')
        errors.email = 'The e-mail is missing.';
      return { rowNumber, values: fields, row: null, extras, errors, warnings };
    }
    const row = result.data;
    const errors: Record<string, string> = {};
    const earlierEmail = seenEmails.get(row.email);
    if (earlierEmail) errors.email = `The same e-mail is on row ${earlierEmail}.`;
    else seenEmails.set(row.email, rowNumber);
    if (row.employeeId) {
      const earlierId = seenIds.get(row.employeeId);
      if (earlierId) errors.employeeId = `The same employee id is on row ${earlierId}.`;
      else seenIds.set(row.employeeId, rowNumber);
    }
    const valid = Object.keys(errors).length === 0;
    return { rowNumber, values: { ...row }, row: valid ? row : null, extras, errors, warnings };
  });
}
