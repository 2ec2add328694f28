import { createReadStream } from 'node:fs';
import { Readable } from 'node:stream';
import {
  DeleteObjectCommand,
  DeleteObjectsCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
} from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import {
  assertValidHeadLength,
  assertValidKey,
  assertValidRange,
  StorageNotFound,
  StorageRangeNotSatisfiable,
  type ByteRange,
  type ObjectStorage,
  type PutOptions,
} from './storage';

export interface S3StorageOptions {
  bucket: string;
  region: string;
  /** For S3-compatible services and test fakes; omitted for AWS itself. */
  endpoint?: string;
  /** Bucket in the path instead of the host name, which most self-hosted services need. */
  forcePathStyle: boolean;
  /**
   * Normally left out so the SDK's default chain applies (AWS_ACCESS_KEY_ID and
   * AWS_SECRET_ACCESS_KEY, a profile, or an instance role); tests pass the fake's keys here.
   */
  credentials?: { accessKeyId: string; secretAccessKey: string };
  /** Bytes per multipart part (at least 5 MiB, S3's minimum). */
  partSize?: number;
}

const MIN_PART_SIZE = 5 * 1024 * 1024;
// Two cores serve everything, so a few parts in flight are enough to keep the link busy.
const PARTS_IN_FLIGHT = 3;
const DELETE_BATCH = 1000; // DeleteObjects' own limit.

/** Objects in one S3 (or S3-compatible) bucket, keys used as they are. */
export class S3Storage implements ObjectStorage {
  readonly kind = 's3' as const;
  readonly client: S3Client;
  readonly bucket: string;
  private readonly partSize: number;

  constructor(options: S3StorageOptions) {
    this.bucket = options.bucket;
    this.partSize = Math.max(options.partSize ?? MIN_PART_SIZE, MIN_PART_SIZE);
    this.client = new S3Client({
      region: options.region,
      endpoint: options.endpoint,
      forcePathStyle: options.forcePathStyle,
      credentials: options.credentials,
      // With the default (checksums always), streamed bodies are sent with aws-chunked framing,
      // which some S3-compatible servers store as part of the object. Only send them when S3 requires.
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
    });
  }

  async put(
    key: string,
    body: Readable | Buffer,
    options: PutOptions = {},
  ): Promise<{ size: number }> {
    assertValidKey(key);
    if (Buffer.isBuffer(body)) {
      // One PutObject is atomic and a 30 MB frame is far below its 5 GB limit.
      await this.client.send(
        new PutObjectCommand({
          Bucket: this.bucket,
          Key: key,
          Body: body,
          ContentLength: body.length,
          ContentType: options.contentType,
        }),
      );
      return { size: body.length };
    }
    const counted = { size: 0, sourceError: undefined as unknown };
    const upload = new Upload({
      client: this.client,
      params: {
        Bucket: this.bucket,
        Key: key,
        Body: Readable.from(countBytes(body, counted)),
        ContentType: options.contentType,
      },
      partSize: this.partSize,
      queueSize: PARTS_IN_FLIGHT,
      // An unfinished multipart upload is invisible to readers; aborting it frees its parts.
      leavePartsOnError: false,
    });
    try {
      await upload.done();
    } catch (error) {
      body.destroy();
      // Report why the data stopped, not the follow-up failure of aborting the upload.
      throw counted.sourceError ?? error;
    }
    return { size: counted.size };
  }

  async putFile(
    key: string,
    filePath: string,
    options: PutOptions = {},
  ): Promise<{ size: number }> {
    assertValidKey(key);
    return this.put(key, createReadStream(filePath), options);
  }

  async read(key: string, range?: ByteRange): Promise<Readable> {
    assertValidKey(key);
    if (range) assertValidRange(range);
    try {
      const output = await this.client.send(
        new GetObjectCommand({
          Bucket: this.bucket,
          Key: key,
          Range: range ? `bytes=${range.start}-${range.end}` : undefined,
        }),
      );
      if (!(output.Body instanceof Readable)) {
        throw new Error(`S3 returned no readable body for ${key}.`);
      }
      return output.Body;
    } catch (error) {
      throw translateError(error, key, range);
    }
  }

  async readHead(key: string, length: number): Promise<Buffer> {
    assertValidKey(key);
    assertValidHeadLength(length);
    try {
      const output = await this.client.send(
        new GetObjectCommand({ Bucket: this.bucket, Key: key, Range: `bytes=0-${length - 1}` }),
      );
      const bytes = (await output.Body?.transformToByteArray()) ?? new Uint8Array();
      return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    } catch (error) {
      // S3 refuses any range on an empty object; its head is simply empty.
      if (isInvalidRange(error)) return Buffer.alloc(0);
      throw translateError(error, key);
    }
  }

  async stat(key: string): Promise<{ size: number } | null> {
    assertValidKey(key);
    try {
      const output = await this.client.send(
        new HeadObjectCommand({ Bucket: this.bucket, Key: key }),
      );
      return { size: output.ContentLength ?? 0 };
    } catch (error) {
      if (isMissingObject(error)) return null;
      throw error;
    }
  }

  async delete(key: string): Promise<void> {
    assertValidKey(key);
    // S3 answers 204 for a missing key too, so this is idempotent as it stands.
    await this.client.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: key }));
  }

  async deletePrefix(prefix: string): Promise<void> {
    assertValidKey(prefix, 'prefix');
    let continuationToken: string | undefined;
    do {
      const page = await this.client.send(
        new ListObjectsV2Command({
          Bucket: this.bucket,
          Prefix: prefix,
          ContinuationToken: continuationToken,
          MaxKeys: DELETE_BATCH,
        }),
      );
      const objects = (page.Contents ?? []).flatMap((object) =>
        object.Key ? [{ Key: object.Key }] : [],
      );
      if (objects.length > 0) {
        const result = await this.client.send(
          new DeleteObjectsCommand({
            Bucket: this.bucket,
            Delete: { Objects: objects, Quiet: true },
          }),
        );
        const failed = result.Errors ?? [];
        if (failed.length > 0) {
          const first = failed[0];
          throw new Error(
            `Could not delete ${failed.length} object(s) under ${prefix}, e.g. ${first?.Key}: ${first?.Code} ${first?.Message}`,
          );
        }
      }
      continuationToken = page.IsTruncated ? page.NextContinuationToken : undefined;
    } while (continuationToken);
  }

  async close(): Promise<void> {
    this.client.destroy();
  }
}

/** Passes the source through unchanged, counting bytes and remembering whether the source failed. */
async function* countBytes(
  source: Readable,
  counted: { size: number; sourceError: unknown },
): AsyncGenerator<Buffer> {
  try {
    for await (const chunk of source as AsyncIterable<Buffer | string>) {
      const bytes = typeof chunk === 'string' ? Buffer.from(chunk) : chunk;
      counted.size += bytes.length;
      yield bytes;
    }
  } catch (error) {
    counted.sourceError = error;
    throw error;
  }
}

function isMissingObject(error: unknown): boolean {
  // Only a missing key: NoSuchBucket is a configuration mistake and must not look like "no file".
  return (
    error instanceof S3ServiceException && (error.name === 'NoSuchKey' || error.name === 'NotFound')
  );
}

function isInvalidRange(error: unknown): boolean {
  return (
    error instanceof S3ServiceException &&
    (error.name === 'InvalidRange' || error.$metadata.httpStatusCode === 416)
  );
}

function translateError(error: unknown, key: string, range?: ByteRange): unknown {
  if (isMissingObject(error)) return new StorageNotFound(key);
  if (range && isInvalidRange(error)) return new StorageRangeNotSatisfiable(key, range);
  return error;
}
