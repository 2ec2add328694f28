import type { Readable } from 'node:stream';
import { AppError } from '../../lib/errors';
import { controlCharacterPattern } from '../../schemas/common';

/**
 * Where frames, previews and thumbnails live. Keys are relative, slash-separated paths that the
 * app builds itself (for example `originals/<day>/<frame>.jpg`); both implementations store the
 * same key the same way, so a folder copied from local disk can be uploaded to a bucket as it is.
 */
export interface ObjectStorage {
  readonly kind: 'local' | 's3';
  /** Stores a stream or buffer under key and resolves once it is durable; a failed write leaves nothing. */
  put(key: string, body: Readable | Buffer, options?: PutOptions): Promise<{ size: number }>;
  /** Streams a file from local disk into storage (multipart on S3, so raw files never sit in memory). */
  putFile(key: string, filePath: string, options?: PutOptions): Promise<{ size: number }>;
  /** The whole object, or the inclusive byte range [start, end]; an end past the last byte is clamped. */
  read(key: string, range?: ByteRange): Promise<Readable>;
  /** Up to the first `length` bytes, e.g. for reading EXIF without fetching a 30 MB frame. */
  readHead(key: string, length: number): Promise<Buffer>;
  /** The object's size, or null when there is none. */
  stat(key: string): Promise<{ size: number } | null>;
  /** Removes the object; removing a missing object is not an error. */
  delete(key: string): Promise<void>;
  /** Removes every object whose key starts with prefix (used for derived files, never originals). */
  deletePrefix(prefix: string): Promise<void>;
  /** Releases connections; the storage is not used afterwards. */
  close(): Promise<void>;
}

export interface PutOptions {
  /** Kept as the object's Content-Type on S3; local files carry no metadata, so it is ignored there. */
  contentType?: string;
}

export interface ByteRange {
  start: number;
  end: number;
}

/** A read of a key that holds no object: the 404 the error handler already knows. */
export class StorageNotFound extends AppError {
  constructor(readonly key: string) {
    super('not_found', 404, 'The stored file was not found.', { key });
    this.name = 'StorageNotFound';
  }
}

/** A range that starts at or past the end of the object. */
export class StorageRangeNotSatisfiable extends AppError {
  constructor(
    readonly key: string,
    range: ByteRange,
  ) {
    super('range_not_satisfiable', 416, 'The requested byte range is outside the file.', {
      key,
      range,
    });
    this.name = 'StorageRangeNotSatisfiable';
  }
}

const MAX_KEY_BYTES = 1024; // S3's own limit, applied to local storage too so keys stay portable.

/**
 * Refuses keys that could escape the storage root or mean different things on disk and in S3:
 * empty, absolute, `.`/`..`/empty segments, backslashes, control characters, and segments starting
 * with a dot (reserved for the local implementation's temporary files). Throws a 400 AppError.
 */
export function assertValidKey(key: string, what: 'key' | 'prefix' = 'key'): void {
  const problem = findKeyProblem(key, what);
  if (problem) {
    throw new AppError('invalid_storage_key', 400, `The storage ${what} ${problem}.`, { key });
  }
}

function findKeyProblem(key: string, what: 'key' | 'prefix'): string | null {
  if (key.length === 0) return 'is empty';
  if (Buffer.byteLength(key, 'utf8') > MAX_KEY_BYTES)
    return `is longer than ${MAX_KEY_BYTES} bytes`;
  if (key.startsWith('/')) return 'starts with "/"';
  if (key.includes('\\')) return 'contains "\\"';
  if (controlCharacterPattern.test(key)) return 'contains a control character';
  // A prefix may end with "/" (a whole folder); a key may not, since it would name a folder.
  const segments =
    what === 'prefix' && key.endsWith('/') ? key.slice(0, -1).split('/') : key.split('/');
  for (const segment of segments) {
    if (segment === '') return 'contains an empty path segment';
    if (segment === '.' || segment === '..') return 'contains "." or ".." as a path segment';
    if (segment.startsWith('.')) return 'contains a path segment starting with "."';
  }
  return null;
}

export function assertValidRange(range: ByteRange): void {
  const { start, end } = range;
  if (!Number.isSafeInteger(start) || !Number.isSafeInteger(end) || start < 0 || end < start) {
    throw new AppError('invalid_range', 400, 'A byte range needs 0 <= start <= end.', { range });
  }
}

export function assertValidHeadLength(length: number): void {
  if (!Number.isSafeInteger(length) || length <= 0) {
    throw new AppError('invalid_range', 400, 'readHead needs a positive whole length.', { length });
  }
}
