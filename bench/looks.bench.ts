import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { planCrop } from '../server/modules/looks/crop-geometry';
import { createEyeFinder } from '../server/modules/looks/eye-finder';
import { lookPresets } from '../server/modules/looks/look-presets';
import { renderRendition } from '../server/modules/looks/render-rendition';
import { debianPortrait, placePortrait } from '../tests/support/debian-portrait';
import type { Benchmark } from './run';

/**
 * `npm run bench -- looks`: finals (20-megapixel JPEGs holding Debian's public-domain
 * portrait at a headshot's size) each detected and rendered in the three preset renditions, as
 * the portrait jobs do it, one after another; reported per image, against sharp alone decoding
 * each final and resizing it to the same three sizes in the same run. The model's one-time load
 * is printed apart.
 */
const finals = Number(process.env.LOOKS_BENCH_FINALS ?? 200);
const distinct = 6;

const benchmark: Benchmark = {
  name: 'looks',
  async run({ print }) {
    const folder = mkdtempSync(path.join(tmpdir(), 'likeness-looks-bench-'));
    const finder = createEyeFinder();
    try {
      const portrait = await debianPortrait();
      const files: string[] = [];
      for (let index = 0; index < distinct; index += 1) {
        const placed = await placePortrait(portrait, {
          frameWidth: 4000,
          frameHeight: 5000,
          left: 500 + index * 70,
          top: 1000 + index * 90,
          scale: 5 + (index % 3) * 0.3,
          rollDeg: (index % 3) - 1,
          noise: true,
        });
        const file = path.join(folder, `final-${index}.jpg`);
        writeFileSync(file, placed.frame);
        files.push(file);
      }
      const loadStarted = performance.now();
      await finder.find(files[0]!);
      const loadMs = performance.now() - loadStarted;

      const baselineStarted = performance.now();
      for (let index = 0; index < finals; index += 1) {
        for (const preset of lookPresets) {
          await sharp(files[index % distinct]!)
            .resize(preset.rendition.width, preset.rendition.height)
            .jpeg({ quality: preset.rendition.jpegQuality })
            .toBuffer();
        }
      }
      const baselineMs = performance.now() - baselineStarted;

      let refused = 0;
      let missed = 0;
      const started = performance.now();
      for (let index = 0; index < finals; index += 1) {
        const file = files[index % distinct]!;
        const eyes = await finder.find(file);
        if (eyes.status !== 'found') {
          missed += 1;
          continue;
        }
        for (const preset of lookPresets) {
          const plan = planCrop({
            imageWidth: eyes.width,
            imageHeight: eyes.height,
            leftEye: eyes.leftEye!,
            rightEye: eyes.rightEye!,
            rendition: preset.rendition,
          });
          if (!plan.ok) {
            refused += 1;
            continue;
          }
          await renderRendition({ input: file, plan, rendition: preset.rendition, metadata: {} });
        }
      }
      const ms = performance.now() - started;
      print({
        bench: 'looks',
        finals,
        renditions: lookPresets.length,
        model_load_ms: Math.round(loadMs),
        ms_per_image: Math.round(ms / finals),
        baseline_ms_per_image: Math.round(baselineMs / finals),
        ratio: Number((ms / baselineMs).toFixed(2)),
        eyes_missed: missed,
        renditions_refused: refused,
      });
    } finally {
      await finder.close();
      rmSync(folder, { recursive: true, force: true });
    }
  },
};

export default benchmark;
