import Papa from 'papaparse';
import type { DecodeWarning } from '../../db/roster-types';
import { AppError } from '../../lib/errors';
import { decodeMostlyUtf8, legacyMark } from './mixed-utf8';
import { decodeWindows1252 } from './windows-1252';

export { decodeWindows1252 } from './windows-1252';

/** Limits the issue sets for one roster file. */
export const maxRosterBytes = 10 * 1024 * 1024;
export const maxRosterRows = 50_000;
/** Wider or longer than any staff list: refused before it costs memory (the hardening issue). */
export const maxRosterColumns = 200;
export const maxCellCharacters = 2000;

export type RosterEncoding = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';
export type RosterDelimiter = ',' | ';' | '\t';

export interface ParsedRosterFile {
  encoding: RosterEncoding;
  hadByteOrderMark: boolean;
  delimiter: RosterDelimiter;
  headers: string[];
  /** Data rows, each padded or cut to the header's width. */
  rows: string[][];
  /**
   * Each data row's row in the file as a spreadsheet shows it (the header is row 1, blank lines
   * count); null when that is simply its index plus 2.
   */
  rowNumbers: number[] | null;
  /** Cells from which control characters were removed; rows with values past the header. */
  warnings: DecodeWarning[];
}

const refuse = (code: string, message: string) => new AppError(code, 422, message);

function startsWith(bytes: Uint8Array, prefix: number[]): boolean {
  return prefix.every((value, index) => bytes[index] === value);
}

/**
 * Bytes to text. A byte order mark decides (UTF-8, UTF-16LE, UTF-16BE); without one the text
 * is UTF-8 if it decodes strictly as UTF-8, UTF-8 with its stray bytes read as Windows-1252 if
 * it holds any multi-byte UTF-8 (see decodeMostlyUtf8), else Windows-1252, the usual
 * spreadsheet export on Windows (WHATWG Encoding names; TextDecoder decodes UTF-8 and UTF-16).
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
      // Mostly UTF-8 with a few stray bytes is UTF-8 with those bytes warned about: reading it
      // all as Windows-1252 would turn every "ç" of the file into "Ã§".
      const mixed = decodeMostlyUtf8(bytes);
      decoded = {
        text: mixed ? mixed.text : decodeWindows1252(bytes),
        encoding: mixed ? 'utf-8' : 'windows-1252',
        hadByteOrderMark: false,
      };
    }
  }
  if (looksBinary(decoded.text)) {
    throw refuse('not_text', 'This file is not text. Upload the staff list saved as CSV.');
  }
  return decoded;
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

/**
 * Binary files hold many control characters (NUL included); text files few. A stray one in a
 * text file is removed from its cell with a warning instead (see cleanCell).
 */
function looksBinary(text: string): boolean {
  const sample = text.slice(0, 64 * 1024);
  let controls = 0;
  for (let index = 0; index < sample.length; index += 1) {
    const code = sample.charCodeAt(index);
    if (code < 32 && code !== 9 && code !== 10 && code !== 13) controls += 1;
  }
  // Real binaries run far above one in twenty (a PNG header, UTF-16 without its mark).
  return controls > sample.length / 20;
}

const candidates: RosterDelimiter[] = [',', ';', '\t'];

type LineBreak = '\r\n' | '\n' | '\r';

/**
 * The line break papaparse would guess for the whole text (it looks at the first megabyte
 * only), guessed once: each parse without one guesses again, a few milliseconds a time.
 */
export function lineBreakOf(text: string): LineBreak {
  const head = text.slice(0, 1024 * 1024);
  return Papa.parse<string[]>(head, { delimiter: ',', preview: 1 }).meta.linebreak as LineBreak;
}

/** How many lines the separator and the header are looked for in, before the whole text. */
const leadingLineCount = 200;

/**
 * The text's first lines. papaparse splits its whole input into lines before it looks at
 * any when no quote is in it, so reading the first 20 records of a 50,000-row file for each
 * separator tried cost a split of the whole file each time.
 */
function leadingLines(text: string, newline: LineBreak): string {
  let end = 0;
  for (let line = 0; line < leadingLineCount; line += 1) {
    const next = text.indexOf(newline, end);
    if (next < 0) return text;
    end = next + newline.length;
  }
  return text.slice(0, end);
}

/**
 * The separator that splits the first lines into the most columns, consistently. Spreadsheets
 * in locales with a decimal comma write `;` (common practice); HR tools also write tabs.
 */
export function detectDelimiter(
  text: string,
  newline: LineBreak = lineBreakOf(text),
): RosterDelimiter {
  // A spreadsheet's "sep=;" first line says it outright (common practice in exports for Excel).
  const firstLine = text.split(/\r\n|\n|\r/, 50).find((line) => line.trim() !== '') ?? '';
  const hint = /^"?sep=([,;\t])"?\s*$/i.exec(firstLine)?.[1] as RosterDelimiter | undefined;
  if (hint) return hint;
  const leading = leadingLines(text, newline);
  let best: { delimiter: RosterDelimiter; score: number } = { delimiter: ',', score: 0 };
  for (const delimiter of candidates) {
    const config = { delimiter, newline, preview: 20, skipEmptyLines: 'greedy' } as const;
    let sample = Papa.parse<string[]>(leading, config);
    // Stopped by the preview, the leading lines held the 20 records whole; else read it all.
    if (!sample.meta.truncated && leading !== text) sample = Papa.parse<string[]>(text, config);
    // Title lines above the header (one value each) say nothing about the separator.
    const start = sample.data.findIndex((row) => !isTitleRecord(row));
    const widths = sample.data.slice(Math.max(0, start)).map((row) => row.length);
    const headerWidth = widths[0] ?? 0;
    if (headerWidth < 2) continue;
    const consistent = widths.filter((width) => width === headerWidth).length / widths.length;
    const score = headerWidth * consistent;
    if (score > best.score) best = { delimiter, score };
  }
  return best.delimiter;
}

const emailLike = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

/**
 * Control characters a text cell must not hold: C0 except tab, line feed and carriage return
 * (quoted cells may hold line breaks), DEL and C1. PostgreSQL refuses NUL in text outright.
 */
// eslint-disable-next-line no-control-regex -- matching control characters is the point
const controlCharacters = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/g;

// eslint-disable-next-line no-control-regex -- the same set, to test without allocating
const anyControlCharacter = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/;

/**
 * The separators among them (vertical tab, form feed, the four information separators, next
 * line): spreadsheets and old exports put them where a line break or a space was, so between
 * words they leave one space ("Marine<VT>Works" is "Marine Works", not a new "MarineWorks").
 * The others (NUL and the like) stand for nothing and go first.
 */
// eslint-disable-next-line no-control-regex -- matching control characters is the point
const otherControls = /[\u0000-\u0008\u000e-\u001b\u007f-\u0084\u0086-\u009f]/g;
const separatorsBetweenWords =
  // eslint-disable-next-line no-control-regex -- matching control characters is the point
  /(?<=[^\s\u001c-\u001f\u0085]) *[\u000b\u000c\u001c-\u001f\u0085]+ *(?=[^\s\u001c-\u001f\u0085])/g;

/** The cell without control characters, and how many were removed. */
export function cleanCell(cell: string): { value: string; removed: number } {
  if (!anyControlCharacter.test(cell)) return { value: cell, removed: 0 };
  let removed = 0;
  const count = (match: string) => {
    for (const char of match) if (char !== ' ') removed += 1;
  };
  const value = cell
    .replace(otherControls, (match) => {
      count(match);
      return '';
    })
    .replace(separatorsBetweenWords, (match) => {
      count(match);
      return ' ';
    })
    .replace(controlCharacters, (match) => {
      count(match);
      return '';
    });
  return { value, removed };
}

function refuseLongCell(rowNumber: number, column: string, length: number): AppError {
  return refuse(
    'cell_too_long',
    `Row ${rowNumber}, column "${column.slice(0, 60)}" holds ${length.toLocaleString('en')} characters; a value may hold at most ${maxCellCharacters.toLocaleString('en')}. Shorten it and upload again.`,
  );
}

/** At most one value: a blank line, or a title line such as "Staff export 1 December". */
function isTitleRecord(cells: readonly string[]): boolean {
  let values = 0;
  for (const cell of cells) if (cell.trim() !== '' && (values += 1) > 1) return false;
  return true;
}

/** How many title lines a file may have above its header before it is taken for no header. */
const maxTitleRecords = 5;

/**
 * The header among records read from the start: the first record with two values or more,
 * after blank lines and up to maxTitleRecords title lines (or a "sep=" line); `before` counts
 * the non-blank records above. Null when the records are only the text's first lines and do
 * not show it whole: a record is known whole only when another follows it.
 */
function headerAmong(
  records: readonly string[][],
  whole: boolean,
): { cells: string[]; before: number } | null {
  let before = 0;
  for (let index = 0; index < records.length; index += 1) {
    const record = records[index] ?? [];
    if (isBlankRecord(record)) continue;
    if (isTitleRecord(record) && before < maxTitleRecords) {
      before += 1;
      continue;
    }
    return whole || index < records.length - 1 ? { cells: record, before } : null;
  }
  return whole ? { cells: [], before } : null;
}

/** The header (see headerAmong), looked for in the first lines, else in the whole text. */
function readHeader(
  text: string,
  delimiter: RosterDelimiter,
  newline: LineBreak,
): { cells: string[]; before: number } {
  const leading = leadingLines(text, newline);
  const read = (part: string) => Papa.parse<string[]>(part, { delimiter, newline }).data;
  const { cells, before } = headerAmong(read(leading), leading === text) ??
    headerAmong(read(text), true) ?? { cells: [], before: 0 };
  if (cells.length > maxRosterColumns) {
    throw refuse(
      'too_many_columns',
      `The header row has ${cells.length.toLocaleString('en')} columns; a staff list may have at most ${maxRosterColumns}. Remove the columns you do not need and upload again.`,
    );
  }
  const tooLong = cells.findIndex((cell) => cell.length > maxCellCharacters);
  if (tooLong >= 0) throw refuseLongCell(1, `Column ${tooLong + 1}`, cells[tooLong]?.length ?? 0);
  return {
    cells: cells.map((cell) => cleanCell(cell).value.split(legacyMark).join('').trim()),
    before,
  };
}

/** papaparse's "greedy" blank line: every cell empty or white space. */
function isBlankRecord(cells: readonly string[]): boolean {
  for (const cell of cells) if (cell.trim() !== '') return false;
  return true;
}

/**
 * RFC 4180 records (quoted separators, doubled quotes, line breaks inside quotes) via
 * papaparse over the whole text in one call (its fastest mode). The call stops after twice the
 * row limit in records (blank lines count there), so a far too long file costs about what a
 * full one does; only then is the rest counted, one record at a time, for the message.
 */
export function parseRosterText(
  text: string,
): Omit<ParsedRosterFile, 'encoding' | 'hadByteOrderMark'> {
  // A stray BOM left inside UTF-8 text (double-saved files) would stick to the first header.
  const clean = text.replace(/^\uFEFF/, '');
  if (clean.trim() === '')
    throw refuse('empty_file', 'The file has no rows. Choose the CSV export of your staff list.');
  const newline = lineBreakOf(clean);
  const delimiter = detectDelimiter(clean, newline);
  const { cells: headers, before: titleRecords } = readHeader(clean, delimiter, newline);
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
  const width = headers.length;
  // Blank lines are skipped here rather than by papaparse, so its error rows stay in step
  // with the records counted.
  const cap = maxRosterRows * 2 + 2;
  let parsed = Papa.parse<string[]>(clean, { delimiter, newline, preview: cap });
  // Cut short yet not over the limit: more than half the records were blank, so read it all.
  if (
    parsed.data.length >= cap &&
    parsed.data.filter((cells) => !isBlankRecord(cells)).length <= maxRosterRows + 1
  )
    parsed = Papa.parse<string[]>(clean, { delimiter, newline });
  const unterminated = parsed.errors.find((error) => error.code === 'MissingQuotes');
  // One scan of the whole text says whether any cell needs cleaning at all (most files: none).
  const mayHoldControls = anyControlCharacter.test(clean);
  const mayHoldStrayBytes = clean.includes(legacyMark);
  const rows: string[][] = [];
  const rowNumbers: number[] = [];
  const warnings: DecodeWarning[] = [];
  let records = 0;
  for (let index = 0; index < parsed.data.length; index += 1) {
    const record = parsed.data[index] ?? [];
    // The row a spreadsheet shows this record on: one per record, blank ones included.
    const rowNumber = index + 1;
    if (isBlankRecord(record)) continue;
    records += 1;
    if (unterminated && index >= (unterminated.row ?? 0)) {
      throw refuse(
        'bad_quotes',
        `A quoted value starting on row ${rowNumber} never ends. Check the quotation marks there.`,
      );
    }
    // Title lines, then the header; after them the data.
    if (records <= titleRecords + 1 || rows.length >= maxRosterRows) continue;
    // A record as wide as the header is rewritten in place: no second array per row.
    const cells: string[] = record.length === width ? record : new Array<string>(width);
    for (let column = 0; column < width; column += 1) {
      const cell = record[column] ?? '';
      if (cell.length > maxCellCharacters) {
        throw refuseLongCell(rowNumber, headers[column] || `Column ${column + 1}`, cell.length);
      }
      let value = readBack(cell);
      if (mayHoldStrayBytes && value.includes(legacyMark)) {
        const parts = value.split(legacyMark);
        warnings.push({ row: rows.length, column, strayBytes: parts.length - 1 });
        value = parts.join('');
      }
      if (!mayHoldControls) {
        cells[column] = value;
        continue;
      }
      const cleaned = cleanCell(value);
      if (cleaned.removed > 0)
        warnings.push({ row: rows.length, column, removed: cleaned.removed });
      cells[column] = cleaned.value;
    }
    // Trailing empty cells (a spreadsheet's stray separators) are nothing; values are.
    let beyondHeader = 0;
    for (let column = width; column < record.length; column += 1) {
      if ((record[column] ?? '').trim() !== '') beyondHeader += 1;
    }
    if (beyondHeader > 0) warnings.push({ row: rows.length, beyondHeader });
    rows.push(cells);
    rowNumbers.push(rowNumber);
  }
  const dataRows = records - 1 - titleRecords;
  if (dataRows <= 0)
    throw refuse('empty_file', 'The file has a header row but no people under it.');
  if (dataRows > maxRosterRows) {
    throw refuse(
      'too_many_rows',
      `The file has ${countRecords(clean, delimiter, newline).toLocaleString('en')} rows; one import takes at most 50,000.`,
    );
  }
  // Most files have no blank line before a row: each row is then its index plus 2.
  const shifted = rowNumbers.some((rowNumber, index) => rowNumber !== index + 2);
  return { delimiter, headers, rows, rowNumbers: shifted ? rowNumbers : null, warnings };
}

/** Data records of a file known to be over the limit, counted one at a time, none kept. */
function countRecords(text: string, delimiter: RosterDelimiter, newline: LineBreak): number {
  let records = 0;
  Papa.parse<string[]>(text, {
    delimiter,
    newline,
    skipEmptyLines: 'greedy',
    step: () => {
      records += 1;
    },
  });
  return records - 1;
}

/**
 * A cell our own export neutralised (OWASP CSV Injection: neutraliseCell's leading ') reads
 * back as it was.
 */
export function readBackNeutralised(cell: string): string {
  return cell.charCodeAt(0) === 39 && /^'[=+\-@\t\r]/.test(cell) ? cell.slice(1) : cell;
}

/**
 * A number kept as text with a leading ' (a spreadsheet's way to keep "00123" from becoming
 * 123, common practice) reads as the number, so it still matches the id stored without it.
 */
export function readBackTextMarker(cell: string): string {
  return cell.charCodeAt(0) === 39 && /^'[0-9]/.test(cell) ? cell.slice(1) : cell;
}

/** What a spreadsheet or our own export put in front of a cell, taken off. */
function readBack(cell: string): string {
  return readBackTextMarker(readBackNeutralised(cell));
}

export function parseRosterFile(bytes: Uint8Array): ParsedRosterFile {
  const decoded = decodeRosterBytes(bytes);
  return {
    encoding: decoded.encoding,
    hadByteOrderMark: decoded.hadByteOrderMark,
    ...parseRosterText(decoded.text),
  };
}
