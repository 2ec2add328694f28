/**
 * Windows-1252, the usual spreadsheet export on Windows: WHATWG Encoding's index-windows-1252
 * for 0x80-0x9F; every other byte equals its code point. Written out because Node's
 * TextDecoder treats the "windows-1252" label as Latin-1 for these bytes, and has no encoder.
 */
const high = [
  0x20ac, 0x81, 0x201a, 0x192, 0x201e, 0x2026, 0x2020, 0x2021, 0x2c6, 0x2030, 0x160, 0x2039, 0x152,
  0x8d, 0x17d, 0x8f, 0x90, 0x2018, 0x2019, 0x201c, 0x201d, 0x2022, 0x2013, 0x2014, 0x2dc, 0x2122,
  0x161, 0x203a, 0x153, 0x9d, 0x17e, 0x178,
];

const byteOf = new Map<number, number>();
for (let byte = 0; byte < 256; byte += 1) {
  byteOf.set(byte >= 0x80 && byte <= 0x9f ? (high[byte - 0x80] ?? byte) : byte, byte);
}

export function decodeWindows1252(bytes: Uint8Array): string {
  const chunks: string[] = [];
  for (let start = 0; start < bytes.length; start += 8192) {
    const codes = Array.from(bytes.subarray(start, start + 8192), (byte) =>
      byte >= 0x80 && byte <= 0x9f ? (high[byte - 0x80] ?? byte) : byte,
    );
    chunks.push(String.fromCharCode(...codes));
  }
  return chunks.join('');
}

/** Whether the character (one code point) has a byte in Windows-1252. */
export function fitsWindows1252(character: string): boolean {
  return byteOf.has(character.codePointAt(0) ?? -1);
}

/** Characters without a byte become "?", as spreadsheet programs write them. */
export function encodeWindows1252(text: string): Uint8Array {
  const characters = [...text];
  const bytes = new Uint8Array(characters.length);
  characters.forEach((character, index) => {
    bytes[index] = byteOf.get(character.codePointAt(0) ?? -1) ?? 0x3f;
  });
  return bytes;
}

/**
 * Letters with no decomposition that exports commonly write as a plain letter (from memory:
 * the "best fit" fallbacks of legacy code pages).
 */
const plainLetters: Record<string, string> = {
  Ł: 'L',
  ł: 'l',
  Đ: 'D',
  đ: 'd',
  Ħ: 'H',
  ħ: 'h',
  ı: 'i',
  Ŧ: 'T',
  ŧ: 't',
  Ŀ: 'L',
  ŀ: 'l',
};

function plainLetter(character: string): string {
  return plainLetters[character] ?? character.normalize('NFKD').replace(/[\u0300-\u036f]/g, '');
}

/**
 * Whether `incoming` could be `stored` after a trip through Windows-1252: every character
 * that the code page holds is the same, and each one it cannot hold came back as "?" or as its
 * plain letter (Łukasz as ?ukasz or Lukasz). False when `stored` fits the code page whole,
 * since then a different spelling is a real change.
 */
export function isWindows1252Copy(stored: string, incoming: string): boolean {
  const before = [...stored.normalize('NFC')];
  const after = [...incoming.normalize('NFC')];
  if (before.length !== after.length || before.every(fitsWindows1252)) return false;
  return before.every((character, index) => {
    const other = after[index];
    if (fitsWindows1252(character)) return other === character;
    return other === '?' || other === plainLetter(character);
  });
}
