import { describe, expect, it } from 'vitest';
import { decodeMostlyUtf8 } from '../../server/modules/roster/mixed-utf8';
import { checkRows } from '../../server/modules/roster/roster-rows';
import Papa from 'papaparse';
import {
  cleanCell,
  detectDelimiter,
  lineBreakOf,
  maxCellCharacters,
  parseRosterFile,
  parseRosterText,
} from '../../server/modules/roster/csv-decode';
import {
  decodeWindows1252,
  encodeWindows1252,
  isWindows1252Copy,
} from '../../server/modules/roster/windows-1252';

const utf8 = (text: string) => new TextEncoder().encode(text);

describe('control characters in cells (issue 14, item 1)', () => {
  it('removes NUL, other C0 controls, DEL and C1, keeping tab and line breaks', () => {
    expect(cleanCell('A\u0000d\u0007a\u007f\u0085')).toEqual({ value: 'Ada', removed: 4 });
    // A separator between words (vertical tab, form feed, the information separators, next
    // line; their names and code points as in ECMA-48 / ISO 6429's C0 and C1 sets, from
    // memory) stands where a space or line break was: it leaves one space (common practice of
    // spreadsheet exports, which write a cell's line break as a vertical tab).
    expect(cleanCell('Marine\u000bWorks')).toEqual({ value: 'Marine Works', removed: 1 });
    expect(cleanCell('Marine \u000c\u001e Works')).toEqual({ value: 'Marine Works', removed: 2 });
    expect(cleanCell('\u000bDesign\u001f')).toEqual({ value: 'Design', removed: 2 });
    expect(cleanCell('Jo\u0000hn')).toEqual({ value: 'John', removed: 1 });
    // NUL and the like go first, so they neither make nor keep a space.
    expect(cleanCell('\u0000\u000bBo')).toEqual({ value: 'Bo', removed: 2 });
    expect(cleanCell('Ada \u0000\u000b Pike')).toEqual({ value: 'Ada Pike', removed: 2 });
    expect(cleanCell('\u001c\u001cBo\u001d')).toEqual({ value: 'Bo', removed: 3 });
    expect(cleanCell('two\r\nlines\tand a tab')).toEqual({
      value: 'two\r\nlines\tand a tab',
      removed: 0,
    });
  });

  it('a NUL in a cell is stripped with a warning instead of refusing the file as binary', () => {
    const parsed = parseRosterFile(
      utf8('First name,Last name,E-mail,Note\r\nA\u0000da,Pike,ada@x.example,ok\u0001\u0002\r\n'),
    );
    expect(parsed.rows).toEqual([['Ada', 'Pike', 'ada@x.example', 'ok']]);
    expect(parsed.warnings).toEqual([
      { row: 0, column: 0, removed: 1 },
      { row: 0, column: 3, removed: 2 },
    ]);
  });

  it('a header cell loses its control characters too', () => {
    expect(parseRosterText('E-mail\u0000,Name\r\na@x.example,A\r\n').headers).toEqual([
      'E-mail',
      'Name',
    ]);
  });
});

describe('shape limits at decode (issue 14, item 11)', () => {
  it('refuses a header of more than 200 columns, saying how many there are', () => {
    const header = Array.from({ length: 201 }, (_, index) => `C${index}`).join(',');
    expect(() => parseRosterText(`${header}\r\n1\r\n`)).toThrow(
      'The header row has 201 columns; a staff list may have at most 200. Remove the columns you do not need and upload again.',
    );
    const widest = Array.from({ length: 200 }, (_, index) => `C${index}`).join(',');
    expect(parseRosterText(`${widest}\r\n1\r\n`).headers).toHaveLength(200);
  });

  it('refuses a cell longer than 2,000 characters, naming its row and column', () => {
    const long = 'x'.repeat(maxCellCharacters + 1);
    expect(() => parseRosterText(`Name,Note\r\nAda,ok\r\nBo,${long}\r\n`)).toThrow(
      'Row 3, column "Note" holds 2,001 characters; a value may hold at most 2,000. Shorten it and upload again.',
    );
    expect(parseRosterText(`Name,Note\r\nAda,${'x'.repeat(2000)}\r\n`).rows[0]?.[1]).toHaveLength(
      2000,
    );
  });

  it('cuts cells beyond the header width as it reads, so a wide data row costs nothing', () => {
    const wide = Array.from({ length: 100_000 }, () => 'z').join(',');
    expect(parseRosterText(`A,B\r\n${wide}\r\n`).rows).toEqual([['z', 'z']]);
  });
});

describe('Windows-1252 writing (WHATWG Encoding, index-windows-1252)', () => {
  it('encodes the bytes the index names and reads back what it wrote', () => {
    // index-windows-1252: 0x80 € (U+20AC), 0x92 ’ (U+2019), 0x9F Ÿ (U+0178); 0xE9 é.
    expect([...encodeWindows1252('€’Ÿé')]).toEqual([0x80, 0x92, 0x9f, 0xe9]);
    const every = Array.from({ length: 256 }, (_, byte) => byte);
    expect([...encodeWindows1252(decodeWindows1252(new Uint8Array(every)))]).toEqual(every);
  });

  it('writes a character the code page lacks as "?"', () => {
    expect(new TextDecoder('ascii').decode(encodeWindows1252('Łukasz'))).toBe('?ukasz');
  });

  it('tells a lossy copy of a stored name from a real change', () => {
    expect(isWindows1252Copy('Łukasz', '?ukasz')).toBe(true);
    expect(isWindows1252Copy('Łukasz', 'Lukasz')).toBe(true);
    expect(isWindows1252Copy('Dvořák', 'Dvorák')).toBe(true);
    expect(isWindows1252Copy('Łukasz', 'Luke')).toBe(false);
    // The stored name fits the code page: a different spelling is a real change.
    expect(isWindows1252Copy('Zoë', 'Zoe')).toBe(false);
  });
});

describe('a UTF-8 file with a few Windows-1252 bytes pasted in', () => {
  const file = (...parts: (string | number[])[]) =>
    new Uint8Array(parts.flatMap((part) => (typeof part === 'string' ? [...utf8(part)] : part)));

  it('reads the UTF-8 as UTF-8 and each stray byte as its Windows-1252 character, with a warning on its cell', () => {
    // 0xE9 is "é" in index-windows-1252 (WHATWG Encoding); "ç" is C3 A7 in UTF-8.
    const bytes = file(
      'First name,Last name,E-mail\r\nGonçalo,Ferraz,g.ferraz@hp.example\r\nRen',
      [0xe9],
      ',Aubry,r.aubry@hp.example\r\n',
    );
    const parsed = parseRosterFile(bytes);
    expect(parsed.encoding).toBe('utf-8');
    expect(parsed.rows.map((row) => row[0])).toEqual(['Gonçalo', 'René']);
    expect(parsed.warnings).toEqual([{ row: 1, column: 0, strayBytes: 1 }]);
    const [, rene] = checkRows(
      parsed.headers,
      parsed.rows,
      ['givenName', 'familyName', 'email'],
      parsed.warnings,
    );
    expect(rene?.warnings.givenName).toMatch(/not UTF-8 like the rest of the file/);
  });

  it('a file with no UTF-8 sequence at all is still read as Windows-1252', () => {
    const parsed = parseRosterFile(file('First name,E-mail\r\nRen', [0xe9], ',r@hp.example\r\n'));
    expect(parsed.encoding).toBe('windows-1252');
    expect(parsed.rows[0]?.[0]).toBe('René');
    expect(parsed.warnings).toEqual([]);
  });

  it('tells well-formed UTF-8 from stray bytes as the WHATWG decoder does (TextDecoder, fatal)', () => {
    // Overlong forms, surrogates, lone continuation bytes, truncated sequences, F5 and above.
    const pieces = [
      0x41, 0x80, 0xbf, 0xc0, 0xc2, 0xdf, 0xe0, 0xa0, 0xed, 0x9f, 0xf0, 0x90, 0xf4, 0x8f, 0xf5,
      0xff,
    ];
    let seed = 7;
    const next = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31);
    for (let trial = 0; trial < 3000; trial += 1) {
      const tail = Array.from(
        { length: 1 + (next() % 6) },
        () => pieces[next() % pieces.length] ?? 0,
      );
      const bytes = new Uint8Array([0xc3, 0xa7, ...tail]);
      const mixed = decodeMostlyUtf8(bytes);
      let whatwg: string | null = null;
      try {
        whatwg = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
      } catch {
        whatwg = null;
      }
      expect(mixed?.strayBytes === 0, `bytes ${tail.map((byte) => byte.toString(16))}`).toBe(
        whatwg !== null,
      );
      if (whatwg !== null) expect(mixed?.text).toBe(whatwg);
    }
  });
});

describe('lines above the header', () => {
  it('passes over a title line and a "sep=" line, and numbers the rows as a spreadsheet does', () => {
    // Row numbers: one spreadsheet row per RFC 4180 record (common practice).
    const titled = parseRosterText(
      // A spreadsheet quotes the title's comma: one value in its row.
      '"Staff export, 1 December",,\r\n\r\nFirst name,Last name,E-mail\r\nAda,Quill,ada@hp.example\r\n',
    );
    expect(titled.headers).toEqual(['First name', 'Last name', 'E-mail']);
    expect(titled.rowNumbers).toEqual([4]);
    // "sep=;" names the separator (common practice in files written for spreadsheets).
    const hinted = parseRosterText(
      'sep=;\r\nFirst name;Last name;E-mail\r\nAda;Quill;a@hp.example\r\n',
    );
    expect([hinted.delimiter, hinted.rows]).toEqual([';', [['Ada', 'Quill', 'a@hp.example']]]);
  });

  it("reads a number kept as text with a leading ' as the number, and leaves other apostrophes", () => {
    const parsed = parseRosterText("First name,Last name,Id\r\n'Apo,Quill,'00123\r\n");
    expect(parsed.rows).toEqual([["'Apo", 'Quill', '00123']]);
  });
});

describe('the separator and the header, read from the first lines of a long file', () => {
  const header = 'First name;Last name;E-mail';
  const row = (index: number) => `Ada;Quill-${index};ada.${index}@hp.example`;

  it('reads the line break as papaparse guesses it for the whole text, for each kind', () => {
    // papaparse (an independent CSV library) on the whole text is the reference.
    for (const newline of ['\r\n', '\n', '\r']) {
      const text = [header, ...Array.from({ length: 300 }, (_, index) => row(index))].join(newline);
      expect(lineBreakOf(text)).toBe(Papa.parse(text).meta.linebreak);
      expect(lineBreakOf(text)).toBe(newline);
      const parsed = parseRosterText(text);
      expect([parsed.delimiter, parsed.rows.length, parsed.rows[299]]).toEqual([
        ';',
        300,
        ['Ada', 'Quill-299', 'ada.299@hp.example'],
      ]);
    }
  });

  it('finds a header below more blank lines than it first looks at, numbered as before', () => {
    // Comma-separated: the separator is looked for among the first 20 lines, blank or not.
    const text = `${'\r\n'.repeat(250)}First name,Last name,E-mail\r\nAda,Quill,a@hp.example\r\n`;
    const parsed = parseRosterText(text);
    expect(parsed.headers).toEqual(['First name', 'Last name', 'E-mail']);
    expect(parsed.rowNumbers).toEqual([252]);
  });

  it('reads a header whole when a quoted line break carries it past those lines', () => {
    // The 200th line ends inside the quotes: cut there, the header would be two values long.
    const text = `${'\r\n'.repeat(199)}First name,"Last\r\nname",E-mail\r\nAda,Quill,a@hp.example\r\n`;
    // Whole: the quoted line break is part of the first header, not its end.
    expect(parseRosterText(text).headers).toEqual(['First name', 'Last\r\nname', 'E-mail']);
  });

  it('finds the separator when the first 20 records run past those lines', () => {
    // Each record holds 20 line breaks: the first 20 records end far past line 200.
    const note = `"${'line\n'.repeat(20)}end"`;
    const records = Array.from({ length: 30 }, (_, index) => `${row(index)};${note}`);
    const text = [`${header};Note`, ...records].join('\r\n');
    expect(detectDelimiter(text)).toBe(';');
    expect(parseRosterText(text).rows).toHaveLength(30);
  });
});
