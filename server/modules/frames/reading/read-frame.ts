import { open, readFile } from 'node:fs/promises';
import { readCaptureData, type CaptureData } from './capture-data';
import { detectFileKind, type FileKind } from './file-kind';
import { FrameReadError, makePreviews, rawEmbeddedPreview } from './previews';
import { findSlateTokens } from './slate-scan';

export interface FrameReading {
  kind: FileKind;
  capture: CaptureData;
  /** JPEG bytes, or null for a raw file without an embedded preview ("no preview"). */
  preview: Buffer | null;
  thumbnail: Buffer | null;
  width: number | null;
  height: number | null;
  slateTokens: string[];
}

// EXIF sits in the first segment of a JPEG (at most 64 KB) and near the start of a raw file.
const HEAD_BYTES = 256 * 1024;

async function readHead(filePath: string): Promise<Buffer> {
  const handle = await open(filePath, 'r');
  try {
    const buffer = Buffer.alloc(HEAD_BYTES);
    const { bytesRead } = await handle.read(buffer, 0, HEAD_BYTES, 0);
    return buffer.subarray(0, bytesRead);
  } finally {
    await handle.close();
  }
}

/** Everything Likeness learns from one camera file: capture data, previews and any slate. */
export async function readFrameFile(input: {
  filePath: string;
  cardPath: string;
  maxPixels: number;
}): Promise<FrameReading> {
  const head = await readHead(input.filePath);
  const kind = detectFileKind(head);
  if (kind === 'png' || kind === 'unknown') {
    throw new FrameReadError('not_an_image', 'The file is not a camera frame (JPEG, HEIF or raw).');
  }
  const capture = await readCaptureData(head);
  let source: string | Buffer | null = input.filePath;
  if (kind === 'raw') source = await rawEmbeddedPreview(await readFile(input.filePath));
  if (source === null) {
    return {
      kind,
      capture,
      preview: null,
      thumbnail: null,
      width: null,
      height: null,
      slateTokens: [],
    };
  }
  const previews = await makePreviews(source, input.maxPixels);
  return {
    kind,
    capture,
    preview: previews.preview,
    thumbnail: previews.thumbnail,
    width: kind === 'raw' ? capture.pixelWidth : previews.width,
    height: kind === 'raw' ? capture.pixelHeight : previews.height,
    slateTokens: await findSlateTokens(previews.preview),
  };
}
