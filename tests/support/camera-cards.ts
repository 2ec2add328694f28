import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import QRCode from 'qrcode';
import sharp from 'sharp';

/**
 * Camera files made on the fly for tests and benchmarks (nothing binary is committed): JPEGs
 * with EXIF written by sharp, named after DCF (JEITA CP-3461), with invented camera makes.
 */
export interface FrameSpec {
  width?: number;
  height?: number;
  /** Exif DateTimeOriginal, 'YYYY:MM:DD HH:MM:SS' (CIPA DC-008). */
  dateTimeOriginal?: string;
  subSecTimeOriginal?: string;
  offsetTimeOriginal?: string;
  serial?: string;
  make?: string;
  model?: string;
  /** A slate token drawn as a QR code across the middle of the frame. */
  slateToken?: string;
  /** Grey level of the plain background, so frames differ in content. */
  shade?: number;
}

function exifOf(spec: FrameSpec) {
  const exif: Record<string, string> = {};
  if (spec.dateTimeOriginal) exif.DateTimeOriginal = spec.dateTimeOriginal;
  if (spec.subSecTimeOriginal) exif.SubSecTimeOriginal = spec.subSecTimeOriginal;
  if (spec.offsetTimeOriginal) exif.OffsetTimeOriginal = spec.offsetTimeOriginal;
  if (spec.serial) exif.BodySerialNumber = spec.serial;
  return {
    IFD0: { Make: spec.make ?? 'Corvane', Model: spec.model ?? 'CX-5' },
    IFD2: exif,
  };
}

async function frameImage(spec: FrameSpec) {
  const width = spec.width ?? 1200;
  const height = spec.height ?? 800;
  const shade = spec.shade ?? 128;
  let image = sharp({
    create: { width, height, channels: 3, background: { r: shade, g: shade - 10, b: shade - 20 } },
  });
  if (spec.slateToken) {
    const side = Math.round(Math.min(width, height) * 0.6);
    const qr = await QRCode.toBuffer([{ data: spec.slateToken, mode: 'alphanumeric' }], {
      type: 'png',
      width: side,
      margin: 4,
      errorCorrectionLevel: 'M',
    });
    image = sharp(await image.png().toBuffer()).composite([{ input: qr, gravity: 'center' }]);
  }
  return image;
}

export async function cameraJpeg(spec: FrameSpec = {}): Promise<Buffer> {
  const image = await frameImage(spec);
  return image.withExif(exifOf(spec)).jpeg({ quality: 85 }).toBuffer();
}

/**
 * A TIFF-structured raw file: a small TIFF whose capture tags Debian's exiftool writes (sharp
 * keeps EXIF in JPEGs only), and a full JPEG preview carried after it.
 */
export async function cameraRaw(spec: FrameSpec = {}, withPreview = true): Promise<Buffer> {
  const folder = mkdtempSync(path.join(os.tmpdir(), 'likeness-raw-'));
  let tiff: Buffer;
  try {
    const file = path.join(folder, 'frame.tif');
    writeFileSync(
      file,
      await (await frameImage({ ...spec, width: 64, height: 48 })).tiff().toBuffer(),
    );
    const tags = exifOf(spec);
    const args = [
      // exiftool calls Exif tag 0xA431 (BodySerialNumber) SerialNumber.
      ...Object.entries({ ...tags.IFD0, ...tags.IFD2 }).map(
        ([tag, value]) => `-${tag === 'BodySerialNumber' ? 'SerialNumber' : tag}=${value}`,
      ),
      '-overwrite_original',
      file,
    ];
    execFileSync('exiftool', args, { stdio: 'pipe' });
    tiff = readFileSync(file);
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
  if (!withPreview) return tiff;
  return Buffer.concat([tiff, await (await frameImage(spec)).jpeg().toBuffer()]);
}

/** The first part of a file, as a copy that failed midway leaves it. */
export const truncated = (file: Buffer, fraction = 0.6) =>
  Buffer.from(file.subarray(0, Math.floor(file.length * fraction)));

export const pngImage = () =>
  sharp({ create: { width: 64, height: 64, channels: 3, background: '#336699' } })
    .png()
    .toBuffer();

/**
 * A decompression bomb: a small JPEG whose frame header claims 20,000 × 20,000 pixels
 * (400 MP), which a decoder would try to allocate.
 */
export async function decompressionBomb(): Promise<Buffer> {
  const jpeg = Buffer.from(await cameraJpeg({ width: 64, height: 64 }));
  // SOF0 marker FFC0: length (2), precision (1), height (2), width (2).
  const sof = jpeg.indexOf(Buffer.from([0xff, 0xc0]));
  jpeg.writeUInt16BE(20_000, sof + 5);
  jpeg.writeUInt16BE(20_000, sof + 7);
  return jpeg;
}

/** DCF file names: `DCIM/<folder>/<stem><number>.JPG`, rolling over 9999 → 0001 in folder+1. */
export function dcfName(folder: number, number: number, stem = 'HPE_', extension = 'JPG'): string {
  return `DCIM/${folder}HPENG/${stem}${String(number).padStart(4, '0')}.${extension}`;
}

export function nextDcf(position: { folder: number; number: number }) {
  return position.number === 9999
    ? { folder: position.folder + 1, number: 1 }
    : { folder: position.folder, number: position.number + 1 };
}
