import { spawn } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import type { Benchmark } from './run';

/**
 * `npm run bench -- delivery`: 1,000 generated finals in 3 renditions (3,000 JPEGs in local
 * storage) zipped by the delivery code and streamed to a sink that only counts bytes, against
 * Info-ZIP's `zip -0` storing the same files to /dev/null in the same run. The delivery side runs
 * in a process of its own (delivery-zip-process.ts) so peak_rss_mb is that process's largest
 * resident set over its life, loading included, and not this one's, which generated the files.
 */
const finals = Number(process.env.DELIVERY_BENCH_FINALS ?? 1000);
const renditions = [
  { name: 'portrait', width: 1200, height: 1500 },
  { name: 'square', width: 800, height: 800 },
  { name: 'badge', width: 420, height: 540 },
];

interface ZipProcessResult {
  ms: number;
  bytes: number;
  peak_rss_mb: number;
  rss_before_mb: number;
}

function runDeliveryProcess(folder: string, namesFile: string): Promise<ZipProcessResult> {
  const script = path.join(import.meta.dirname, 'delivery-zip-process.ts');
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', script, folder, namesFile], {
      stdio: ['ignore', 'pipe', 'inherit'],
    });
    let output = '';
    child.stdout.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.on('error', reject);
    child.on('exit', (code) =>
      code === 0
        ? resolve(JSON.parse(output) as ZipProcessResult)
        : reject(new Error(`the delivery process exited ${code}`)),
    );
  });
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

      const namesFile = path.join(folder, 'names.txt');
      writeFileSync(namesFile, names.join('\n'));
      const delivery = await runDeliveryProcess(folder, namesFile);
      print({
        bench: 'delivery',
        files: names.length,
        bytes: delivery.bytes,
        ms: Math.round(delivery.ms),
        baseline_ms: Math.round(baselineMs),
        ratio: Number((delivery.ms / baselineMs).toFixed(2)),
        peak_rss_mb: delivery.peak_rss_mb,
        rss_before_mb: delivery.rss_before_mb,
        goal_ratio: 1.5,
        goal_peak_rss_mb: 200,
      });
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
  },
};

export default benchmark;
