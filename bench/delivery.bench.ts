import { spawn } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { Writable } from 'node:stream';
import sharp from 'sharp';
import { LocalStorage } from '../server/adapters/storage/local-storage';
import { streamZip } from '../server/modules/delivery/set-zip';
import type { Benchmark } from './run';

/**
 * `npm run bench -- delivery`: 1,000 generated finals in 3 renditions (3,000 JPEGs in local
 * storage) zipped by the delivery code and streamed to a sink that only counts bytes, against
 * Info-ZIP's `zip -0` storing the same files to /dev/null in the same run. peak_rss_mb is this
 * process's largest resident set while the ZIP streams.
 */
const finals = Number(process.env.DELIVERY_BENCH_FINALS ?? 1000);
const renditions = [
  { name: 'portrait', width: 1200, height: 1500 },
  { name: 'square', width: 800, height: 800 },
  { name: 'badge', width: 420, height: 540 },
];

class CountingSink extends Writable {
  bytes = 0;
  override _write(chunk: Buffer, _encoding: BufferEncoding, done: () => void) {
    this.bytes += chunk.length;
    done();
  }
}

function runZip(folder: string, names: string[]): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn('zip', ['-0', '-q', '-', '-@'], {
      cwd: folder,
      stdio: ['pipe', 'ignore', 'inherit'],
    });
    child.on('error', reject);
    child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`zip exited ${code}`))));
    child.stdin.end(names.join('\n'));
  });
}

const benchmark: Benchmark = {
  name: 'delivery',
  async run({ print }) {
    const folder = mkdtempSync(path.join(tmpdir(), 'likeness-delivery-bench-'));
    try {
      const storage = new LocalStorage(folder);
      const names: string[] = [];
      for (const rendition of renditions) {
        // Noise stands in for a portrait's texture, so the files are of realistic size.
        const source = path.join(folder, `${rendition.name}.jpg`);
        await sharp({
          create: {
            width: rendition.width,
            height: rendition.height,
            channels: 3,
            background: '#8a8078',
            noise: { type: 'gaussian', mean: 120, sigma: 20 },
          },
        })
          .jpeg({ quality: 90 })
          .toFile(source);
        mkdirSync(path.join(folder, 'set', rendition.name), { recursive: true });
        for (let index = 0; index < finals; index += 1) {
          const name = `set/${rendition.name}/E-${String(index).padStart(5, '0')}_${rendition.name}.jpg`;
          copyFileSync(source, path.join(folder, name));
          names.push(name);
        }
      }
      const baselineStarted = performance.now();
      await runZip(folder, names);
      const baselineMs = performance.now() - baselineStarted;

      // Let the files' generation settle first (libvips keeps a cache), so the peak is the ZIP's.
      sharp.cache(false);
      (globalThis as { gc?: () => void }).gc?.();
      const before = process.memoryUsage().rss;
      let peak = before;
      const sampler = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 20);
      const sink = new CountingSink();
      const started = performance.now();
      await streamZip(
        sink,
        [{ name: 'manifest.csv', content: names.join('\r\n') }],
        names.map((name) => ({ name: path.basename(name), open: () => storage.read(name) })),
      );
      const ms = performance.now() - started;
      clearInterval(sampler);
      print({
        bench: 'delivery',
        files: names.length,
        bytes: sink.bytes,
        ms: Math.round(ms),
        baseline_ms: Math.round(baselineMs),
        ratio: Number((ms / baselineMs).toFixed(2)),
        peak_rss_mb: Math.round(peak / 1_000_000),
        rss_before_mb: Math.round(before / 1_000_000),
        goal_ratio: 1.5,
        goal_peak_rss_mb: 200,
      });
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
  },
};

export default benchmark;
