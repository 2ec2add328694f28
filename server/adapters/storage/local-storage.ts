import { randomUUID } from 'node:crypto';
import {
  mkdir,
  open,
  readdir,
  rename,
  rm,
  stat,
  unlink,
  writeFile,
  type FileHandle,
} from 'node:fs/promises';
import path from 'node:path';
import { createReadStream, createWriteStream } from 'node:fs';
import type { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import {
  assertValidHeadLength,
  assertValidKey,
  assertValidRange,
  StorageNotFound,
  StorageRangeNotSatisfiable,
  type ByteRange,
  type ObjectStorage,
} from './storage';

/** Codes meaning "there is no file at this path" (a missing folder, or a file where a folder was expected). */
const MISSING_CODES = new Set(['ENOENT', 'ENOTDIR']);

function errorCode(error: unknown): string | undefined {
  return error instanceof Error && 'code' in error && typeof error.code === 'string'
    ? error.code
    : undefined;
}

/**
 * Objects as plain files under one root folder, the key's segments becoming folders. Writes go to
 * a temporary file beside the target and are renamed into place, so a reader never sees half a
 * frame and a failed upload leaves nothing behind.
 */
export class LocalStorage implements ObjectStorage {
  readonly kind = 'local' as const;
  readonly root: string;

  constructor(root: string) {
    this.root = path.resolve(root);
  }

  async put(key: string, body: Readable | Buffer): Promise<{ size: number }> {
    const target = this.pathOf(key);
    const folder = path.dirname(target);
    await mkdir(folder, { recursive: true });
    // The leading dot keeps temporary names out of the key space (keys may not have dot segments).
    const temporary = path.join(folder, `.${path.basename(target)}.${randomUUID()}.tmp`);
    let size: number;
    try {
      // `flush` fsyncs before the rename, so a renamed file always holds all of its bytes.
      if (Buffer.isBuffer(body)) {
        await writeFile(temporary, body, { flag: 'wx', flush: true });
        size = body.length;
      } else {
        const sink = createWriteStream(temporary, { flags: 'wx', flush: true });
        await pipeline(body, sink);
        size = sink.bytesWritten;
      }
      await rename(temporary, target);
    } catch (error) {
      await unlink(temporary).catch(() => undefined);
      throw error;
    }
    await syncFolder(folder);
    return { size };
  }

  async putFile(key: string, filePath: string): Promise<{ size: number }> {
    assertValidKey(key);
    return this.put(key, createReadStream(filePath));
  }

  async read(key: string, range?: ByteRange): Promise<Readable> {
    if (range) assertValidRange(range);
    const { file, size } = await this.openExisting(key);
    if (!range) return file.createReadStream();
    if (range.start >= size) {
      await file.close();
      throw new StorageRangeNotSatisfiable(key, range);
    }
    return file.createReadStream({ start: range.start, end: Math.min(range.end, size - 1) });
  }

  async readHead(key: string, length: number): Promise<Buffer> {
    assertValidHeadLength(length);
    const { file, size } = await this.openExisting(key);
    try {
      const buffer = Buffer.alloc(Math.min(length, size));
      let filled = 0;
      // read() may return fewer bytes than asked, so keep going until the buffer is full.
      while (filled < buffer.length) {
        const { bytesRead } = await file.read(buffer, filled, buffer.length - filled, filled);
        if (bytesRead === 0) break;
        filled += bytesRead;
      }
      return buffer.subarray(0, filled);
    } finally {
      await file.close();
    }
  }

  async stat(key: string): Promise<{ size: number } | null> {
    try {
      const info = await stat(this.pathOf(key));
      return info.isFile() ? { size: info.size } : null;
    } catch (error) {
      if (MISSING_CODES.has(errorCode(error) ?? '')) return null;
      throw error;
    }
  }

  async delete(key: string): Promise<void> {
    try {
      await unlink(this.pathOf(key));
    } catch (error) {
      // EISDIR: the key names a folder of other keys, which is no object, as on S3.
      const code = errorCode(error) ?? '';
      if (MISSING_CODES.has(code) || code === 'EISDIR') return;
      throw error;
    }
  }

  async deletePrefix(prefix: string): Promise<void> {
    assertValidKey(prefix, 'prefix');
    if (prefix.endsWith('/')) {
      await rm(path.join(this.root, ...prefix.slice(0, -1).split('/')), {
        recursive: true,
        force: true,
      });
      return;
    }
    // A prefix is a string prefix, as on S3: "derived/ab" also covers "derived/abc/…".
    const segments = prefix.split('/');
    const namePrefix = segments.pop() ?? '';
    const folder = path.join(this.root, ...segments);
    let names: string[];
    try {
      names = await readdir(folder);
    } catch (error) {
      if (MISSING_CODES.has(errorCode(error) ?? '')) return;
      throw error;
    }
    await Promise.all(
      names
        .filter((name) => name.startsWith(namePrefix))
        .map((name) => rm(path.join(folder, name), { recursive: true, force: true })),
    );
  }

  async close(): Promise<void> {}

  private pathOf(key: string): string {
    assertValidKey(key);
    return path.join(this.root, ...key.split('/'));
  }

  private async openExisting(key: string): Promise<{ file: FileHandle; size: number }> {
    let file: FileHandle;
    try {
      file = await open(this.pathOf(key), 'r');
    } catch (error) {
      if (MISSING_CODES.has(errorCode(error) ?? '')) throw new StorageNotFound(key);
      throw error;
    }
    const info = await file.stat();
    // Opening a folder succeeds on Linux; a folder is not an object.
    if (!info.isFile()) {
      await file.close();
      throw new StorageNotFound(key);
    }
    return { file, size: info.size };
  }
}

/** Makes the rename itself survive a power cut, not only the file's bytes. */
async function syncFolder(folder: string): Promise<void> {
  const handle = await open(folder, 'r');
  try {
    await handle.sync();
  } finally {
    await handle.close();
  }
}
