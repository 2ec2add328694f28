import { neutraliseCell } from '../../lib/csv';
import { encodeWindows1252 } from './windows-1252';

export interface FileShape {
  delimiter: string;
  encoding: string;
  hadByteOrderMark: boolean;
}

/**
 * RFC 4180 section 2 quoting with the file's own separator: a field holding it, a quote, CR or
 * LF is quoted and inner quotes doubled. Cells are neutralised against formula injection
 * (OWASP CSV Injection) as in every CSV we write.
 */
function record(cells: readonly string[], delimiter: string): string {
  return cells
    .map((cell) => {
      const safe = neutraliseCell(cell);
      return safe.includes(delimiter) || /["\r\n]/.test(safe)
        ? `"${safe.replace(/"/g, '""')}"`
        : safe;
    })
    .join(delimiter);
}

function encode(text: string, shape: FileShape): Buffer {
  switch (shape.encoding) {
    case 'windows-1252':
      return Buffer.from(encodeWindows1252(text));
    case 'utf-16le':
      return Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, 'utf16le')]);
    case 'utf-16be':
      return Buffer.concat([Buffer.from([0xfe, 0xff]), Buffer.from(text, 'utf16le').swap16()]);
    default:
      return Buffer.from(shape.hadByteOrderMark ? `\uFEFF${text}` : text, 'utf8');
  }
}

const charsets: Record<string, string> = {
  'windows-1252': 'windows-1252',
  // With a byte order mark the label is plain UTF-16 (RFC 2781 section 3.3).
  'utf-16le': 'utf-16',
  'utf-16be': 'utf-16',
};

/**
 * The rows to fix written the way the upload came: same separator, same encoding (and byte
 * order mark), so it opens and re-uploads like the original. CRLF record ends (RFC 4180).
 */
export function rowsToFixFile(
  rows: readonly (readonly string[])[],
  shape: FileShape,
): { body: Buffer; contentType: string } {
  const text = rows.map((cells) => record(cells, shape.delimiter)).join('\r\n') + '\r\n';
  return {
    body: encode(text, shape),
    contentType: `text/csv; charset=${charsets[shape.encoding] ?? 'utf-8'}`,
  };
}
