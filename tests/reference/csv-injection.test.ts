import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { neutraliseCell, quoteCell, toCsv, toCsvRecord } from '../../server/lib/csv';
import { parseRosterFile } from '../../server/modules/roster/csv-decode';

describe('OWASP CSV Injection: cells that start a formula are neutralised', () => {
  // OWASP CSV Injection (and ASVS 5.0 1.2.10): = + - @ TAB CR at the start get a leading '.
  for (const [input, expected] of [
    ['=1+2', "'=1+2"],
    ['+44 20 7946 0000', "'+44 20 7946 0000"],
    ['-2+3', "'-2+3"],
    ['@SUM(A1)', "'@SUM(A1)"],
    ['\tcmd', "'\tcmd"],
    ['\rcmd', "'\rcmd"],
  ] as const) {
    it(`OWASP CSV Injection: ${JSON.stringify(input)} -> ${JSON.stringify(expected)}`, () => {
      expect(neutraliseCell(input)).toBe(expected);
    });
  }

  it('OWASP CSV Injection: ordinary text and inner formula characters are left alone', () => {
    for (const value of ['Ada', 'a=b', 'x+y', 'ada@example.com', '', ' =1']) {
      expect(neutraliseCell(value)).toBe(value);
    }
  });
});

describe('RFC 4180 quoting of exported records', () => {
  it('RFC 4180 §2.6/2.7: quotes fields with , " CR LF and doubles inner quotes', () => {
    expect(quoteCell('a,b')).toBe('"a,b"');
    expect(quoteCell('b"bb')).toBe('"b""bb"');
    expect(quoteCell('two\r\nlines')).toBe('"two\r\nlines"');
    expect(quoteCell('plain')).toBe('plain');
  });

  it('RFC 4180 §2.1: records end in CRLF; the file starts with a UTF-8 BOM for spreadsheets', () => {
    const csv = toCsv([
      ['A', 'B'],
      ['1', '2'],
    ]);
    expect(csv).toBe('\uFEFFA,B\r\n1,2\r\n');
  });

  it('a neutralised cell that also needs quotes is neutralised, then quoted', () => {
    expect(toCsvRecord(['=HYPERLINK("x")'])).toBe('"\'=HYPERLINK(""x"")"');
  });

  it('an independent parser (papaparse) reads back exactly the neutralised text', () => {
    const cells = ['Pike, Ada', 'say "hi"', '=cmd', 'line\nbreak', '+44 20 7946 0000'];
    const parsed = Papa.parse<string[]>(toCsv([cells]).slice(1), { skipEmptyLines: true });
    expect(parsed.data[0]).toEqual(cells.map(neutraliseCell));
  });

  it('our import reads our export back to the original values', () => {
    const cells = ['Given name', 'Phone'];
    const values = ['Ada', '+44 20 7946 0000'];
    const bytes = new TextEncoder().encode(toCsv([cells, values]));
    expect(parseRosterFile(bytes).rows).toEqual([values]);
  });
});
