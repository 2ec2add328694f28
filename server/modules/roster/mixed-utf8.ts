import { decodeWindows1252 } from './windows-1252';

/**
 * Follows each character read as Windows-1252 inside mostly-UTF-8 text, so parsing can tell
 * which cells hold one (and warn) before the mark is removed. A private-use code point: no
 * staff list holds it (and if the file itself does, no mark is used).
 */
export const legacyMark = '\uE000';

/**
 * The length of the well-formed UTF-8 sequence starting at `at`, or 0 (RFC 3629, section 4:
 * the UTF8-2/3/4 byte ranges, which leave out overlong forms and surrogates).
 */
function sequenceLength(bytes: Uint8Array, at: number): number {
  const lead = bytes[at] ?? 0;
  const continues = (index: number) => ((bytes[index] ?? 0) & 0xc0) === 0x80;
  const second = bytes[at + 1] ?? 0;
  if (lead < 0x80) return 1;
  if (lead >= 0xc2 && lead <= 0xdf) return continues(at + 1) ? 2 : 0;
  if (lead >= 0xe0 && lead <= 0xef) {
    if ((lead === 0xe0 && second < 0xa0) || (lead === 0xed && second > 0x9f)) return 0;
    return continues(at + 1) && continues(at + 2) ? 3 : 0;
  }
  if (lead >= 0xf0 && lead <= 0xf4) {
    if ((lead === 0xf0 && second < 0x90) || (lead === 0xf4 && second > 0x8f)) return 0;
    return continues(at + 1) && continues(at + 2) && continues(at + 3) ? 4 : 0;
  }
  return 0;
}

/**
 * Text that is UTF-8 but for some bytes (a line pasted in from a Windows-1252 file): the UTF-8
 * read as UTF-8, each stray byte as its Windows-1252 character followed by legacyMark. Null when
 * the bytes hold no multi-byte UTF-8 sequence at all: then the file is plain Windows-1252.
 */
export function decodeMostlyUtf8(bytes: Uint8Array): { text: string; strayBytes: number } | null {
  const utf8 = new TextDecoder('utf-8', { fatal: true });
  // The file's own U+E000 (EE 80 80) would be taken for a mark: then leave the marks out.
  const mark = bytes.some((byte, index) => byte === 0xee && bytes[index + 1] === 0x80)
    ? ''
    : legacyMark;
  const parts: string[] = [];
  let runStart = 0;
  let multiByte = 0;
  let strayBytes = 0;
  let at = 0;
  while (at < bytes.length) {
    const length = sequenceLength(bytes, at);
    if (length > 0) {
      if (length > 1) multiByte += 1;
      at += length;
      continue;
    }
    if (at > runStart) parts.push(utf8.decode(bytes.subarray(runStart, at)));
    parts.push(decodeWindows1252(bytes.subarray(at, at + 1)) + mark);
    strayBytes += 1;
    at += 1;
    runStart = at;
  }
  if (multiByte === 0) return null;
  if (runStart < bytes.length) parts.push(utf8.decode(bytes.subarray(runStart)));
  return { text: parts.join(''), strayBytes };
}
