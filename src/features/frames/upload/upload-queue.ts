import { Upload, type DetailedError } from 'tus-js-client';
import { findKnownFrames } from '../api/find-known-frames';
import { sha256Hex } from './file-digest';

export type FileState =
  | 'waiting'
  | 'checking'
  | 'sending'
  | 'paused'
  | 'offline'
  | 'stored'
  | 'duplicate'
  | 'refused'
  | 'failed';

export interface QueuedFile {
  key: string;
  file: File;
  cardPath: string;
  /** What the file is for, sent as tus metadata: a card's station, or a final's pick. */
  target: { stationId: string } | { purpose: 'final'; pickId: string };
  state: FileState;
  sent: number;
  message: string | null;
}

export interface QueueSnapshot {
  files: QueuedFile[];
  totalBytes: number;
  sentBytes: number;
  bytesPerSecond: number;
  secondsLeft: number | null;
  paused: boolean;
  counts: Record<FileState, number>;
}

const finished: FileState[] = ['stored', 'duplicate', 'refused'];
const CHUNK_BYTES = 8 * 1024 * 1024;
// A dropped venue connection is retried for several minutes before a file is given up.
const RETRY_DELAYS = [0, 1000, 3000, 5000, 10_000, 20_000, 30_000, 60_000, 60_000, 60_000];

/**
 * Sends a card's files over tus, two at a time, resuming each from where the server stopped
 * (after a dropped connection, or after the page was closed and the same files chosen again).
 */
export class UploadQueue {
  private files: QueuedFile[] = [];
  /** Files being sent; null while a file is still being checked (it counts as running). */
  private running = new Map<string, Upload | null>();
  private listeners = new Set<() => void>();
  private samples: Array<{ at: number; sent: number }> = [];
  private paused = false;
  private snapshotCache: QueueSnapshot | null = null;

  constructor(
    private readonly dayId: string,
    private readonly options: { concurrency?: number; onFileDone?: () => void } = {},
  ) {}

  subscribe = (listener: () => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  getSnapshot = (): QueueSnapshot => {
    this.snapshotCache ??= this.computeSnapshot();
    return this.snapshotCache;
  };

  add(entries: Array<{ file: File; cardPath: string }>, stationId: string) {
    this.enqueue(entries.map((entry) => ({ ...entry, target: { stationId } })));
  }

  /** Retouched finals, each for the pick it was matched to. */
  addFinals(entries: Array<{ file: File; cardPath: string; pickId: string }>) {
    this.enqueue(
      entries.map(({ pickId, ...entry }) => ({
        ...entry,
        target: { purpose: 'final' as const, pickId },
      })),
    );
  }

  private enqueue(entries: Array<Pick<QueuedFile, 'file' | 'cardPath' | 'target'>>) {
    const present = new Set(this.files.map((item) => item.key));
    for (const entry of entries) {
      const where = 'pickId' in entry.target ? entry.target.pickId : entry.target.stationId;
      const key = `${where}:${entry.cardPath}:${entry.file.size}:${entry.file.lastModified}`;
      if (present.has(key)) continue;
      present.add(key);
      this.files.push({ ...entry, key, state: 'waiting', sent: 0, message: null });
    }
    this.changed();
    this.pump();
  }

  pause() {
    this.paused = true;
    for (const [key, upload] of this.running) {
      void upload?.abort();
      this.update(key, { state: 'paused' });
    }
    this.running.clear();
    this.changed();
  }

  resume() {
    this.paused = false;
    for (const item of this.files) {
      if (item.state === 'paused' || item.state === 'offline' || item.state === 'failed') {
        item.state = 'waiting';
        item.message = null;
      }
    }
    this.changed();
    this.pump();
  }

  /** Files cut off by the network start again by themselves once it is back. */
  networkReturned() {
    if (this.paused) return;
    for (const item of this.files) if (item.state === 'offline') item.state = 'waiting';
    this.changed();
    this.pump();
  }

  clearFinished() {
    this.files = this.files.filter((item) => !finished.includes(item.state));
    this.changed();
  }

  private pump() {
    const limit = this.options.concurrency ?? 2;
    while (!this.paused && this.running.size < limit) {
      const next = this.files.find((item) => item.state === 'waiting');
      if (!next) return;
      next.state = 'checking';
      this.running.set(next.key, null);
      void this.send(next);
    }
  }

  private async send(item: QueuedFile) {
    try {
      // Digests need a secure page; over plain http the server still recognises duplicates.
      const sha256 = await sha256Hex(item.file);
      if (sha256 && 'stationId' in item.target) {
        const { known } = await findKnownFrames(this.dayId, {
          files: [{ cardPath: item.cardPath, sha256 }],
        });
        if (known.length > 0) {
          this.finish(item, 'duplicate', 'Already uploaded: kept once.');
          return;
        }
      }
      // Paused while checking: the file waits for Resume.
      if (this.running.get(item.key) !== null) return;
      const upload = new Upload(item.file, {
        endpoint: '/api/uploads',
        chunkSize: CHUNK_BYTES,
        retryDelays: RETRY_DELAYS,
        removeFingerprintOnSuccess: true,
        metadata: {
          dayId: this.dayId,
          ...item.target,
          cardPath: item.cardPath,
          ...(sha256 ? { sha256 } : {}),
        },
        fingerprint: async () => `likeness:${this.dayId}:${item.key}`,
        onShouldRetry: (error) => {
          const status = error.originalResponse?.getStatus() ?? 0;
          return status === 0 || status >= 500 || status === 409 || status === 423;
        },
        onProgress: (sent) => this.update(item.key, { sent, state: 'sending' }),
        onSuccess: ({ lastResponse }) => {
          const outcome = lastResponse.getHeader('Likeness-Upload-Outcome');
          this.finish(
            item,
            outcome === 'duplicate' ? 'duplicate' : 'stored',
            outcome === 'duplicate' ? 'Already uploaded: kept once.' : null,
          );
        },
        onError: (error) => this.failed(item, error),
      });
      const previous = await upload.findPreviousUploads();
      if (previous[0]) upload.resumeFromPreviousUpload(previous[0]);
      this.running.set(item.key, upload);
      this.update(item.key, { state: 'sending' });
      upload.start();
    } catch (error) {
      this.failed(item, error instanceof Error ? error : new Error(String(error)));
    }
  }

  private failed(item: QueuedFile, error: Error | DetailedError) {
    if (!this.running.has(item.key)) return; // paused meanwhile
    const response = 'originalResponse' in error ? error.originalResponse : null;
    const status = response?.getStatus() ?? 0;
    if (status === 0 || !navigator.onLine) {
      this.running.delete(item.key);
      this.update(item.key, { state: 'offline', message: 'Waiting for the network to return.' });
      this.pump();
      return;
    }
    this.finish(item, status >= 400 && status < 500 ? 'refused' : 'failed', messageOf(response));
  }

  private finish(item: QueuedFile, state: FileState, message: string | null) {
    this.running.delete(item.key);
    this.update(item.key, {
      state,
      message,
      sent: state === 'refused' ? item.sent : item.file.size,
    });
    if (state === 'stored' || state === 'duplicate') this.options.onFileDone?.();
    this.pump();
  }

  private update(key: string, patch: Partial<QueuedFile>) {
    const item = this.files.find((candidate) => candidate.key === key);
    if (item) Object.assign(item, patch);
    this.changed();
  }

  private changed() {
    this.snapshotCache = null;
    for (const listener of this.listeners) listener();
  }

  private computeSnapshot(): QueueSnapshot {
    const counts = Object.fromEntries(
      [
        'waiting',
        'checking',
        'sending',
        'paused',
        'offline',
        'stored',
        'duplicate',
        'refused',
        'failed',
      ].map((state) => [state, 0]),
    ) as Record<FileState, number>;
    let totalBytes = 0;
    let sentBytes = 0;
    for (const item of this.files) {
      counts[item.state] += 1;
      totalBytes += item.file.size;
      sentBytes += Math.min(item.sent, item.file.size);
    }
    const now = Date.now();
    this.samples.push({ at: now, sent: sentBytes });
    this.samples = this.samples.filter((sample) => now - sample.at <= 10_000);
    const oldest = this.samples[0] ?? { at: now, sent: sentBytes };
    const elapsed = (now - oldest.at) / 1000;
    const bytesPerSecond = elapsed >= 1 ? Math.max(0, (sentBytes - oldest.sent) / elapsed) : 0;
    const left = totalBytes - sentBytes;
    return {
      files: [...this.files],
      totalBytes,
      sentBytes,
      bytesPerSecond,
      secondsLeft: bytesPerSecond > 0 && left > 0 ? Math.round(left / bytesPerSecond) : null,
      paused: this.paused,
      counts,
    };
  }
}

function messageOf(response: { getBody(): string; getStatus(): number } | null): string {
  if (!response) return 'The upload failed.';
  try {
    const body = JSON.parse(response.getBody()) as { error?: { message?: string } };
    if (body.error?.message) return body.error.message;
  } catch {
    // Not JSON: fall through to the status.
  }
  return `The server answered ${response.getStatus()}.`;
}
