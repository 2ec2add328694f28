import type { ColumnMapping, ColumnTarget, RosterField } from '../../schemas/roster';
import { headerSynonyms } from './header-words';

export { headerSynonyms } from './header-words';

/** "E-mail address", "e_mail", "Émail " all become "e mail address" / "email". */
export function normaliseHeader(header: string): string {
  return header
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/#/g, ' number ')
    .replace(/[^a-z0-9]+/g, ' ')
    .trim();
}

/**
 * The column the rows-to-fix download adds: what is wrong with the row, not a field. That file
 * is made to be corrected and uploaded again, so the column is always ignored.
 */
export const fixColumnHeader = 'What to fix';
const fixColumnKey = normaliseHeader(fixColumnHeader);
export const isFixColumn = (header: string) => normaliseHeader(header) === fixColumnKey;

/** Headers of a column saying whether each person is active (our own export writes "Status"). */
const statusHeaders = ['status', 'active', 'employment status', 'employee status', 'active status'];

const lookup = new Map<string, RosterField>();
for (const [field, words] of Object.entries(headerSynonyms) as [RosterField, string[]][]) {
  for (const word of words) lookup.set(word, field);
}

/** "Personnel No", "Personal-Nr.", "Nº empleado": number words read as "number". */
function lookupKey(key: string): string {
  return key.replace(/\b(no|nr|num|nbr|nro)\b/g, 'number');
}

function fieldOfHeader(key: string): RosterField | undefined {
  const canonical = lookupKey(key);
  return (
    lookup.get(key) ?? lookup.get(canonical) ?? lookup.get(canonical.replace(/ number$/, ' id'))
  );
}

const emailLike = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

/**
 * A column whose header says nothing but whose values are e-mail addresses holds the e-mail:
 * at least four in five of its first 100 filled cells look like an address.
 */
function holdsEmails(rows: readonly (readonly string[])[], column: number): boolean {
  const values: string[] = [];
  for (const row of rows) {
    const value = row[column]?.trim() ?? '';
    if (value !== '') values.push(value);
    if (values.length === 100) break;
  }
  if (values.length === 0) return false;
  return values.filter((value) => emailLike.test(value)).length >= values.length * 0.8;
}

/**
 * A target for every column: a saved choice for the same header wins (the client's last
 * import), then the synonym list, then the column's contents (a column of addresses is the
 * e-mail); unknown columns are kept as extras. A field is given to the first column that
 * claims it only.
 */
export function suggestMapping(
  headers: readonly string[],
  saved: Readonly<Record<string, ColumnTarget>> = {},
  rows: readonly (readonly string[])[] = [],
): ColumnMapping {
  const taken = new Set<ColumnTarget>();
  const mapping: ColumnTarget[] = [];
  const unknown: number[] = [];
  headers.forEach((header, index) => {
    const key = normaliseHeader(header);
    let target: ColumnTarget;
    // The rows-to-fix reasons are never data, whatever an earlier import chose for them.
    if (key === '' || isFixColumn(header)) target = 'ignore';
    // Status columns were once always left out: a remembered "leave out" for one is that old
    // default, not a choice, and leaving it out would make every leaver in the file active.
    else if (statusHeaders.includes(key) && (!saved[key] || saved[key] === 'ignore'))
      target = 'status';
    else if (saved[key]) target = saved[key];
    else target = fieldOfHeader(key) ?? 'extra';
    if (target !== 'extra' && target !== 'ignore' && taken.has(target)) target = 'extra';
    if (target === 'extra' && !saved[key]) unknown.push(index);
    taken.add(target);
    mapping.push(target);
  });
  if (!taken.has('email')) {
    const column = unknown.find((index) => holdsEmails(rows, index));
    if (column !== undefined) mapping[column] = 'email';
  }
  return mapping;
}

/** What to remember for next time: the chosen target per normalised header. */
export function mappingToRemember(
  headers: readonly string[],
  mapping: ColumnMapping,
): Record<string, ColumnTarget> {
  const remembered: Record<string, ColumnTarget> = {};
  headers.forEach((header, index) => {
    const key = normaliseHeader(header);
    const target = mapping[index];
    if (key && target) remembered[key] = target;
  });
  return remembered;
}
