import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { readCaptureData } from '../../server/modules/frames/reading/capture-data';
import { cameraJpeg, cameraRaw } from '../support/camera-cards';

// Debian's exiftool (libimage-exiftool-perl) is the independent reader: what Likeness reads from
// a frame must be what exiftool reads (Exif tags per CIPA DC-008: DateTimeOriginal 0x9003,
// SubSecTimeOriginal 0x9291, OffsetTimeOriginal 0x9011, BodySerialNumber 0xA431).
if (!existsSync('/usr/bin/exiftool')) {
  throw new Error(
    'exiftool is missing: apt-get install -y libimage-exiftool-perl (npm test does it).',
  );
}

const folder = mkdtempSync(path.join(os.tmpdir(), 'likeness-exif-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

function exiftool(bytes: Buffer) {
  const file = path.join(folder, `f${Math.random().toString(36).slice(2)}`);
  writeFileSync(file, bytes);
  const [tags] = JSON.parse(
    execFileSync('exiftool', [
      '-j',
      '-DateTimeOriginal',
      '-SubSecTimeOriginal',
      '-OffsetTimeOriginal',
      '-SerialNumber',
      '-Make',
      '-Model',
      file,
    ]).toString(),
  ) as Array<Record<string, string | number>>;
  return tags!;
}

const cases = [
  {
    dateTimeOriginal: '2027:03:04 09:15:02',
    subSecTimeOriginal: '13',
    offsetTimeOriginal: '+00:00',
    serial: 'CV-000123',
  },
  {
    dateTimeOriginal: '2027:10:31 23:59:59',
    subSecTimeOriginal: '999',
    offsetTimeOriginal: '-05:30',
    serial: '0042',
    make: 'Brightwell',
    model: 'B 9',
  },
  { dateTimeOriginal: '2028:02:29 00:00:00' },
];

describe('capture data agrees with exiftool', () => {
  it.each(cases)('JPEG written at $dateTimeOriginal', async (spec) => {
    const bytes = await cameraJpeg({ width: 320, height: 240, ...spec });
    const ours = await readCaptureData(bytes.subarray(0, 65536));
    const theirs = exiftool(bytes);
    const [date, time] = String(theirs.DateTimeOriginal).split(' ');
    const sub = theirs.SubSecTimeOriginal === undefined ? '' : String(theirs.SubSecTimeOriginal);
    // Sub-seconds are the digits of a decimal fraction: "13" is 0.130 s.
    const expected = `${date!.replaceAll(':', '-')}T${time}${sub ? `.${sub.padEnd(3, '0')}` : ''}`;
    expect(ours.capturedLocal).toBe(expected);
    expect(ours.offset).toBe(theirs.OffsetTimeOriginal ?? null);
    expect(ours.cameraSerial).toBe(
      theirs.SerialNumber === undefined ? null : String(theirs.SerialNumber),
    );
    expect(ours.make).toBe(theirs.Make);
    expect(ours.model).toBe(theirs.Model);
  });

  it('reads a TIFF-structured raw file the same way', async () => {
    const bytes = await cameraRaw({ dateTimeOriginal: '2027:03:04 10:00:00', serial: 'CV-7' });
    const ours = await readCaptureData(bytes.subarray(0, 262144));
    const theirs = exiftool(bytes);
    expect(ours.capturedLocal).toBe('2027-03-04T10:00:00');
    expect(theirs.DateTimeOriginal).toBe('2027:03:04 10:00:00');
    expect(ours.cameraSerial).toBe(String(theirs.SerialNumber));
  });
});
