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
    const byEmail = diff([['Ada', 'Pike', 'ADA@hp.example', 'E7', 'Leeds', '']], [person({})]);
    expect(byEmail.rows[0]).toMatchObject({ kind: 'update', changedFields: ['employeeId'] });
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
