import { z } from 'zod';
import { describe, expect, it } from 'vitest';
import { checkRows } from '../../server/modules/roster/roster-rows';
import { rosterRowSchema, type ColumnMapping } from '../../server/schemas/roster';

// checkRows takes plain cells without zod and runs rosterRowSchema field by field on the rest
// (the e-mail against zod's own pattern, z.regexes.email). The check here is
// the schema itself, whole: for every row, the object parse of the same cells must give the
// same values, or the same first message per field.

const headers = ['Given', 'Family', 'Mail', 'Id', 'Dept', 'Title', 'Office', 'Badge colour'];
const mapping: ColumnMapping = [
  'givenName',
  'familyName',
  'email',
  'employeeId',
  'department',
  'jobTitle',
  'office',
  'extra',
];
const fields = mapping.filter((target) => target !== 'extra');

// Cells of every kind the schema treats apart: blank, padded, too long, odd e-mails, repeats.
const cellsOf = {
  givenName: [
    'Ines',
    '  Tom ',
    '',
    '   ',
    'x'.repeat(200),
    'y'.repeat(201),
    'Ines',
    '\u00a0Ada\u00a0',
    ` ${'v'.repeat(200)}  `,
    // 150 and 201 code points of two UTF-16 units each: zod counts code points.
    '\u{1d518}'.repeat(150),
    '\u{1d518}'.repeat(201),
  ],
  familyName: ['Carvalho', 'de Vries', '', 'Ørnbjerg ', 'z'.repeat(201)],
  email: [
    'ines@hp.example',
    ' TOM@HP.EXAMPLE ',
    '',
    'not-an-address',
    'a@b',
    'ines@hp.example',
    'Ada.Pike@HP.example',
    '.ada@hp.example',
    'ï@hp.example',
    '\u00a0bo@hp.example\u00a0',
    'bo@hp..example',
  ],
  employeeId: ['HP-1', '', '  ', ' HP-2 ', 'q'.repeat(201)],
  department: ['Design', '', 'Design', ' Civil'],
  jobTitle: ['Engineer', '', 'w'.repeat(201)],
  office: ['Leeds', '', ' Porto '],
};

function rows(count: number): string[][] {
  // A fixed walk through the cells (co-prime steps), so every pairing turns up.
  const steps = [1, 2, 3, 5, 7, 11, 13];
  return Array.from({ length: count }, (_, index) => [
    ...fields.map((field, column) => {
      const cells = cellsOf[field as keyof typeof cellsOf];
      return cells[(index * (steps[column] ?? 1)) % cells.length] ?? '';
    }),
    index % 3 === 0 ? '' : 'teal',
  ]);
}

describe('checkRows against rosterRowSchema parsed whole', () => {
  it('gives the values or the first message per field that the object parse gives', () => {
    const input = rows(600);
    const checked = checkRows(headers, input, mapping);
    let valid = 0;
    input.forEach((cells, index) => {
      const row = checked[index];
      const whole = rosterRowSchema.safeParse(
        Object.fromEntries(fields.map((field, column) => [field, cells[column]])),
      );
      if (whole.success) {
        valid += 1;
        // Repeats inside the file are checkRows' own rule on top of the schema.
        if (row?.row === null) expect(Object.keys(row.errors)).not.toHaveLength(0);
        else expect(row?.row).toEqual(whole.data);
        return;
      }
      const expected: Record<string, string> = {};
      for (const [field, messages] of Object.entries(z.flattenError(whole.error).fieldErrors)) {
        const first = (messages as string[] | undefined)?.[0];
        if (first) expected[field] = first;
      }
      // checkRows' own wording for a blank required cell in a file (see roster-rows.ts).
      if (expected.email && (cells[2] ?? '').trim() === '')
        expected.email = 'The e-mail is missing.';
      if (expected.givenName && (cells[0] ?? '').trim() === '')
        expected.givenName = 'The given name is missing.';
      if (expected.familyName && (cells[1] ?? '').trim() === '')
        expected.familyName = 'The family name is missing.';
      expect(row?.row).toBeNull();
      expect(row?.errors).toEqual(expected);
    });
    expect(valid).toBeGreaterThan(20);
    expect(valid).toBeLessThan(580);
  });

  it('a field left unmapped is checked as missing, like a form without it', () => {
    const withoutOffice = mapping.map((target) => (target === 'office' ? 'ignore' : target));
    const [row] = checkRows(
      headers,
      [['Ada', 'Pike', 'ada@hp.example', '', '', '', 'Leeds', '']],
      withoutOffice,
    );
    expect(row?.row).toEqual(
      rosterRowSchema.parse({
        givenName: 'Ada',
        familyName: 'Pike',
        email: 'ada@hp.example',
        employeeId: '',
        department: '',
        jobTitle: '',
      }),
    );
    expect(row?.row?.office).toBeNull();
  });

  it('rows without extras or errors share nothing a later change could leak between them', () => {
    const valid = Array.from({ length: 5 }, (_, index) => [
      'Ada',
      `Pike-${index}`,
      `ada.${index}@hp.example`,
      `HP-${index}`,
      'Design',
      'Engineer',
      'Leeds',
      '',
    ]);
    const checked = checkRows(headers, valid, mapping);
    const clean = checked.filter((row) => Object.keys(row.errors).length === 0);
    expect(clean).toHaveLength(5);
    expect(() => {
      (clean[0] as { errors: Record<string, string> }).errors.email = 'changed';
    }).toThrow(TypeError);
    expect(clean[1]?.errors).toEqual({});
  });
});

describe('line breaks inside a quoted cell (RFC 4180, section 2, rule 6)', () => {
  it('become one space in a one-line field, with a warning on it', () => {
    const [row] = checkRows(
      ['First name', 'Last name', 'E-mail', 'Job title'],
      [['Mary\nJane', 'Quill', 'mj.quill@hp.example', 'Engineer\r\n  Level 2']],
      ['givenName', 'familyName', 'email', 'jobTitle'],
    );
    expect(row?.row).toMatchObject({ givenName: 'Mary Jane', jobTitle: 'Engineer Level 2' });
    expect(row?.warnings).toEqual({
      givenName: 'The line break in this value was made a space.',
      jobTitle: 'The line break in this value was made a space.',
    });
  });
});
