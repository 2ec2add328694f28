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

/** Someone in the set, some of whose picks as they stand now are not in it. */
export interface PartlyDelivered {
  person: Person;
  /** Their picks now that are not in this release. */
  waiting: number;
  chosen: number;
}

/**
 * missing.csv: the day's invited people with no portrait in the set, and why; then those in it
 * with only some of their chosen portraits (chosen after the release, or not finished yet).
 */
export function missingListCsv(
  missing: Person[],
  expected: Expected,
  partly: PartlyDelivered[] = [],
): string {
  const columns = (person: Person) => [
    person.employeeId ?? '',
    person.email ?? '',
    person.givenName,
    person.familyName,
    person.officeName ?? '',
    person.department ?? '',
  ];
  return toCsv([
    ['Employee id', 'E-mail', 'Given name', 'Family name', 'Office', 'Department', 'Why'],
    ...missing.map((person) => [
      ...columns(person),
      !expected.photographed.has(person.id)
        ? 'Not photographed'
        : expected.picked.has(person.id)
          ? 'Photographed; portrait not finished yet'
          : 'Photographed; no portrait chosen yet',
    ]),
    ...partly.map(({ person, waiting, chosen }) => [
      ...columns(person),
      `In the set, but ${waiting} of ${chosen} chosen portraits ${waiting === 1 ? 'is' : 'are'} not released yet`,
    ]),
  ]);
}
