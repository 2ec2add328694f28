import Papa from 'papaparse';
import { AppError } from '../../lib/errors';

/** Limits the issue sets for one roster file. */
export const maxRosterBytes = 10 * 1024 * 1024;
export const maxRosterRows = 50_000;

export type RosterEncoding = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';
export type RosterDelimiter = ',' | ';' | '\t';

export interface ParsedRosterFile {
  encoding: RosterEncoding;
  hadByteOrderMark: boolean;
  delimiter: RosterDelimiter;
  headers: string[];
  /** Data rows, each padded or cut to the header's width. */
  rows: string[][];
}

const refuse = (code: string, message: string) => new AppError(code, 422, message);

function startsWith(bytes: Uint8Array, prefix: number[]): boolean {
  return prefix.every((value, index) => bytes[index] === value);
}

/**
 * Bytes to text. A byte order mark decides (UTF-8, UTF-16LE, UTF-16BE); without one the text
 * is UTF-8 if it decodes strictly as UTF-8, else Windows-1252, the usual spreadsheet export on
 * Windows (WHATWG Encoding names; TextDecoder decodes UTF-8 and UTF-16).
 */
export function decodeRosterBytes(bytes: Uint8Array): {
  text: string;
  encoding: RosterEncoding;
  hadByteOrderMark: boolean;
} {
  if (bytes.length === 0)
    throw refuse('empty_file', 'The file is empty. Choose the CSV export of your staff list.');
  if (bytes.length > maxRosterBytes) {
    throw refuse(
      'file_too_large',
      'The file is larger than 10 MB. Split it or remove unused columns, then try again.',
    );
  }
  if (startsWith(bytes, [0x50, 0x4b, 0x03, 0x04])) {
    throw refuse(
      'not_text',
      'This looks like a spreadsheet workbook, not a CSV file. Save it "as CSV" and upload that.',
    );
  }
  let decoded: { text: string; encoding: RosterEncoding; hadByteOrderMark: boolean };
  if (startsWith(bytes, [0xef, 0xbb, 0xbf])) {
    decoded = {
      text: decodeStrict('utf-8', bytes.subarray(3)),
      encoding: 'utf-8',
      hadByteOrderMark: true,
    };
  } else if (startsWith(bytes, [0xff, 0xfe])) {
    decoded = {
      text: decodeStrict('utf-16le', bytes.subarray(2)),
      encoding: 'utf-16le',
      hadByteOrderMark: true,
    };
  } else if (startsWith(bytes, [0xfe, 0xff])) {
    decoded = {
      text: decodeStrict('utf-16be', bytes.subarray(2)),
      encoding: 'utf-16be',
      hadByteOrderMark: true,
    };
  } else {
    try {
      decoded = {
        text: new TextDecoder('utf-8', { fatal: true }).decode(bytes),
        encoding: 'utf-8',
        hadByteOrderMark: false,
      };
    } catch {
      decoded = {
        text: decodeWindows1252(bytes),
        encoding: 'windows-1252',
        hadByteOrderMark: false,
      };
    }
  }
  if (looksBinary(decoded.text)) {
    throw refuse('not_text', 'This file is not text. Upload the staff list saved as CSV.');
  }
  return decoded;
}

/**
 * WHATWG index-windows-1252 for 0x80-0x9F; the other bytes equal their code points. Written
 * out because Node's TextDecoder treats the "windows-1252" label as Latin-1 for these bytes.
 */
const windows1252High = [
  0x20ac, 0x81, 0x201a, 0x192, 0x201e, 0x2026, 0x2020, 0x2021, 0x2c6, 0x2030, 0x160, 0x2039, 0x152,
  0x8d, 0x17d, 0x8f, 0x90, 0x2018, 0x2019, 0x201c, 0x201d, 0x2022, 0x2013, 0x2014, 0x2dc, 0x2122,
  0x161, 0x203a, 0x153, 0x9d, 0x17e, 0x178,
];

export function decodeWindows1252(bytes: Uint8Array): string {
  const chunks: string[] = [];
  for (let start = 0; start < bytes.length; start += 8192) {
    const codes = Array.from(bytes.subarray(start, start + 8192), (byte) =>
      byte >= 0x80 && byte <= 0x9f ? (windows1252High[byte - 0x80] ?? byte) : byte,
    );
    chunks.push(String.fromCharCode(...codes));
  }
  return chunks.join('');
}

function decodeStrict(encoding: 'utf-8' | 'utf-16le' | 'utf-16be', bytes: Uint8Array): string {
  try {
    return new TextDecoder(encoding, { fatal: true }).decode(bytes);
  } catch {
    throw refuse(
      'not_text',
      `The file starts like ${encoding.toUpperCase()} text but is not. Save it as CSV again and retry.`,
    );
  }
}

/** Text files hold no NUL and few control characters; binary files hold many. */
function looksBinary(text: string): boolean {
  const sample = text.slice(0, 64 * 1024);
  if (sample.includes('\u0000')) return true;
  let controls = 0;
  for (let index = 0; index < sample.length; index += 1) {
    const code = sample.charCodeAt(index);
    if (code < 32 && code !== 9 && code !== 10 && code !== 13) controls += 1;
  }
  return controls > sample.length / 100;
}

const candidates: RosterDelimiter[] = [',', ';', '\t'];

/**
 * The separator that splits the first lines into the most columns, consistently. Spreadsheets
 * in locales with a decimal comma write `;` (common practice); HR tools also write tabs.
 */
export function detectDelimiter(text: string): RosterDelimiter {
  let best: { delimiter: RosterDelimiter; score: number } = { delimiter: ',', score: 0 };
  for (const delimiter of candidates) {
    const sample = Papa.parse<string[]>(text, { delimiter, preview: 20, skipEmptyLines: 'greedy' });
    const widths = sample.data.map((row) => row.length);
    const headerWidth = widths[0] ?? 0;
    if (headerWidth < 2) continue;
    const consistent = widths.filter((width) => width === headerWidth).length / widths.length;
    const score = headerWidth * consistent;
    if (score > best.score) best = { delimiter, score };
  }
  return best.delimiter;
}

const emailLike = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

/** RFC 4180 records (quoted separators, doubled quotes, line breaks inside quotes) via papaparse. */
export function parseRosterText(
  text: string,
): Omit<ParsedRosterFile, 'encoding' | 'hadByteOrderMark'> {
  // A stray BOM left inside UTF-8 text (double-saved files) would stick to the first header.
  const clean = text.replace(/^\uFEFF/, '');
  if (clean.trim() === '')
    throw refuse('empty_file', 'The file has no rows. Choose the CSV export of your staff list.');
  const delimiter = detectDelimiter(clean);
  const result = Papa.parse<string[]>(clean, { delimiter, skipEmptyLines: 'greedy' });
  const unterminated = result.errors.find((error) => error.code === 'MissingQuotes');
  if (unterminated) {
    throw refuse(
      'bad_quotes',
      `A quoted value starting on row ${(unterminated.row ?? 0) + 1} never ends. Check the quotation marks there.`,
    );
  }
  const [headerRow, ...dataRows] = result.data;
  const headers = (headerRow ?? []).map((cell) => cell.trim());
  const named = headers.filter((header) => header !== '');
  if (
    named.length === 0 ||
    headers.some((header) => emailLike.test(header)) ||
    named.every((header) => /^[\d\s.,+-]+$/.test(header))
  ) {
    throw refuse(
      'no_header',
      'The first row must name the columns (for example "First name", "E-mail"). Add a header row and upload again.',
    );
  }
  if (dataRows.length === 0)
    throw refuse('empty_file', 'The file has a header row but no people under it.');
  if (dataRows.length > maxRosterRows) {
    throw refuse(
      'too_many_rows',
      `The file has ${dataRows.length.toLocaleString('en')} rows; one import takes at most 50,000.`,
    );
  }
  const width = headers.length;
  const rows = dataRows.map((row) => {
    const cells = row.slice(0, width).map(readBackNeutralised);
    while (cells.length < width) cells.push('');
    return cells;
  });
  return { delimiter, headers, rows };
}

/** A cell our own export neutralised (OWASP CSV Injection: a leading ') reads back as it was. */
export function readBackNeutralised(cell: string): string {
  return /^'[=+\-@\t\r]/.test(cell) ? cell.slice(1) : cell;
}

export function parseRosterFile(bytes: Uint8Array): ParsedRosterFile {
  const decoded = decodeRosterBytes(bytes);
  return {
    encoding: decoded.encoding,
    hadByteOrderMark: decoded.hadByteOrderMark,
    ...parseRosterText(decoded.text),
  };
}
