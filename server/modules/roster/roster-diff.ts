import type { PreviewKind, PreviewRow, PreviewValues, RosterField } from '../../schemas/roster';
import type { CheckedRow } from './roster-rows';
import { isWindows1252Copy } from './windows-1252';

/** A person already on the client's roster, as the diff needs them. */
export interface ExistingPerson {
  id: string;
  givenName: string;
  familyName: string;
  preferredName: string | null;
  email: string;
  employeeId: string | null;
  department: string | null;
  jobTitle: string | null;
  officeName: string | null;
  extras: Record<string, string>;
  active: boolean;
}

export interface RosterDiff {
  rows: PreviewRow[];
  newOffices: string[];
}

const comparedFields: RosterField[] = [
  'givenName',
  'familyName',
  'preferredName',
  'email',
  'employeeId',
  'department',
  'jobTitle',
  'office',
];

function currentValues(person: ExistingPerson): PreviewValues {
  const { officeName, extras, active, ...rest } = person;
  return { ...rest, office: officeName, extras, active };
}

function sameExtras(a: Record<string, string>, b: Record<string, string>): boolean {
  const keys = Object.keys(a);
  return keys.length === Object.keys(b).length && keys.every((key) => a[key] === b[key]);
}

export interface DiffOptions {
  /** The file was read as Windows-1252, so a stored name it cannot hold may come back lossy. */
  legacyEncoding?: boolean;
}

/** A department's key: case and runs of white space do not make another department. */
const departmentKey = (name: string) => name.toLowerCase().replace(/\s+/g, ' ');

/**
 * One spelling per department, so "Finance" and "finance " are one group when inviting by
 * department and in the figures: the roster's most used spelling, else the file's first.
 */
function departmentSpellings(existing: readonly ExistingPerson[]) {
  const counts = new Map<string, Map<string, number>>();
  for (const person of existing) {
    if (!person.active || !person.department) continue;
    const key = departmentKey(person.department);
    const spellings = counts.get(key) ?? new Map<string, number>();
    spellings.set(person.department, (spellings.get(person.department) ?? 0) + 1);
    counts.set(key, spellings);
  }
  const chosen = new Map<string, { spelling: string; from: string }>();
  for (const [key, spellings] of counts) {
    const [spelling] = [...spellings].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]))[0]!;
    chosen.set(key, { spelling, from: 'the roster' });
  }
  const bySpelling = new Map<string, { spelling: string; from: string }>();
  return {
    /** The spelling to write for `name` on file row `rowNumber`, and whose spelling it is. */
    spell(name: string, rowNumber: number) {
      // A file names a few departments many times: each exact spelling is folded once.
      const seen = bySpelling.get(name);
      if (seen) return seen;
      const key = departmentKey(name);
      let spelled = chosen.get(key);
      if (!spelled) {
        spelled = { spelling: name, from: `row ${rowNumber} of this file` };
        chosen.set(key, spelled);
      }
      bySpelling.set(name, spelled);
      return spelled;
    },
  };
}

const nameOf = (person: ExistingPerson) => `${person.givenName} ${person.familyName}`;

/**
 * Classifies checked rows against the roster. A row matches a person by employee id first,
 * then by e-mail (case-insensitive). An e-mail match whose person has another, non-empty
 * employee id is a conflict: never applied unless the coordinator says they are the same
 * people. Only the columns the mapping uses are compared and later written; a column left out
 * keeps what the person has. Active people no row matches are "missing". The result is what
 * commit applies, row for row.
 */
export function diffRoster(
  checked: readonly CheckedRow[],
  existing: readonly ExistingPerson[],
  knownOffices: readonly string[],
  mappedFields: ReadonlySet<RosterField>,
  extrasMapped: boolean,
  options: DiffOptions = {},
): RosterDiff {
  const diff = createRosterDiff(existing, knownOffices, mappedFields, extrasMapped, options);
  const rows = checked.map((item) => diff.next(item));
  const end = diff.finish();
  return { rows: [...rows, ...end.missing], newOffices: end.newOffices };
}

export interface RosterDiffPass {
  /** The preview row of the file's next checked row (rows come in file order). */
  next(item: CheckedRow): PreviewRow;
  /** After the last row: the active people no row matched, and the offices not known yet. */
  finish(): { missing: PreviewRow[]; newOffices: string[] };
}

/** diffRoster one row at a time, so a large file is diffed as its preview is stored. */
export function createRosterDiff(
  existing: readonly ExistingPerson[],
  knownOffices: readonly string[],
  mappedFields: ReadonlySet<RosterField>,
  extrasMapped: boolean,
  options: DiffOptions = {},
): RosterDiffPass {
  const byEmployeeId = new Map<string, ExistingPerson>();
  const byEmail = new Map<string, ExistingPerson>();
  for (const person of existing) {
    if (person.employeeId) byEmployeeId.set(person.employeeId, person);
    byEmail.set(person.email.toLowerCase(), person);
  }
  const officeKeys = new Set(knownOffices.map((name) => name.toLowerCase()));
  const departments = departmentSpellings(existing);
  const newOffices = new Map<string, string>();
  const claimed = new Map<string, number>();
  let position = 0;

  // A first import (no one on the roster yet) has no one to find: no key to fold per row.
  const anyone = existing.length > 0;
  const find = (employeeId: string | null | undefined, email: string | null | undefined) =>
    !anyone
      ? undefined
      : ((employeeId ? byEmployeeId.get(employeeId.trim()) : undefined) ??
        (email ? byEmail.get(email.trim().toLowerCase()) : undefined));

  const nextRow = (item: CheckedRow): PreviewRow => {
    position += 1;
    const base = { position, rowNumber: item.rowNumber, changedFields: [] as string[] };
    const match = find(item.values.employeeId, item.values.email);
    if (match) {
      // An error row still protects its person from being marked missing.
      if (!claimed.has(match.id)) claimed.set(match.id, item.rowNumber);
      else if (item.row) {
        // A valid row's errors may be the shared empty record: give it one of its own.
        item.errors = {
          ...item.errors,
          email: `This person is already on row ${claimed.get(match.id)}.`,
        };
        item.row = null;
      }
    }
    if (!item.row) {
      return {
        ...base,
        kind: 'error',
        personId: null,
        values: { ...item.values, extras: item.extras },
        before: null,
        errors: item.errors,
        warnings: item.warnings,
      };
    }
    const row = item.row;
    if (row.department) {
      const spelled = departments.spell(row.department, item.rowNumber);
      if (spelled.spelling !== row.department) {
        // A warnings record may be shared by many rows: this row gets one of its own.
        item.warnings = {
          ...item.warnings,
          department: `Written “${spelled.spelling}”, as ${spelled.from} spells this department.`,
        };
        row.department = spelled.spelling;
      }
    }
    if (row.office && !officeKeys.has(row.office.toLowerCase())) {
      newOffices.set(
        row.office.toLowerCase(),
        newOffices.get(row.office.toLowerCase()) ?? row.office,
      );
    }
    if (match) {
      const emailOwner = byEmail.get(row.email);
      if (emailOwner && emailOwner.id !== match.id) {
        return {
          ...base,
          kind: 'error',
          personId: null,
          values: { ...row, extras: item.extras },
          before: null,
          errors: { email: 'This e-mail belongs to another person on the roster.' },
          warnings: item.warnings,
        };
      }
    }
    if (!match) {
      // Most rows of a first import are new: no copies of their values (50,000 rows' worth of
      // garbage was most of the diff's time). The checked row is not read again.
      const values: PreviewValues = row;
      values.extras = item.extras;
      values.active = item.active ?? true;
      return {
        position,
        rowNumber: item.rowNumber,
        changedFields: base.changedFields,
        kind: 'add',
        personId: null,
        values,
        before: null,
        errors: item.errors,
        warnings: item.warnings,
      };
    }
    const before = currentValues(match);
    const after: PreviewValues = { ...before };
    const changed: string[] = [];
    const warnings = { ...item.warnings };
    for (const field of comparedFields) {
      if (!mappedFields.has(field)) continue;
      const next = row[field] ?? null;
      const previous = before[field] ?? null;
      const same =
        field === 'office' || field === 'email'
          ? (next ?? '').toLowerCase() === (previous ?? '').toLowerCase()
          : next === previous;
      if (same) continue;
      if (
        options.legacyEncoding &&
        field !== 'email' &&
        previous !== null &&
        next !== null &&
        isWindows1252Copy(previous, next)
      ) {
        warnings[field] =
          `Kept “${previous}”: this file is Windows-1252, which cannot hold it, and reads “${next}”. Save the file as UTF-8 to change it.`;
        continue;
      }
      after[field] = next;
      changed.push(field);
    }
    if (extrasMapped && !sameExtras(item.extras, match.extras)) {
      after.extras = item.extras;
      changed.push('extras');
    }
    // In the file means on staff, unless its status column says otherwise.
    const active = item.active ?? true;
    if (match.active !== active) {
      after.active = active;
      changed.push('active');
    }
    const conflict = !!row.employeeId && !!match.employeeId && row.employeeId !== match.employeeId;
    const kind: PreviewKind = conflict ? 'conflict' : changed.length > 0 ? 'update' : 'unchanged';
    return {
      ...base,
      kind,
      personId: match.id,
      values: after,
      before: kind === 'unchanged' ? null : before,
      changedFields: changed,
      errors: conflict
        ? {
            employeeId: `This e-mail belongs to ${nameOf(match)}, whose employee id is ${match.employeeId}; this row says ${row.employeeId}. Correct the file, or confirm below that they are the same person.`,
          }
        : {},
      warnings,
    };
  };

  const finish = () => {
    const missing: PreviewRow[] = [];
    for (const person of existing) {
      if (!person.active || claimed.has(person.id)) continue;
      position += 1;
      missing.push({
        position,
        rowNumber: null,
        kind: 'missing',
        personId: person.id,
        values: { ...currentValues(person), active: false },
        before: currentValues(person),
        changedFields: ['active'],
        errors: {},
        warnings: {},
      });
    }
    return { missing, newOffices: [...newOffices.values()].sort() };
  };
  return { next: nextRow, finish };
}
