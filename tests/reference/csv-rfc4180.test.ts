import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import {
  decodeRosterBytes,
  parseRosterFile,
  parseRosterText,
} from '../../server/modules/roster/csv-decode';

const utf8 = (text: string) => new TextEncoder().encode(text);

function utf16(text: string, endian: 'le' | 'be', bom = true): Uint8Array {
  const bytes: number[] = bom ? (endian === 'le' ? [0xff, 0xfe] : [0xfe, 0xff]) : [];
  for (let index = 0; index < text.length; index += 1) {
    const unit = text.charCodeAt(index);
    const pair = [unit & 0xff, unit >> 8];
    bytes.push(...(endian === 'le' ? pair : pair.reverse()));
  }
  return new Uint8Array(bytes);
}

const sample = 'First name,Last name,E-mail\r\nZoë,Müller,zoe@halvorsen-pike.example\r\n';

describe('RFC 4180 records', () => {
  it('RFC 4180 §2.6: a quoted field may hold the separator', () => {
    const parsed = parseRosterText('Name,Dept\r\n"Pike, Ada","Design, Leeds"\r\n');
    expect(parsed.rows).toEqual([['Pike, Ada', 'Design, Leeds']]);
  });

  it('RFC 4180 §2.7: a doubled quote inside a quoted field is one quote', () => {
    const parsed = parseRosterText('Name,Title\r\n"Ada ""Ace"" Pike","b""bb"\r\n');
    expect(parsed.rows).toEqual([['Ada "Ace" Pike', 'b"bb']]);
  });

  it('RFC 4180 §2.6: a quoted field may hold CRLF line breaks', () => {
    const parsed = parseRosterText('Name,Note\r\n"Ada","line one\r\nline two"\r\nBo,x\r\n');
    expect(parsed.rows).toEqual([
      ['Ada', 'line one\r\nline two'],
      ['Bo', 'x'],
    ]);
  });

  it('RFC 4180 §2.2: the last record may lack its line break; LF-only files read the same', () => {
    expect(parseRosterText('A,B\r\n1,2').rows).toEqual([['1', '2']]);
    expect(parseRosterText('A,B\n1,2\n').rows).toEqual([['1', '2']]);
  });

  it('RFC 4180 §2.3: the first record is the header', () => {
    const parsed = parseRosterText('Given,Family,E-mail\r\nAda,Pike,ada@x.example\r\n');
    expect(parsed.headers).toEqual(['Given', 'Family', 'E-mail']);
    expect(parsed.rows).toEqual([['Ada', 'Pike', 'ada@x.example']]);
  });

  // §2.4 says each line should hold the same number of fields. HR exports drop trailing empty
  // cells, so padding a short row with empty fields is our own leniency, not the RFC's rule.
  it('RFC 4180 §2.4 wants equal field counts; padding a short row to the header is our leniency', () => {
    const parsed = parseRosterText('A,B,C\r\n1\r\n');
    expect(parsed.headers).toEqual(['A', 'B', 'C']);
    expect(parsed.rows).toEqual([['1', '', '']]);
  });

  it('agrees with papaparse read independently, for a tricky RFC 4180 record', () => {
    const text = 'A,B,C\r\n"x,""y""","a\nb",plain\r\n';
    const independent = Papa.parse<string[]>(text, { delimiter: ',', skipEmptyLines: true });
    expect(parseRosterText(text).rows).toEqual(independent.data.slice(1));
  });

  it('detects ";" and tab separators (common practice in decimal-comma locales)', () => {
    const semicolon = parseRosterText('Vorname;Nachname;E-Mail\r\n"Pike; A.";B;c@x.example\r\n');
    expect(semicolon.delimiter).toBe(';');
    expect(semicolon.rows).toEqual([['Pike; A.', 'B', 'c@x.example']]);
    const tab = parseRosterText('A\tB\tC\r\n1,5\t2\t3\r\n');
    expect(tab.delimiter).toBe('\t');
    expect(tab.rows).toEqual([['1,5', '2', '3']]);
  });

  it('refuses an unterminated quoted field with the row to look at', () => {
    expect(() => parseRosterText('A,B\r\n1,"open\r\n')).toThrow(/never ends/);
  });
});

describe('encodings (WHATWG Encoding, checked with TextDecoder)', () => {
  const expectSample = (bytes: Uint8Array, encoding: string, bom: boolean) => {
    const parsed = parseRosterFile(bytes);
    expect(parsed.encoding).toBe(encoding);
    expect(parsed.hadByteOrderMark).toBe(bom);
    expect(parsed.headers).toEqual(['First name', 'Last name', 'E-mail']);
    expect(parsed.rows).toEqual([['Zoë', 'Müller', 'zoe@halvorsen-pike.example']]);
  };

  it('UTF-8 without BOM', () => expectSample(utf8(sample), 'utf-8', false));

  it('UTF-8 with BOM: the BOM does not stick to the first header', () =>
    expectSample(new Uint8Array([0xef, 0xbb, 0xbf, ...utf8(sample)]), 'utf-8', true));

  it('UTF-16LE with BOM', () => expectSample(utf16(sample, 'le'), 'utf-16le', true));

  it('UTF-16BE with BOM', () => expectSample(utf16(sample, 'be'), 'utf-16be', true));

  it('Windows-1252 (ë = 0xEB, ü = 0xFC, € = 0x80 per the WHATWG index)', () => {
    const bytes = new Uint8Array(
      [...sample].map((char) => ({ ë: 0xeb, ü: 0xfc })[char] ?? char.charCodeAt(0)),
    );
    expectSample(bytes, 'windows-1252', false);
    // WHATWG Encoding, index-windows-1252: 0x80 -> U+20AC, 0x92 -> U+2019, 0x9F -> U+0178,
    // 0x81 (unassigned in the code page) -> U+0081.
    expect(decodeRosterBytes(new Uint8Array([0x80, 0x92, 0x9f, 0x81, 0xe9])).text).toBe(
      '\u20ac\u2019\u0178\u0081\u00e9',
    );
  });

  it('a UTF-8 BOM in front of text decodes like TextDecoder does', () => {
    const bytes = new Uint8Array([0xef, 0xbb, 0xbf, ...utf8('Ä,B\r\n1,2\r\n')]);
    expect(decodeRosterBytes(bytes).text).toBe(new TextDecoder('utf-8').decode(bytes));
  });
});

describe('refusals say what to do', () => {
  it('an empty file', () => {
    expect(() => parseRosterFile(new Uint8Array())).toThrow(/empty/);
    expect(() => parseRosterFile(utf8('\r\n\r\n'))).toThrow(/no rows/);
  });

  it('a file that is not text (NUL bytes, a spreadsheet workbook)', () => {
    expect(() => parseRosterFile(new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0, 0, 1, 2]))).toThrow(
      /not text/,
    );
    expect(() => parseRosterFile(new Uint8Array([0x50, 0x4b, 0x03, 0x04, 1, 2]))).toThrow(
      /workbook/,
    );
  });

  it('a file over 10 MB', () => {
    expect(() => parseRosterFile(new Uint8Array(10 * 1024 * 1024 + 1).fill(65))).toThrow(/10 MB/);
  });

  it('a file over 50,000 rows', () => {
    const text = `A,B\r\n${'x,y\r\n'.repeat(50_001)}`;
    expect(() => parseRosterText(text)).toThrow(/at most 50,000/);
    expect(parseRosterText(`A,B\r\n${'x,y\r\n'.repeat(50_000)}`).rows).toHaveLength(50_000);
  });

  it('a file with no header row', () => {
    expect(() => parseRosterText('Ada,Pike,ada@x.example\r\nBo,Lund,bo@x.example\r\n')).toThrow(
      /first row must name the columns/,
    );
    expect(() => parseRosterText('1,2\r\n3,4\r\n')).toThrow(/first row must name/);
  });
});
