export type FileKind = 'jpeg' | 'heif' | 'raw' | 'png' | 'unknown';

const heifBrands = new Set([
  'heic',
  'heix',
  'heim',
  'heis',
  'hevc',
  'hevx',
  'mif1',
  'msf1',
  'avif',
]);

/**
 * What a file is, from its first bytes, never from its name: JPEG (SOI marker), TIFF-structured
 * raw files (byte-order mark and magic 42, or the variants some bodies write), ISO-BMFF
 * containers (an `ftyp` box whose brand says HEIF, or any other brand, as raw), PNG.
 */
export function detectFileKind(head: Buffer): FileKind {
  if (head.length >= 3 && head[0] === 0xff && head[1] === 0xd8 && head[2] === 0xff) return 'jpeg';
  if (head.length >= 8 && head.subarray(0, 8).equals(pngSignature)) return 'png';
  if (head.length >= 4) {
    const order = head.toString('latin1', 0, 2);
    if (order === 'II' || order === 'MM') {
      const magic = order === 'II' ? head.readUInt16LE(2) : head.readUInt16BE(2);
      // 42 is TIFF; 0x4f52 ("RO") and 0x55 are TIFF variants with another magic number.
      if (magic === 42 || magic === 0x4f52 || magic === 0x55) return 'raw';
    }
  }
  if (head.length >= 12 && head.toString('latin1', 4, 8) === 'ftyp') {
    const brand = head.toString('latin1', 8, 12);
    if (heifBrands.has(brand)) return 'heif';
    return videoBrands.has(brand) ? 'unknown' : 'raw';
  }
  return 'unknown';
}

// Films share the container; they are not frames.
const videoBrands = new Set([
  'isom',
  'iso2',
  'mp41',
  'mp42',
  'avc1',
  'qt  ',
  'M4V ',
  '3gp4',
  '3gp5',
]);
const pngSignature = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
