import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { open } from 'node:fs/promises';
import sharp from 'sharp';
import type { FrameFormat } from '../../db/frame-types';
import { detectFileKind } from './reading/file-kind';

export async function sha256OfFile(filePath: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(filePath)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

export type Screening =
  | { ok: true; format: FrameFormat; contentType: string }
  | { ok: false; code: string; message: string };

async function readEnds(filePath: string): Promise<{ head: Buffer; tail: Buffer }> {
  const handle = await open(filePath, 'r');
  try {
    const { size } = await handle.stat();
    const head = Buffer.alloc(Math.min(size, 4096));
    await handle.read(head, 0, head.length, 0);
    const tail = Buffer.alloc(Math.min(size, 64));
    await handle.read(tail, 0, tail.length, size - tail.length);
    return { head, tail };
  } finally {
    await handle.close();
  }
}

/**
 * Checked before anything is kept: the file is a camera frame (by its bytes, not its name),
 * not larger than the pixel limit (a decompression bomb is refused from its header alone),
 * and a JPEG that ends with its end-of-image marker (a file cut short by a failed copy does not).
 */
export async function screenUploadedFile(
  filePath: string,
  cardPath: string,
  maxPixels: number,
): Promise<Screening> {
  const name = cardPath.split('/').pop() ?? cardPath;
  const { head, tail } = await readEnds(filePath);
  const kind = detectFileKind(head);
  if (kind === 'png' || kind === 'unknown') {
    return {
      ok: false,
      code: 'not_a_frame',
      message: `“${name}” is not a camera frame: Likeness accepts JPEG, HEIF and raw files.`,
    };
  }
  if (kind === 'raw') return { ok: true, format: 'raw', contentType: 'application/octet-stream' };
  const metadata = await sharp(filePath, { limitInputPixels: false })
    .metadata()
    .catch(() => null);
  if (!metadata?.width || !metadata.height) {
    return { ok: false, code: 'unreadable', message: `“${name}” could not be opened as an image.` };
  }
  const pixels = metadata.width * metadata.height;
  if (pixels > maxPixels) {
    return {
      ok: false,
      code: 'too_many_pixels',
      message: `“${name}” is ${metadata.width} × ${metadata.height} pixels (${(pixels / 1e6).toFixed(0)} MP), over the ${(maxPixels / 1e6).toFixed(0)} MP limit.`,
    };
  }
  if (kind === 'jpeg' && tail.lastIndexOf(Buffer.from([0xff, 0xd9])) < 0) {
    return {
      ok: false,
      code: 'truncated',
      message: `“${name}” ends early: the file is truncated. Copy it from the card again.`,
    };
  }
  return {
    ok: true,
    format: kind,
    contentType: kind === 'jpeg' ? 'image/jpeg' : 'image/heif',
  };
}
