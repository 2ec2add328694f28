import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { frameSortKey, parseDcfPath } from '../../server/modules/frames/reading/dcf-path';
import { detectFileKind } from '../../server/modules/frames/reading/file-kind';
import { nextDcf } from '../support/camera-cards';

// DCF (JEITA CP-3461) as quoted in camera manuals: folders DCIM/NNNxxxxx with NNN 100-999; files
// of 4 characters from 0-9 A-Z _ then a 4-digit number 0001-9999; a leading "_" marks the
// optional colour space (DCF 2.0).
describe('DCF names (JEITA CP-3461)', () => {
  it('reads folder number, file number and stem', () => {
    expect(parseDcfPath('DCIM/104HPENG/HPE_0042.JPG')).toEqual({
      folderNumber: 104,
      folderName: '104HPENG',
      fileNumber: 42,
      stem: 'HPE_',
      extension: 'JPG',
      wideGamut: false,
    });
  });

  it('marks the optional colour space by the leading underscore', () => {
    expect(parseDcfPath('DCIM/100ABCDE/_ABC1234.jpg')).toMatchObject({
      fileNumber: 1234,
      stem: '_ABC',
      wideGamut: true,
    });
  });

  it.each([
    [
      'folder number below 100',
      'DCIM/099HPENG/HPE_0001.JPG',
      { folderNumber: null, fileNumber: 1 },
    ],
    [
      'file number 0000 (numbers start at 0001)',
      'DCIM/100HPENG/HPE_0000.JPG',
      { fileNumber: null },
    ],
    ['a name that is not DCF', 'holiday/portrait.jpg', { folderNumber: null, fileNumber: null }],
    [
      'a lower-case name (read case-insensitively)',
      'dcim/101hpeng/hpe_9999.jpg',
      { folderNumber: 101, fileNumber: 9999 },
    ],
  ])('%s', (_label, cardPath, expected) => {
    expect(parseDcfPath(cardPath)).toMatchObject(expected);
  });

  it('sorts by folder, then number: after 9999 the camera goes on at 0001 in folder + 1', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 100, max: 998 }),
        fc.integer({ min: 1, max: 9999 }),
        (folder, number) => {
          const here = parseDcfPath(
            `DCIM/${folder}HPENG/HPE_${String(number).padStart(4, '0')}.JPG`,
          );
          const next = nextDcf({ folder, number });
          const after = parseDcfPath(
            `DCIM/${next.folder}HPENG/HPE_${String(next.number).padStart(4, '0')}.JPG`,
          );
          expect(frameSortKey(after)).toBeGreaterThan(frameSortKey(here));
        },
      ),
    );
  });
});

describe('recognising files by their bytes, not their names', () => {
  it.each([
    ['JPEG (SOI marker FF D8 FF)', [0xff, 0xd8, 0xff, 0xe1], 'jpeg'],
    ['TIFF little-endian (II*\\0): a TIFF-structured raw file', [0x49, 0x49, 0x2a, 0x00], 'raw'],
    ['TIFF big-endian (MM\\0*)', [0x4d, 0x4d, 0x00, 0x2a], 'raw'],
    ['PNG signature', [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a], 'png'],
    ['plain text', [...Buffer.from('hello, card')], 'unknown'],
  ])('%s', (_label, bytes, kind) => {
    expect(detectFileKind(Buffer.from(bytes))).toBe(kind);
  });

  it('tells HEIF from other ISO-BMFF files by the ftyp brand (ISO/IEC 14496-12, 23008-12)', () => {
    const box = (brand: string) =>
      Buffer.concat([Buffer.from([0, 0, 0, 24]), Buffer.from(`ftyp${brand}`), Buffer.alloc(12)]);
    expect(detectFileKind(box('heic'))).toBe('heif');
    expect(detectFileKind(box('mif1'))).toBe('heif');
    // Any other still-image brand is taken as a raw container: recognised by structure.
    expect(detectFileKind(box('rawx'))).toBe('raw');
    expect(detectFileKind(box('mp42'))).toBe('unknown');
  });
});
