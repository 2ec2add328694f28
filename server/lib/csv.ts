/**
 * CSV for spreadsheets: RFC 4180 quoting and CRLF record ends, a UTF-8 byte order mark so
 * spreadsheet programs pick UTF-8, and cells neutralised against formula injection.
 */

/** OWASP CSV Injection: cells starting with = + - @ TAB or CR get a leading apostrophe. */
export function neutraliseCell(value: string): string {
  return /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
}

/** RFC 4180 section 2: fields with a comma, quote, CR or LF are quoted; inner quotes doubled. */
export function quoteCell(value: string): string {
  return /[",\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

export function toCsvRecord(cells: readonly string[]): string {
  return cells.map((cell) => quoteCell(neutraliseCell(cell))).join(',');
}

export const utf8ByteOrderMark = '\uFEFF';

export function toCsv(rows: readonly (readonly string[])[]): string {
  return utf8ByteOrderMark + rows.map(toCsvRecord).join('\r\n') + '\r\n';
}
