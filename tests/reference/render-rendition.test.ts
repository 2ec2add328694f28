import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { levelledFrame, planCrop, type CropPlan } from '../../server/modules/looks/crop-geometry';
import { lookPresets, squareProfilePreset } from '../../server/modules/looks/look-presets';
import { renderRendition } from '../../server/modules/looks/render-rendition';
import type { Rendition } from '../../server/schemas/looks';

// Debian's exiftool is the independent reader of what we write (Exif per CIPA DC-008: Copyright
// 0x8298 and Artist 0x013B in IFD0; the GPS IFD; BodySerialNumber 0xA431, "SerialNumber" to
// exiftool). The eyes are found again in the output by scanning its pixels, not by our maths.
if (!existsSync('/usr/bin/exiftool')) {
  throw new Error('exiftool is missing: apt-get install -y libimage-exiftool-perl.');
}

const folder = mkdtempSync(path.join(os.tmpdir(), 'likeness-render-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

// Upright 2000 x 3000; the eyes 260 px apart about (1000, 1100), the head rolled 3° clockwise.
const UPRIGHT = { imageWidth: 2000, imageHeight: 3000 };
const ROLL = (3 * Math.PI) / 180;
const leftEye = { x: 1000 - 130 * Math.cos(ROLL), y: 1100 - 130 * Math.sin(ROLL) };
const rightEye = { x: 1000 + 130 * Math.cos(ROLL), y: 1100 + 130 * Math.sin(ROLL) };
// Found within a few hundredths of a pixel with sharp 0.35 / libvips 8.18; half a pixel leaves
// room for JPEG noise while still catching a half-pixel slip in the levelled-frame model.
const EYE_TOLERANCE_PX = 0.5;
const metadata = { copyright: 'Copyright 2027 Lakeside Portraits', credit: 'Lakeside Portraits' };

/**
 * The camera file: stored on its side (3000 x 2000) with Exif Orientation 6 ("rotate 90° CW to
 * show"), with GPS, a body serial and someone else's credit that must not survive.
 */
let original: Buffer;
beforeAll(async () => {
  const dots = [leftEye, rightEye]
    .map((eye) => `<circle cx="${eye.x}" cy="${eye.y}" r="9" fill="#141414"/>`)
    .join('');
  const svg =
    `<svg xmlns="http://www.w3.org/2000/svg" width="${UPRIGHT.imageWidth}" height="${UPRIGHT.imageHeight}">` +
    `<rect width="100%" height="100%" fill="#808080"/>${dots}</svg>`;
  const upright = await sharp(Buffer.from(svg)).png().toBuffer();
  const onItsSide = await sharp(upright).rotate(270).png().toBuffer();
  original = await sharp(onItsSide)
    .withExif({
      IFD0: { Artist: 'Camera owner', Copyright: 'Not ours', Make: 'Corvane', Model: 'CX-5' },
      IFD2: { BodySerialNumber: 'CV-000123' },
      IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1' },
    })
    .withMetadata({ orientation: 6 })
    .jpeg({ quality: 95 })
    .toBuffer();
});

function plan(rendition: Rendition): CropPlan {
  const result = planCrop({ ...UPRIGHT, leftEye, rightEye, rendition });
  if (!result.ok) throw new Error(`${rendition.name}: ${result.message}`);
  return result;
}

/** Centroids of the dark blobs left and right of the middle, from the decoded pixels. */
async function findDots(jpeg: Buffer) {
  const { data, info } = await sharp(jpeg).greyscale().raw().toBuffer({ resolveWithObject: true });
  const sums = [0, 1].map(() => ({ x: 0, y: 0, weight: 0 }));
  for (let y = 0; y < info.height; y += 1) {
    for (let x = 0; x < info.width; x += 1) {
      const weight = Math.max(0, 100 - data[y * info.width + x]!);
      if (weight === 0) continue;
      const sum = sums[x < info.width / 2 ? 0 : 1]!;
      sum.x += weight * (x + 0.5);
      sum.y += weight * (y + 0.5);
      sum.weight += weight;
    }
  }
  return sums.map((sum) => ({ x: sum.x / sum.weight, y: sum.y / sum.weight }));
}

function exiftool(bytes: Buffer) {
  const file = path.join(folder, `r${Math.random().toString(36).slice(2)}.jpg`);
  writeFileSync(file, bytes);
  const [tags] = JSON.parse(
    execFileSync('exiftool', ['-j', '-G', '-a', '-EXIF:all', '-ICC_Profile:all', file]).toString(),
  ) as Array<Record<string, string | number>>;
  return tags!;
}

describe('the levelled frame is the canvas sharp rotates onto', () => {
  it('sharp 0.35 (libvips 8.18) canvas size for the upright 2000 x 3000 turned -3°', async () => {
    const frame = levelledFrame(UPRIGHT.imageWidth, UPRIGHT.imageHeight, -3);
    const { info } = await sharp(original)
      .autoOrient()
      .rotate(-3)
      .raw()
      .toBuffer({ resolveWithObject: true });
    expect([info.width, info.height]).toEqual([frame.width, frame.height]);
  });
});

describe.each(lookPresets.map((preset) => [preset.rendition.name, preset.rendition] as const))(
  'rendering %s from a camera file on its side',
  (_name, rendition) => {
    let output: Buffer;
    let planned: CropPlan;
    beforeAll(async () => {
      planned = plan(rendition);
      output = await renderRendition({ input: original, plan: planned, rendition, metadata });
    });

    it('is a JPEG of the rendition size, levelled by 3°', async () => {
      const info = await sharp(output).metadata();
      expect(info.format).toBe('jpeg');
      expect([info.width, info.height]).toEqual([rendition.width, rendition.height]);
      expect(planned.rotationDeg).toBeCloseTo(-3, 6);
    });

    it('has the eyes found in its pixels within half a pixel of the plan', async () => {
      const [left, right] = await findDots(output);
      for (const [found, planned_] of [
        [left!, planned.eyesAt.left],
        [right!, planned.eyesAt.right],
      ] as const) {
        expect(Math.abs(found.x - planned_.x)).toBeLessThanOrEqual(EYE_TOLERANCE_PX);
        expect(Math.abs(found.y - planned_.y)).toBeLessThanOrEqual(EYE_TOLERANCE_PX);
      }
      // Levelled: the 3° roll is gone (13.6 px of drop across 260 px before).
      expect(Math.abs(left!.y - right!.y)).toBeLessThanOrEqual(1);
    });

    it('is sRGB with an embedded sRGB profile (IEC 61966-2-1)', async () => {
      const info = await sharp(output).metadata();
      expect(info.space).toBe('srgb');
      expect(info.hasProfile).toBe(true);
      expect(String(exiftool(output)['ICC_Profile:ProfileDescription'])).toMatch(/srgb/i);
    });

    it('keeps only the credit and copyright the rendition keeps; never GPS or the serial', () => {
      const tags = exiftool(output);
      expect(Object.keys(tags).filter((key) => /gps/i.test(key))).toEqual([]);
      expect(tags['EXIF:SerialNumber']).toBeUndefined();
      expect(tags['EXIF:Make']).toBeUndefined();
      expect(tags['EXIF:Copyright']).toBe(
        rendition.keepMetadata.copyright ? metadata.copyright : undefined,
      );
      expect(tags['EXIF:Artist']).toBe(rendition.keepMetadata.credit ? metadata.credit : undefined);
    });
  },
);

describe('a crop past the photo, for a rendition that extends', () => {
  const rendition: Rendition = {
    ...squareProfilePreset.rendition,
    name: 'Wide square',
    eyeLine: 0.7,
    headSize: { measure: 'eye_distance', fraction: 0.1 },
    fillColour: '#d04020',
  };

  it('is filled with the rendition colour there, and the eyes stay where planned', async () => {
    const planned = plan(rendition);
    expect(planned.overflow.top).toBeGreaterThan(0);
    expect(planned.overflow.left).toBeGreaterThan(0);
    const output = await renderRendition({ input: original, plan: planned, rendition, metadata });
    const { data } = await sharp(output).raw().toBuffer({ resolveWithObject: true });
    const [red, green, blue] = [data[0]!, data[1]!, data[2]!];
    expect(Math.abs(red - 0xd0) + Math.abs(green - 0x40) + Math.abs(blue - 0x20)).toBeLessThan(24);
    const [left, right] = await findDots(output);
    expect(Math.abs(left!.x - planned.eyesAt.left.x)).toBeLessThanOrEqual(EYE_TOLERANCE_PX);
    expect(Math.abs(right!.y - planned.eyesAt.right.y)).toBeLessThanOrEqual(EYE_TOLERANCE_PX);
  });

  it('a plan for another size of photo is refused rather than rendered off target', async () => {
    const planned = planCrop({ imageWidth: 3000, imageHeight: 2000, leftEye, rightEye, rendition });
    expect(planned.ok).toBe(true);
    if (!planned.ok) return;
    await expect(
      renderRendition({ input: original, plan: planned, rendition, metadata }),
    ).rejects.toThrow(/upright/);
  });
});
