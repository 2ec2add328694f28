import { spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { readFrameFile } from '../server/modules/frames/reading/read-frame';
import type { Benchmark } from './run';

/**
 * `npm run bench -- ingest`: 200 generated 24-megapixel JPEGs read as ingest reads them
 * (capture data, 2048 px preview, 320 px thumbnail, slate scan), two at a time as the worker
 * runs, against Debian's vipsthumbnail making the same 2048 px previews, two at a time, in the
 * same run. Peak memory is this process's maximum resident set.
 */
const frameCount = Number(process.env.INGEST_BENCH_FRAMES ?? 200);
const distinctFrames = 8;
const concurrency = 2;

function ensureVipsthumbnail() {
  if (existsSync('/usr/bin/vipsthumbnail')) return;
  if (process.getuid?.() !== 0)
    throw new Error('vipsthumbnail is missing: apt-get install libvips-tools');
  const result = spawnSync('sh', ['-c', 'apt-get update && apt-get install -y libvips-tools'], {
    stdio: 'inherit',
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  });
  if (result.status !== 0) throw new Error('Installing libvips-tools failed.');
}

async function makeFrames(folder: string): Promise<string[]> {
  // Noise stands in for a real photograph's texture: flat colours decode unrealistically fast.
  const sources: string[] = [];
  for (let index = 0; index < distinctFrames; index += 1) {
    const file = path.join(folder, `source-${index}.jpg`);
    await sharp({
      create: {
        width: 6000,
        height: 4000,
        channels: 3,
        background: '#808080',
        noise: { type: 'gaussian', mean: 100 + index * 10, sigma: 25 },
      },
    })
      .withExif({
        IFD0: { Make: 'Corvane', Model: 'CX-5' },
        IFD2: { DateTimeOriginal: '2027:03:04 09:15:02' },
      })
      .jpeg({ quality: 88 })
      .toFile(file);
    sources.push(file);
  }
  const cardFolder = path.join(folder, 'DCIM', '100HPENG');
  mkdirSync(cardFolder, { recursive: true });
  return Array.from({ length: frameCount }, (_, index) => {
    const file = path.join(cardFolder, `HPE_${String(index + 1).padStart(4, '0')}.JPG`);
    copyFileSync(sources[index % distinctFrames]!, file);
    return file;
  });
}

async function inPool<T>(items: T[], work: (item: T) => Promise<void>) {
  let next = 0;
  await Promise.all(
    Array.from({ length: concurrency }, async () => {
      while (next < items.length) {
        const item = items[next]!;
        next += 1;
        await work(item);
      }
    }),
  );
}

const benchmark: Benchmark = {
  name: 'ingest',
  async run({ print }) {
    ensureVipsthumbnail();
    const folder = mkdtempSync(path.join(tmpdir(), 'likeness-ingest-bench-'));
    try {
      const files = await makeFrames(folder);
      const outFolder = path.join(folder, 'out');
      mkdirSync(outFolder);

      const half = Math.ceil(files.length / concurrency);
      const parallelBaselineMs = await timeParallelVips(files, outFolder, half);

      const started = performance.now();
      let slates = 0;
      await inPool(files, async (filePath) => {
        const reading = await readFrameFile({
          filePath,
          cardPath: path.relative(folder, filePath),
          maxPixels: 1e8,
        });
        slates += reading.slateTokens.length;
        writeFileSync(
          path.join(outFolder, `${path.basename(filePath)}-preview.jpg`),
          reading.preview!,
        );
      });
      const ms = performance.now() - started;
      const peakRssMb = process.resourceUsage().maxRSS / 1024;
      print({
        bench: 'ingest',
        frames: files.length,
        megapixels: 24,
        ms: Math.round(ms),
        per_frame_ms: Math.round(ms / files.length),
        baseline_ms: Math.round(parallelBaselineMs),
        ratio: Number((ms / parallelBaselineMs).toFixed(2)),
        goal_ratio: 1.5,
        peak_rss_mb: Math.round(peakRssMb),
        goal_peak_rss_mb: 600,
        slates_found: slates,
      });
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
  },
};

/** vipsthumbnail over the files in `concurrency` child processes running side by side. */
async function timeParallelVips(files: string[], outFolder: string, half: number): Promise<number> {
  const { spawn } = await import('node:child_process');
  const started = performance.now();
  await Promise.all(
    Array.from({ length: concurrency }, (_, index) =>
      files.slice(index * half, (index + 1) * half),
    ).map(
      (part) =>
        new Promise<void>((resolve, reject) => {
          const child = spawn('vipsthumbnail', [
            ...part,
            '--size',
            '2048',
            '-o',
            `${outFolder}/%s-vips.jpg[Q=82]`,
          ]);
          child.on('exit', (code) =>
            code === 0 ? resolve() : reject(new Error(`vipsthumbnail exit ${code}`)),
          );
        }),
    ),
  );
  return performance.now() - started;
}

export default benchmark;
