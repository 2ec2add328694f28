import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { createEyeFinder, DETECTION_EDGE } from '../server/modules/looks/eye-finder';
import { loadFaceModel } from '../server/modules/looks/eye-human';
import { debianPortrait, placePortrait } from '../tests/support/debian-portrait';
import type { Benchmark } from './run';

/**
 * `npm run bench -- looks-detect`: eyes found in generated 24-megapixel JPEGs (6000 x 4000,
 * grain over grey, Debian's astronaut portrait scaled to a headshot's size at different places
 * and rolls), one after another as the finder runs them, against sharp alone decoding the same
 * files to the 1,024 px detection copy in the same run. The model's one-time load is printed
 * apart and not counted.
 *
 * A second line times one pass of the face models (detector, mesh, iris) over a 1,024 px copy
 * already in memory: the model's own speed, which the issue quotes at about 60 ms. A find() makes
 * one such pass on the whole frame and two on a close crop of the face (straight and mirrored),
 * after decoding the JPEG.
 */
const frameCount = Number(process.env.LOOKS_BENCH_FRAMES ?? 50);
const distinctFrames = 8;

async function makeFrames(folder: string): Promise<string[]> {
  const portrait = await debianPortrait();
  const files: string[] = [];
  for (let index = 0; index < distinctFrames; index += 1) {
    // A headshot: the face box 12-20% of the long edge, somewhere around the middle.
    const scale = 4.2 + (index % 4) * 0.6;
    const side = Math.round(512 * scale);
    const placed = await placePortrait(portrait, {
      frameWidth: 6000,
      frameHeight: 4000,
      left: Math.round(((6000 - side * 1.1) * (index + 1)) / (distinctFrames + 1)),
      top: Math.round((4000 - side * 1.1) * (index % 2 === 0 ? 0.1 : 0.8)),
      scale,
      rollDeg: (index % 5) - 2,
      noise: true,
    });
    const file = path.join(folder, `frame-${index}.jpg`);
    writeFileSync(file, placed.frame);
    files.push(file);
  }
  return files;
}

const benchmark: Benchmark = {
  name: 'looks-detect',
  async run({ print }) {
    const folder = mkdtempSync(path.join(tmpdir(), 'likeness-looks-bench-'));
    const finder = createEyeFinder();
    try {
      const files = await makeFrames(folder);
      const loadStarted = performance.now();
      await finder.find(files[0]!);
      const loadMs = performance.now() - loadStarted;

      const statuses: Record<string, number> = {};
      const started = performance.now();
      for (let index = 0; index < frameCount; index += 1) {
        const finding = await finder.find(files[index % files.length]!);
        statuses[finding.status] = (statuses[finding.status] ?? 0) + 1;
      }
      const msPerImage = (performance.now() - started) / frameCount;

      const baselineStarted = performance.now();
      for (let index = 0; index < frameCount; index += 1) {
        await sharp(files[index % files.length]!)
          .rotate()
          .resize({ width: DETECTION_EDGE, height: DETECTION_EDGE, fit: 'inside' })
          .removeAlpha()
          .raw()
          .toBuffer();
      }
      const baselineMsPerImage = (performance.now() - baselineStarted) / frameCount;

      const passMs = await timeOneModelPass(files);

      print({
        bench: 'looks-detect-model-pass',
        images: files.length * 5,
        ms_per_1024px_image: Math.round(passMs),
        goal_ms: 60,
      });
      print({
        bench: 'looks-detect',
        frames: frameCount,
        ms_per_image: Math.round(msPerImage),
        baseline_ms_per_image: Math.round(baselineMsPerImage),
        ratio: Number((msPerImage / baselineMsPerImage).toFixed(2)),
        first_call_ms: Math.round(loadMs),
        statuses,
      });
    } finally {
      await finder.close();
      rmSync(folder, { recursive: true, force: true });
    }
  },
};

/** One model pass per 1,024 px copy, the copies decoded beforehand; the first pass warms up. */
async function timeOneModelPass(files: string[]): Promise<number> {
  const model = await loadFaceModel();
  try {
    const copies = [];
    for (const file of files) {
      const { data, info } = await sharp(file)
        .rotate()
        .resize({ width: DETECTION_EDGE, height: DETECTION_EDGE, fit: 'inside' })
        .removeAlpha()
        .raw()
        .toBuffer({ resolveWithObject: true });
      copies.push({ data, width: info.width, height: info.height });
    }
    await model.detect(copies[0]!);
    const rounds = 5;
    const started = performance.now();
    for (let round = 0; round < rounds; round += 1) {
      for (const copy of copies) await model.detect(copy);
    }
    return (performance.now() - started) / (rounds * copies.length);
  } finally {
    await model.close();
  }
}

export default benchmark;
