import { describe, expect, it } from 'vitest';
import { diffRoster, type ExistingPerson } from '../../server/modules/roster/roster-diff';
import { checkRows } from '../../server/modules/roster/roster-rows';
import type { ColumnMapping, RosterField } from '../../server/schemas/roster';

// Sources: the matching and deactivation rules are the product's own (issue: match by employee
// id, then e-mail; never delete); e-mail syntax is zod's validator; case-folding of the address
// is common practice (mailbox providers treat addresses case-insensitively).

const headers = ['First name', 'Last name', 'Email', 'Employee id', 'Office', 'Shirt'];
const mapping: ColumnMapping = [
  'givenName',
  'familyName',
  'email',
  'employeeId',
  'office',
  'extra',
];
const mapped = new Set<RosterField>(['givenName', 'familyName', 'email', 'employeeId', 'office']);

const person = (overrides: Partial<ExistingPerson>): ExistingPerson => ({
  id: 'p1',
  givenName: 'Ada',
  familyName: 'Pike',
  preferredName: null,
  email: 'ada@hp.example',
  employeeId: 'E1',
  department: null,
  jobTitle: null,
  officeName: 'Leeds',
  extras: {},
  active: true,
  ...overrides,
});

function diff(rows: string[][], existing: ExistingPerson[]) {
  return diffRoster(checkRows(headers, rows, mapping), existing, ['Leeds'], mapped, true);
}

describe('checking rows', () => {
  it('trims and case-folds e-mail, and gives a reason per cell', () => {
    const checked = checkRows(
      headers,
      [
        ['Ada', 'Pike', '  Ada@HP.Example ', '', '', ''],
        ['', 'Lund', 'not-an-email', '', '', ''],
      ],
      mapping,
    );
    expect(checked[0]?.row?.email).toBe('ada@hp.example');
    expect(checked[0]?.row?.employeeId).toBeNull();
    expect(checked[1]?.row).toBeNull();
    expect(Object.keys(checked[1]?.errors ?? {}).sort()).toEqual(['email', 'givenName']);
  });

  it('flags repeats of an e-mail or employee id inside the file', () => {
    const checked = checkRows(
      headers,
      [
        ['Ada', 'Pike', 'ada@hp.example', 'E1', '', ''],
        ['Ada', 'Pike', 'ADA@hp.example', 'E2', '', ''],
        ['Bo', 'Lund', 'bo@hp.example', 'E1', '', ''],
      ],
      mapping,
    );
    expect(checked[1]?.errors.email).toBe('The same e-mail is on row 2.');
    expect(checked[2]?.errors.employeeId).toBe('The same employee id is on row 2.');
  });
});

describe('diffing against the roster', () => {
  it('adds, updates side by side, leaves unchanged, and lists the missing', () => {
    const result = diff(
      [
        ['Ada', 'Pike', 'ada@hp.example', 'E1', 'Leeds', ''],
        ['Bo', 'Lund-Berg', 'bo@hp.example', 'E2', 'Porto', 'L'],
        ['Cy', 'Moss', 'cy@hp.example', 'E9', 'Leeds', ''],
      ],
      [
        person({}),
        person({
          id: 'p2',
          givenName: 'Bo',
          familyName: 'Lund',
          email: 'bo@hp.example',
          employeeId: 'E2',
        }),
        person({ id: 'p3', givenName: 'Di', email: 'di@hp.example', employeeId: 'E3' }),
        person({ id: 'p4', email: 'old@hp.example', employeeId: 'E4', active: false }),
      ],
    );
    expect(result.rows.map((row) => row.kind)).toEqual(['unchanged', 'update', 'add', 'missing']);
    const update = result.rows[1];
    expect(update?.changedFields).toEqual(['familyName', 'office', 'extras']);
    expect(update?.before?.familyName).toBe('Lund');
    expect(update?.values.familyName).toBe('Lund-Berg');
    expect(result.rows[3]?.personId).toBe('p3');
    expect(result.newOffices).toEqual(['Porto']);
  });

  it('matches by employee id first, then by e-mail case-insensitively', () => {
    const byId = diff([['Ada', 'Pike', 'new@hp.example', 'E1', 'Leeds', '']], [person({})]);
    expect(byId.rows[0]).toMatchObject({
      kind: 'update',
      personId: 'p1',
      changedFields: ['email'],
    });
    // A person without an id gains the file's id through their e-mail.
    const byEmail = diff(
      [['Ada', 'Pike', 'ADA@hp.example', 'E7', 'Leeds', '']],
      [person({ employeeId: null })],
    );
    expect(byEmail.rows[0]).toMatchObject({ kind: 'update', changedFields: ['employeeId'] });
  });

  it('an e-mail match whose person has another id is a conflict, not an update (issue 13, item 9)', () => {
    const result = diff(
      [
        ['Ada', 'Pike', 'ADA@hp.example', 'E7', 'Leeds', ''],
        ['Bo', 'Lund', 'bo@hp.example', 'E2', 'Leeds', ''],
      ],
      [
        person({ active: false }),
        person({
          id: 'p2',
          givenName: 'Bo',
          familyName: 'Lund',
          email: 'bo@hp.example',
          employeeId: 'E2',
        }),
      ],
    );
    expect(result.rows.map((row) => row.kind)).toEqual(['conflict', 'unchanged']);
    const conflict = result.rows[0];
    expect(conflict).toMatchObject({ personId: 'p1', changedFields: ['employeeId', 'active'] });
    expect(conflict?.errors.employeeId).toBe(
      'This e-mail belongs to Ada Pike, whose employee id is E1; this row says E7. Correct the file, or confirm below that they are the same person.',
    );
    // The person is named by a row, so not "missing" either.
    expect(result.rows.some((row) => row.kind === 'missing')).toBe(false);
  });

  it('without a mapped id column an e-mail match is a plain update', () => {
    const withoutIds: ColumnMapping = [
      'givenName',
      'familyName',
      'email',
      'ignore',
      'office',
      'extra',
    ];
    const noIds = diffRoster(
      checkRows(headers, [['Ada', 'Pike-Moss', 'ada@hp.example', 'E7', 'Leeds', '']], withoutIds),
      [person({})],
      ['Leeds'],
      new Set<RosterField>(['givenName', 'familyName', 'email', 'office']),
      false,
    );
    expect(noIds.rows[0]).toMatchObject({ kind: 'update', changedFields: ['familyName'] });
  });

  it('reactivates an inactive person who is back, and never clears an unmapped field', () => {
    const result = diff(
      [['Ada', 'Pike', 'ada@hp.example', 'E1', 'Leeds', '']],
      [person({ active: false, department: 'Design' })],
    );
    expect(result.rows[0]).toMatchObject({ kind: 'update', changedFields: ['active'] });
    expect(result.rows[0]?.values.department).toBe('Design');
  });

  it('refuses a row whose e-mail belongs to someone else', () => {
    const result = diff(
      [['Ada', 'Pike', 'bo@hp.example', 'E1', 'Leeds', '']],
      [person({}), person({ id: 'p2', email: 'bo@hp.example', employeeId: 'E2' })],
    );
    expect(result.rows[0]?.kind).toBe('error');
    // Both people are named by a row (one in error), so neither is marked missing.
    expect(result.rows.filter((row) => row.kind === 'missing').map((row) => row.personId)).toEqual([
      'p2',
    ]);
  });
});

describe('a legacy-encoding file and names it cannot hold (issue 13, item 14)', () => {
  // Windows-1252 has no Ł (WHATWG Encoding, index-windows-1252): spreadsheet programs write it
  // as "?" or as a plain L (from memory).
  const lukasz = person({ givenName: 'Łukasz', familyName: 'Wróbel', email: 'lw@hp.example' });
  const legacy = (rows: string[][], existing: ExistingPerson[]) =>
    diffRoster(checkRows(headers, rows, mapping), existing, ['Leeds'], mapped, true, {
      legacyEncoding: true,
    });

  it('keeps the stored spelling and warns, whether the file says ?ukasz or Lukasz', () => {
    for (const spelling of ['?ukasz', 'Lukasz']) {
      const result = legacy([[spelling, 'Wróbel', 'lw@hp.example', 'E1', 'Leeds', '']], [lukasz]);
      expect(result.rows[0]).toMatchObject({ kind: 'unchanged', changedFields: [] });
      expect(result.rows[0]?.values.givenName).toBe('Łukasz');
      expect(result.rows[0]?.warnings.givenName).toMatch(
        /^Kept “Łukasz”: this file is Windows-1252/,
      );
    }
  });

  it('still applies a real change, and a UTF-8 file may change the spelling', () => {
    const renamed = legacy([['Luke', 'Wróbel', 'lw@hp.example', 'E1', 'Leeds', '']], [lukasz]);
    expect(renamed.rows[0]).toMatchObject({ kind: 'update', changedFields: ['givenName'] });
    const utf8 = diff([['Lukasz', 'Wróbel', 'lw@hp.example', 'E1', 'Leeds', '']], [lukasz]);
    expect(utf8.rows[0]).toMatchObject({ kind: 'update', changedFields: ['givenName'] });
    // Wróbel fits Windows-1252 (ó = 0xF3), so "Wrobel" is a real change there too.
    const plain = legacy([['Łukasz', 'Wrobel', 'lw@hp.example', 'E1', 'Leeds', '']], [lukasz]);
    expect(plain.rows[0]).toMatchObject({ kind: 'update', changedFields: ['familyName'] });
  });
});

describe('control characters removed at decode (issue 14, item 1)', () => {
  it('warn on the row, per field or extra column', () => {
    const checked = checkRows(
      headers,
      [['Ada', 'Pike', 'ada@hp.example', 'E1', 'Leeds', 'L']],
      mapping,
      [
        { row: 0, column: 0, removed: 1 },
        { row: 0, column: 5, removed: 2 },
      ],
    );
    expect(checked[0]?.warnings).toEqual({
      givenName: 'A control character (not allowed in text) was removed from this value.',
      Shirt: '2 control characters (not allowed in text) were removed from this value.',
    });
    const result = diffRoster(checked, [], ['Leeds'], mapped, true);
    expect(result.rows[0]?.warnings.givenName).toMatch(/removed/);
  });

  it('an empty e-mail cell says the e-mail is missing (issue 13, item 12)', () => {
    const checked = checkRows(headers, [['Ada', 'Pike', '  ', '', '', '']], mapping);
    expect(checked[0]?.errors.email).toBe('The e-mail is missing.');
  });
});

// The product's own rule (departments group people when inviting and in the figures); that
// letter case and doubled spaces do not make another name is common practice in HR systems.
describe('department spellings', () => {
  const withDepartment = ['First name', 'Last name', 'Email', 'Employee id', 'Department'];
  const departmentMapping: ColumnMapping = [
    'givenName',
    'familyName',
    'email',
    'employeeId',
    'department',
  ];
  const fields = new Set<RosterField>([
    'givenName',
    'familyName',
    'email',
    'employeeId',
    'department',
  ]);
  const run = (rows: string[][], existing: ExistingPerson[]) =>
    diffRoster(
      checkRows(withDepartment, rows, departmentMapping),
      existing,
      ['Leeds'],
      fields,
      false,
    );

  it('writes a department as the roster spells it most, and says so on the row', () => {
    const result = run(
      [
        ['Ada', 'Pike', 'ada@hp.example', 'E1', 'finance'],
        ['Bo', 'Lund', 'bo@hp.example', 'E2', 'FINANCE'],
        ['Cy', 'Moss', 'cy@hp.example', 'E3', 'Finance'],
      ],
      [
        person({ department: 'Finance' }),
        person({ id: 'p5', email: 'eve@hp.example', employeeId: 'E5', department: 'Finance' }),
        person({ id: 'p6', email: 'fay@hp.example', employeeId: 'E6', department: 'finance' }),
      ],
    );
    expect(result.rows.slice(0, 3).map((row) => row.values.department)).toEqual([
      'Finance',
      'Finance',
      'Finance',
    ]);
    // Ada keeps her department: only the letter case differed, so nothing changes.
    expect(result.rows[0]).toMatchObject({ kind: 'unchanged' });
    expect(result.rows[0]?.warnings.department).toBe(
      'Written “Finance”, as the roster spells this department.',
    );
    expect(result.rows[1]).toMatchObject({ kind: 'add' });
    expect(result.rows[2]?.warnings.department).toBeUndefined();
  });

  it('takes the first spelling within a file when the roster has none, white space folded', () => {
    const result = run(
      [
        ['Ada', 'Pike', 'ada@hp.example', 'E1', 'Human Resources'],
        ['Bo', 'Lund', 'bo@hp.example', 'E2', 'human  resources'],
        ['Cy', 'Moss', 'cy@hp.example', 'E3', 'Legal'],
      ],
      [],
    );
    expect(result.rows.map((row) => row.values.department)).toEqual([
      'Human Resources',
      'Human Resources',
      'Legal',
    ]);
    expect(result.rows[1]?.warnings.department).toBe(
      'Written “Human Resources”, as row 2 of this file spells this department.',
    );
    // The warning is the row's own: the other rows' records are untouched.
    expect(result.rows[0]?.warnings).toEqual({});
    expect(result.rows[2]?.warnings).toEqual({});
  });
});
