import { toCsv } from '../../lib/csv';
import type { currentSet, expectedPeople, peopleByIds } from './delivery.repository';

type SetRow = Awaited<ReturnType<typeof currentSet>>[number];
type Person = Awaited<ReturnType<typeof peopleByIds>>[number];
type Expected = Awaited<ReturnType<typeof expectedPeople>>;

/** manifest.csv: who is in which file (formula-safe, RFC 4180). */
export function manifestCsv(set: SetRow[]): string {
  return toCsv([
    [
      'Employee id',
      'E-mail',
      'Given name',
      'Family name',
      'Preferred name',
      'Office',
      'Department',
      'Rendition',
      'File name',
      'Bytes',
      'Changed in this release',
    ],
    ...set.map((row) => [
      row.employeeId ?? '',
      row.email ?? '',
      row.givenName,
      row.familyName,
      row.preferredName ?? '',
      row.officeName ?? '',
      row.department ?? '',
      row.renditionName,
      row.fileName,
      String(row.byteSize),
      row.changed ? 'yes' : 'no',
    ]),
  ]);
}

/** missing.csv: the day's invited people with no portrait in the set, and why. */
export function missingListCsv(missing: Person[], expected: Expected): string {
  return toCsv([
    ['Employee id', 'E-mail', 'Given name', 'Family name', 'Office', 'Department', 'Why'],
    ...missing.map((person) => [
      person.employeeId ?? '',
      person.email ?? '',
      person.givenName,
      person.familyName,
      person.officeName ?? '',
      person.department ?? '',
      !expected.photographed.has(person.id)
        ? 'Not photographed'
        : expected.picked.has(person.id)
          ? 'Photographed; portrait not finished yet'
          : 'Photographed; no portrait chosen yet',
    ]),
  ]);
}
