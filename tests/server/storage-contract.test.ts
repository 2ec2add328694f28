import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { mkdtemp, readdir, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { Readable } from 'node:stream';
import { ListObjectsV2Command } from '@aws-sdk/client-s3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseEnvironment, toAppConfig } from '../../server/config';
import { createStorage } from '../../server/adapters/storage/create-storage';
import { S3Storage } from '../../server/adapters/storage/s3-storage';
import {
  StorageNotFound,
  StorageRangeNotSatisfiable,
  type ObjectStorage,
} from '../../server/adapters/storage/storage';
import { AppError } from '../../server/lib/errors';
import { s3StorageFor, startS3Fake } from '../setup/s3-fake';

const MiB = 1024 * 1024;

interface Harness {
  storage: ObjectStorage;
  /** Everything the implementation holds under prefix: objects, and on disk temporary files too. */
  leftovers(prefix: string): Promise<string[]>;
  stop(): Promise<void>;
}

const implementations: Array<{ name: string; start(): Promise<Harness> }> = [
  {
    name: 'local',
    async start() {
      const root = await mkdtemp(path.join(os.tmpdir(), 'likeness-storage-'));
      const storage = createStorage({ kind: 'local', root });
      return {
        storage,
        async leftovers(prefix) {
          const entries = await readdir(root, { recursive: true, withFileTypes: true });
          return entries
            .filter((entry) => entry.isFile())
            .map((entry) => path.relative(root, path.join(entry.parentPath, entry.name)))
            .filter((relative) => relative.startsWith(prefix));
        },
        async stop() {
          await storage.close();
          await rm(root, { recursive: true, force: true });
        },
      };
    },
  },
  {
    name: 's3',
    async start() {
      const fake = await startS3Fake();
      const storage = s3StorageFor(fake);
      if (!(storage instanceof S3Storage)) throw new Error('expected the S3 implementation');
      return {
        storage,
        async leftovers(prefix) {
          const page = await storage.client.send(
            new ListObjectsV2Command({ Bucket: fake.bucket, Prefix: prefix }),
          );
          return (page.Contents ?? []).map((object) => object.Key ?? '');
        },
        async stop() {
          await storage.close();
          await fake.stop();
        },
      };
    },
  },
];

async function readAll(stream: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(Buffer.from(chunk as Buffer));
  return Buffer.concat(chunks);
}

const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');

/** Like a camera card pulled out mid-copy: some data, then an error. */
function failingStream(bytesBeforeFailure: number): Readable {
  let sent = 0;
  return new Readable({
    read() {
      if (sent >= bytesBeforeFailure) {
        this.destroy(new Error('camera card removed'));
        return;
      }
      const chunk = randomBytes(256 * 1024);
      sent += chunk.length;
      this.push(chunk);
    },
  });
}

function chunked(bytes: Buffer, size = 64 * 1024): Readable {
  const parts: Buffer[] = [];
  for (let offset = 0; offset < bytes.length; offset += size) {
    parts.push(bytes.subarray(offset, offset + size));
  }
  return Readable.from(parts);
}

describe.each(implementations)('$name storage', ({ start }) => {
  let harness: Harness;
  let storage: ObjectStorage;
  let workFolder: string;
  let prefix: string;

  beforeAll(async () => {
    harness = await start();
    storage = harness.storage;
    workFolder = await mkdtemp(path.join(os.tmpdir(), 'likeness-storage-input-'));
  });
  afterAll(async () => {
    await harness.stop();
    await rm(workFolder, { recursive: true, force: true });
  });

  const freshPrefix = () => {
    prefix = `test-${randomUUID()}/`;
    return prefix;
  };

  it('returns the exact bytes of a multi-megabyte buffer and of a stream', async () => {
    const base = freshPrefix();
    const frame = randomBytes(3 * MiB + 17);

    await expect(
      storage.put(`${base}buffer.jpg`, frame, { contentType: 'image/jpeg' }),
    ).resolves.toEqual({
      size: frame.length,
    });
    await expect(storage.put(`${base}stream.jpg`, chunked(frame))).resolves.toEqual({
      size: frame.length,
    });

    expect(sha256(await readAll(await storage.read(`${base}buffer.jpg`)))).toBe(sha256(frame));
    expect(sha256(await readAll(await storage.read(`${base}stream.jpg`)))).toBe(sha256(frame));
    await expect(storage.stat(`${base}stream.jpg`)).resolves.toEqual({ size: frame.length });
  });

  it('stores a 12 MB file from disk byte for byte, ranges across part boundaries included', async () => {
    const base = freshPrefix();
    const raw = randomBytes(12 * MiB + 123);
    const filePath = path.join(workFolder, 'frame-0042.raw');
    await writeFile(filePath, raw);

    await expect(storage.putFile(`${base}frame-0042.raw`, filePath)).resolves.toEqual({
      size: raw.length,
    });

    const stored = await readAll(await storage.read(`${base}frame-0042.raw`));
    expect(stored.length).toBe(raw.length);
    expect(stored.equals(raw)).toBe(true);
    const boundary = 5 * MiB;
    const across = await readAll(
      await storage.read(`${base}frame-0042.raw`, { start: boundary - 10, end: boundary + 9 }),
    );
    expect(across.equals(raw.subarray(boundary - 10, boundary + 10))).toBe(true);
  });

  it('reads inclusive byte ranges, clamps the end, and refuses a start past the end', async () => {
    const base = freshPrefix();
    const bytes = Buffer.from(Array.from({ length: 1000 }, (_, index) => index % 251));
    await storage.put(`${base}preview.jpg`, bytes);

    const range = async (start: number, end: number) =>
      readAll(await storage.read(`${base}preview.jpg`, { start, end }));
    // Not (0, 0): s3rver reads "bytes=0-0" as the whole object; S3 itself answers one byte.
    expect((await range(0, 1)).equals(bytes.subarray(0, 2))).toBe(true);
    expect((await range(999, 999)).equals(bytes.subarray(999))).toBe(true);
    expect((await range(10, 19)).equals(bytes.subarray(10, 20))).toBe(true);
    expect((await range(990, 5000)).equals(bytes.subarray(990))).toBe(true);
    await expect(range(1000, 1010)).rejects.toBeInstanceOf(StorageRangeNotSatisfiable);
    await expect(range(20, 10)).rejects.toMatchObject({ code: 'invalid_range', status: 400 });
  });

  it('reads the head of an object for EXIF, or all of it when it is shorter', async () => {
    const base = freshPrefix();
    const frame = randomBytes(2 * MiB);
    await storage.put(`${base}frame.jpg`, frame);
    await storage.put(`${base}tiny.jpg`, frame.subarray(0, 100));

    expect(
      (await storage.readHead(`${base}frame.jpg`, 64 * 1024)).equals(frame.subarray(0, 64 * 1024)),
    ).toBe(true);
    expect(
      (await storage.readHead(`${base}tiny.jpg`, 64 * 1024)).equals(frame.subarray(0, 100)),
    ).toBe(true);
  });

  it('reports a missing object as null from stat and as not found from reads', async () => {
    const base = freshPrefix();
    await expect(storage.stat(`${base}missing.jpg`)).resolves.toBeNull();
    const reading = storage.read(`${base}missing.jpg`);
    await expect(reading).rejects.toBeInstanceOf(StorageNotFound);
    await expect(reading).rejects.toMatchObject({ code: 'not_found', status: 404 });
    await expect(storage.read(`${base}missing.jpg`, { start: 0, end: 9 })).rejects.toBeInstanceOf(
      StorageNotFound,
    );
    await expect(storage.readHead(`${base}missing.jpg`, 10)).rejects.toBeInstanceOf(
      StorageNotFound,
    );
    // A "folder" of other keys is not an object either.
    await storage.put(`${base}folder/inside.jpg`, Buffer.from('x'));
    await expect(storage.stat(`${base}folder`)).resolves.toBeNull();
    await expect(storage.read(`${base}folder`)).rejects.toBeInstanceOf(StorageNotFound);
  });

  it('deletes idempotently', async () => {
    const base = freshPrefix();
    await storage.put(`${base}thumb.jpg`, Buffer.from('thumbnail'));
    await storage.delete(`${base}thumb.jpg`);
    await expect(storage.stat(`${base}thumb.jpg`)).resolves.toBeNull();
    await expect(storage.delete(`${base}thumb.jpg`)).resolves.toBeUndefined();
    await expect(storage.delete(`${base}never/was.jpg`)).resolves.toBeUndefined();
  });

  it('deletes by prefix only what starts with that prefix', async () => {
    const base = freshPrefix();
    const keys = [
      'derived/frame-1/preview.jpg',
      'derived/frame-1/thumb.jpg',
      'derived/frame-10/thumb.jpg',
      'derived/frame-2/thumb.jpg',
      'derived-old/frame-1/thumb.jpg',
      'originals/frame-1.jpg',
    ];
    for (const key of keys) await storage.put(`${base}${key}`, Buffer.from(key));
    const remaining = async () =>
      (await harness.leftovers(base)).map((key) => key.slice(base.length)).sort();

    await storage.deletePrefix(`${base}derived/frame-1/`);
    expect(await remaining()).toEqual([
      'derived-old/frame-1/thumb.jpg',
      'derived/frame-10/thumb.jpg',
      'derived/frame-2/thumb.jpg',
      'originals/frame-1.jpg',
    ]);

    // Without a trailing slash it is a plain string prefix, as on S3.
    await storage.deletePrefix(`${base}derived/frame-1`);
    expect(await remaining()).toEqual([
      'derived-old/frame-1/thumb.jpg',
      'derived/frame-2/thumb.jpg',
      'originals/frame-1.jpg',
    ]);

    await storage.deletePrefix(`${base}derived/`);
    await storage.deletePrefix(`${base}nothing-here/`);
    expect(await remaining()).toEqual(['derived-old/frame-1/thumb.jpg', 'originals/frame-1.jpg']);
  });

  it('refuses keys that could escape the root or are ambiguous, writing nothing', async () => {
    const base = freshPrefix();
    const badKeys = [
      '',
      '/etc/passwd',
      '../outside.jpg',
      `${base}../../outside.jpg`,
      `${base}a/../b.jpg`,
      `${base}a/./b.jpg`,
      `${base}a//b.jpg`,
      `${base}a\\b.jpg`,
      `${base}line\nbreak.jpg`,
      `${base}nul\u0000.jpg`,
      `${base}.hidden.jpg`,
      `${base}folder/`,
      `${base}${'x'.repeat(1025)}`,
    ];
    for (const key of badKeys) {
      const refused = { code: 'invalid_storage_key', status: 400 };
      await expect(storage.put(key, Buffer.from('x')), JSON.stringify(key)).rejects.toMatchObject(
        refused,
      );
      await expect(storage.read(key), JSON.stringify(key)).rejects.toMatchObject(refused);
      await expect(storage.stat(key), JSON.stringify(key)).rejects.toMatchObject(refused);
      await expect(storage.delete(key), JSON.stringify(key)).rejects.toMatchObject(refused);
    }
    await expect(storage.deletePrefix('')).rejects.toBeInstanceOf(AppError);
    await expect(storage.deletePrefix('../')).rejects.toBeInstanceOf(AppError);
    expect(await harness.leftovers(base)).toEqual([]);
  });

  it('replaces an object when a key is written again', async () => {
    const base = freshPrefix();
    await storage.put(`${base}look.jpg`, randomBytes(2 * MiB));
    const second = Buffer.from('a much shorter second version');
    await expect(storage.put(`${base}look.jpg`, chunked(second, 8))).resolves.toEqual({
      size: second.length,
    });
    expect((await readAll(await storage.read(`${base}look.jpg`))).equals(second)).toBe(true);
    await expect(storage.stat(`${base}look.jpg`)).resolves.toEqual({ size: second.length });
  });

  it('leaves nothing behind, and keeps the previous version, when the stream fails midway', async () => {
    const base = freshPrefix();
    // 6 MiB crosses S3's 5 MiB part size, so the multipart path fails too, not only a single PUT.
    await expect(storage.put(`${base}new.jpg`, failingStream(6 * MiB))).rejects.toThrow(
      'camera card removed',
    );
    await expect(storage.stat(`${base}new.jpg`)).resolves.toBeNull();
    expect(await harness.leftovers(base)).toEqual([]);

    const original = randomBytes(MiB);
    await storage.put(`${base}kept.jpg`, original);
    await expect(storage.put(`${base}kept.jpg`, failingStream(MiB / 2))).rejects.toThrow(
      'camera card removed',
    );
    expect((await readAll(await storage.read(`${base}kept.jpg`))).equals(original)).toBe(true);
    expect(await harness.leftovers(base)).toEqual([`${base}kept.jpg`]);
  });
});

describe('storage settings', () => {
  it('defaults to local storage under the data folder', () => {
    const config = toAppConfig(parseEnvironment({ LIKENESS_DATA_DIR: '/srv/likeness' }));
    expect(config.storage).toEqual({ kind: 'local', root: '/srv/likeness/storage' });
    expect(createStorage(config.storage).kind).toBe('local');
  });

  it('reads the S3 settings', () => {
    const config = toAppConfig(
      parseEnvironment({
        STORAGE: 's3',
        S3_BUCKET: 'frames',
        S3_ENDPOINT: 'http://127.0.0.1:9000',
        S3_FORCE_PATH_STYLE: 'true',
      }),
    );
    expect(config.storage).toEqual({
      kind: 's3',
      bucket: 'frames',
      region: 'us-east-1',
      endpoint: 'http://127.0.0.1:9000',
      forcePathStyle: true,
    });
  });

  it('fails loudly when S3 is chosen without a bucket', () => {
    expect(() => toAppConfig(parseEnvironment({ STORAGE: 's3' }))).toThrow(/S3_BUCKET/);
    expect(() => parseEnvironment({ STORAGE: 'disk' })).toThrow(/STORAGE/);
  });
});
