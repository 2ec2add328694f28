import { readFileSync } from 'node:fs';
import path from 'node:path';
import { Writable } from 'node:stream';
import { LocalStorage } from '../server/adapters/storage/local-storage';
import { streamZip } from '../server/modules/delivery/set-zip';

/**
 * The delivery bench's stand-in for the app process: a process of its own that only streams the
 * set's ZIP (the delivery code, from local storage) into a sink that counts bytes, so its peak
 * resident set is the ZIP's and not the bench's file generation. Run with
 * `node --import tsx bench/delivery-zip-process.ts <storage folder> <file of names>`; prints one
 * JSON line: ms, bytes, peak_rss_mb (getrusage's maxrss over the whole process life) and
 * rss_before_mb (the process once loaded, before the first byte).
 */
class CountingSink extends Writable {
  bytes = 0;
  override _write(chunk: Buffer, _encoding: BufferEncoding, done: () => void) {
    this.bytes += chunk.length;
    done();
  }
}

const [folder, namesFile] = process.argv.slice(2);
if (!folder || !namesFile) throw new Error('usage: delivery-zip-process <folder> <names file>');
const names = readFileSync(namesFile, 'utf8').split('\n').filter(Boolean);
const storage = new LocalStorage(folder);
const before = process.memoryUsage().rss;
const sink = new CountingSink();
const started = performance.now();
await streamZip(
  sink,
  [{ name: 'manifest.csv', content: names.join('\r\n') }],
  names.map((name) => ({ name: path.basename(name), open: () => storage.read(name) })),
);
const ms = performance.now() - started;
process.stdout.write(
  `${JSON.stringify({
    ms,
    bytes: sink.bytes,
    // maxRSS is in kilobytes.
    peak_rss_mb: Math.round((process.resourceUsage().maxRSS * 1024) / 1_000_000),
    rss_before_mb: Math.round(before / 1_000_000),
  })}\n`,
);
