import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import exifr from 'exifr';
import sharp from 'sharp';
import { afterAll, describe, expect, it } from 'vitest';
import { makePreviews } from '../../server/modules/frames/reading/previews';
import { readFrameFile } from '../../server/modules/frames/reading/read-frame';
import { findSlateTokens } from '../../server/modules/frames/reading/slate-scan';
import { cameraJpeg, pngImage, truncated } from '../support/camera-cards';

const folder = mkdtempSync(path.join(os.tmpdir(), 'likeness-read-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));
const write = (name: string, bytes: Buffer) => {
  const file = path.join(folder, name);
  writeFileSync(file, bytes);
  return file;
};
const token = 'KQ2ZL7MXR4TB6NVP3HWJ5DYC2A';

describe('previews', () => {
  it('makes a 2048 px preview and a 320 px thumbnail, sRGB, with no metadata left', async () => {
    const file = write(
      'a.jpg',
      await cameraJpeg({
        width: 3000,
        height: 2000,
        serial: 'CV-1',
        dateTimeOriginal: '2027:03:04 09:00:00',
      }),
    );
    const previews = await makePreviews(file, 100_000_000);
    const preview = await sharp(previews.preview).metadata();
    const thumbnail = await sharp(previews.thumbnail).metadata();
    expect([preview.width, preview.height]).toEqual([2048, 1365]);
    expect(Math.max(thumbnail.width!, thumbnail.height!)).toBe(320);
    expect(preview.space).toBe('srgb');
    // exifr, an independent reader, finds no EXIF in what is shown on the web.
    expect(await exifr.parse(previews.preview)).toBeUndefined();
  });

  it('turns a frame upright by its orientation (Exif 0x0112 = 6: rotate 90°)', async () => {
    const bytes = await sharp({
      create: { width: 600, height: 400, channels: 3, background: '#777' },
    })
      .withMetadata({ orientation: 6 })
      .jpeg()
      .toBuffer();
    const previews = await makePreviews(write('o.jpg', bytes), 100_000_000);
    const preview = await sharp(previews.preview).metadata();
    expect([preview.width, preview.height]).toEqual([400, 600]);
    expect([previews.width, previews.height]).toEqual([400, 600]);
  });

  it('refuses a truncated file and a PNG with their own reasons', async () => {
    await expect(
      makePreviews(write('t.jpg', truncated(await cameraJpeg())), 1e8),
    ).rejects.toMatchObject({ code: 'truncated' });
    await expect(
      readFrameFile({
        filePath: write('p.jpg', await pngImage()),
        cardPath: 'p.jpg',
        maxPixels: 1e8,
      }),
    ).rejects.toMatchObject({ code: 'not_an_image' });
  });

  it('refuses more pixels than allowed', async () => {
    await expect(
      makePreviews(write('big.jpg', await cameraJpeg({ width: 2000, height: 2000 })), 1_000_000),
    ).rejects.toMatchObject({
      code: 'too_many_pixels',
    });
  });
});

describe('slates (QR codes, ISO/IEC 18004: drawn by the qrcode package, read back by zxing-wasm)', () => {
  it('finds the slate token in the preview of a 6000 × 4000 frame', async () => {
    const file = write('s.jpg', await cameraJpeg({ width: 6000, height: 4000, slateToken: token }));
    const reading = await readFrameFile({
      filePath: file,
      cardPath: 'DCIM/100HPENG/HPE_0001.JPG',
      maxPixels: 1e8,
    });
    expect(reading.slateTokens).toEqual([token]);
  });

  it('finds nothing on a plain frame, and ignores a QR code that is not a slate', async () => {
    expect(await findSlateTokens(await cameraJpeg())).toEqual([]);
    const other = await cameraJpeg({ slateToken: 'HTTP://EXAMPLE.TEST/A' });
    expect(await findSlateTokens(other)).toEqual([]);
  });
});
