import sharp from 'sharp';

export type FrameReadFailure = 'not_an_image' | 'too_many_pixels' | 'truncated' | 'unreadable';

/** A frame that cannot be read for a reason the photographer can act on. */
export class FrameReadError extends Error {
  constructor(
    readonly code: FrameReadFailure,
    message: string,
  ) {
    super(message);
    this.name = 'FrameReadError';
  }
}

export interface Previews {
  preview: Buffer;
  thumbnail: Buffer;
  /** The frame's size once turned upright by its orientation. */
  width: number;
  height: number;
}

export const PREVIEW_EDGE = 2048;
export const THUMBNAIL_EDGE = 320;

/**
 * A web preview (2048 px long edge) and a thumbnail (320 px) of an image file, upright, in sRGB,
 * without metadata. sharp shrinks while decoding from the file, and the thumbnail is made from
 * the preview, so a 24 MP frame is decoded once and at a fraction of its size.
 */
export async function makePreviews(input: string | Buffer, maxPixels: number): Promise<Previews> {
  try {
    const { data, info } = await sharp(input, { limitInputPixels: maxPixels, failOn: 'truncated' })
      .rotate()
      .resize({
        width: PREVIEW_EDGE,
        height: PREVIEW_EDGE,
        fit: 'inside',
        withoutEnlargement: true,
      })
      .toColourspace('srgb')
      .jpeg({ quality: 82, mozjpeg: false })
      .toBuffer({ resolveWithObject: true });
    const thumbnail = await sharp(data)
      .resize({ width: THUMBNAIL_EDGE, height: THUMBNAIL_EDGE, fit: 'inside' })
      .jpeg({ quality: 75 })
      .toBuffer();
    const metadata = await sharp(input, { limitInputPixels: maxPixels }).metadata();
    const upright = (metadata.orientation ?? 1) >= 5;
    const width = metadata.width ?? info.width;
    const height = metadata.height ?? info.height;
    return {
      preview: data,
      thumbnail,
      width: upright ? height : width,
      height: upright ? width : height,
    };
  } catch (error) {
    throw toFrameReadError(error);
  }
}

export function toFrameReadError(error: unknown): FrameReadError {
  if (error instanceof FrameReadError) return error;
  const message = error instanceof Error ? error.message : String(error);
  if (/pixel limit/i.test(message)) {
    return new FrameReadError('too_many_pixels', 'The image has more pixels than allowed.');
  }
  if (/truncat|premature end|unexpected end/i.test(message)) {
    return new FrameReadError(
      'truncated',
      'The file ends early: it is truncated. Copy it from the card again.',
    );
  }
  if (/unsupported image format|bad seek|input buffer/i.test(message)) {
    return new FrameReadError('not_an_image', 'The file is not an image Likeness can read.');
  }
  return new FrameReadError(
    'unreadable',
    `The image could not be decoded (${message.slice(0, 120)}).`,
  );
}

const SOI = Buffer.from([0xff, 0xd8, 0xff]);
const EOI = Buffer.from([0xff, 0xd9]);

/**
 * The largest JPEG embedded in a raw file (most raw formats carry a full-size preview), found
 * by its start and end markers and kept only when it decodes whole; null when there is none.
 */
export async function rawEmbeddedPreview(raw: Buffer): Promise<Buffer | null> {
  const candidates: Buffer[] = [];
  let from = 0;
  while (candidates.length < 8) {
    const start = raw.indexOf(SOI, from);
    if (start < 0) break;
    const end = raw.indexOf(EOI, start + 3);
    if (end < 0) break;
    candidates.push(raw.subarray(start, end + 2));
    from = start + 3;
  }
  candidates.sort((a, b) => b.length - a.length);
  for (const candidate of candidates) {
    const whole = await sharp(candidate, { failOn: 'truncated' })
      .stats()
      .then(() => true)
      .catch(() => false);
    if (whole) return candidate;
  }
  return null;
}
