import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { planCrop, type CropPlan } from '../../server/modules/looks/crop-geometry';
import {
  createEyeFinder,
  type EyeFinder,
  type EyeFinding,
} from '../../server/modules/looks/eye-finder';
import { idBadgePreset, lookPresets } from '../../server/modules/looks/look-presets';
import { renderRendition } from '../../server/modules/looks/render-rendition';
import {
  debianPortrait,
  placePortrait,
  type PlacedPortrait,
  type Placement,
} from '../support/debian-portrait';

/**
 * The whole chain against a real photograph (NASA's public-domain portrait in Debian's
 * python3-skimage): the same face placed in large frames at different offsets, scales and rolls,
 * its eyes found, each preset planned and rendered, then the eyes found again in every rendered
 * file.
 *
 * Two measures of where the eyes landed in each rendition:
 * - markers: the placement is known exactly, so the face's eyes (the mean of what was found in the
 *   frames, in the portrait's own pixels) are known in every frame. A black frame of the same size with a white disc on
 *   each of those points is rendered with the same plan, and the discs' centroids are read from
 *   the output: sub-pixel, and independent of the face models. Across the set, eye line and eye
 *   distance agree within 2 px (the bar).
 * - the face models again, on each rendered file: an independent detector's view, whose own
 *   repeatability on a re-detected rendition is up to about 2 % of the eye distance (measured here, so
 *   its bar is 2.5 % of the eye distance rather than 2 px).
 * The ID badge must sit inside ISO/IEC 19794-5's full-frontal ranges as tests/reference/SOURCES.md quotes them
 * (eye line 30-50 % from the top, face centre 45-55 % of the width, at least 90 px between the
 * eye centres; values as quoted by open checkers, verify).
 */
const placements: Placement[] = [
  { frameWidth: 4000, frameHeight: 5000, left: 700, top: 1200, scale: 5, rollDeg: 0 },
  { frameWidth: 4500, frameHeight: 5200, left: 1200, top: 900, scale: 5.5, rollDeg: 1 },
  { frameWidth: 5000, frameHeight: 5000, left: 600, top: 1500, scale: 6, rollDeg: -1 },
  { frameWidth: 6000, frameHeight: 4000, left: 2500, top: 500, scale: 5, rollDeg: -2 },
];

interface Landed {
  eyeLine: number;
  eyeDistance: number;
  centre: number;
}
type Point = { x: number; y: number };

let finder: EyeFinder;
const found = new Map<string, Landed[]>();
const marked = new Map<string, Landed[]>();

function landed(left: Point, right: Point): Landed {
  return {
    eyeLine: (left.y + right.y) / 2,
    eyeDistance: Math.hypot(right.x - left.x, right.y - left.y),
    centre: (left.x + right.x) / 2,
  };
}

/** A black frame with a white disc on each point, as a JPEG like the camera's. */
async function markerFrame(width: number, height: number, points: Point[], radius: number) {
  const discs = points
    .map(({ x, y }) => `<circle cx="${x}" cy="${y}" r="${radius}" fill="#fff"/>`)
    .join('');
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}"><rect width="100%" height="100%" fill="#000"/>${discs}</svg>`;
  return sharp(Buffer.from(svg)).jpeg({ quality: 95 }).toBuffer();
}

/** Brightness-weighted centroids of the bright pixels left and right of the middle column. */
async function discCentroids(image: Buffer): Promise<[Point, Point]> {
  const { data, info } = await sharp(image).greyscale().raw().toBuffer({ resolveWithObject: true });
  const sums = [0, 1].map(() => ({ x: 0, y: 0, weight: 0 }));
  for (let y = 0; y < info.height; y += 1) {
    for (let x = 0; x < info.width; x += 1) {
      const value = data[y * info.width + x]!;
      if (value < 64) continue; // JPEG ringing and the fill stay out
      const sum = sums[x < info.width / 2 ? 0 : 1]!;
      sum.x += (x + 0.5) * value;
      sum.y += (y + 0.5) * value;
      sum.weight += value;
    }
  }
  const [a, b] = sums.map((sum) => ({ x: sum.x / sum.weight, y: sum.y / sum.weight }));
  return [a!, b!];
}

beforeAll(async () => {
  finder = createEyeFinder();
  const portrait = await debianPortrait();
  const frames: Array<{ placement: Placement; placed: PlacedPortrait; eyes: EyeFinding }> = [];
  for (const placement of placements) {
    const placed = await placePortrait(portrait, placement);
    const eyes = await finder.find(placed.frame);
    expect(eyes.status).toBe('found');
    frames.push({ placement, placed, eyes });
  }
  // The face's eyes in the portrait's own pixels: the mean of what was found in the frames.
  const inPortrait = (pick: (each: (typeof frames)[number]) => Point) => {
    const points = frames.map((each) => each.placed.toPortrait(pick(each)));
    return {
      x: points.reduce((sum, { x }) => sum + x, 0) / points.length,
      y: points.reduce((sum, { y }) => sum + y, 0) / points.length,
    };
  };
  const trueLeft = inPortrait((each) => each.eyes.leftEye!);
  const trueRight = inPortrait((each) => each.eyes.rightEye!);

  for (const { placement, placed, eyes } of frames) {
    const truth = [placed.toFrame(trueLeft), placed.toFrame(trueRight)];
    const radius = 0.06 * Math.hypot(truth[1]!.x - truth[0]!.x, truth[1]!.y - truth[0]!.y);
    const markers = await markerFrame(placement.frameWidth, placement.frameHeight, truth, radius);
    for (const preset of lookPresets) {
      const plan = planCrop({
        imageWidth: eyes.width,
        imageHeight: eyes.height,
        leftEye: eyes.leftEye!,
        rightEye: eyes.rightEye!,
        rendition: preset.rendition,
      });
      if (!plan.ok) throw new Error(`${preset.key}: ${plan.message}`);
      const render = (input: Buffer, withPlan: CropPlan) =>
        renderRendition({ input, plan: withPlan, rendition: preset.rendition, metadata: {} });
      const output = await render(placed.frame, plan);
      const again = await finder.find(output);
      expect(again.status, preset.key).toBe('found');
      push(found, preset.key, landed(again.leftEye!, again.rightEye!));
      const [left, right] = await discCentroids(await render(markers, plan));
      push(marked, preset.key, landed(left, right));
    }
  }
}, 180_000);

afterAll(() => finder?.close());

function push(map: Map<string, Landed[]>, key: string, value: Landed) {
  map.set(key, [...(map.get(key) ?? []), value]);
}

const spread = (values: number[]) => Math.max(...values) - Math.min(...values);

describe('a consistent set from one face placed four ways (Debian python3-skimage portrait)', () => {
  for (const preset of lookPresets) {
    it(`${preset.key}: read from markers on the true eyes, eye line and eye distance within 2 px across the set`, () => {
      const list = marked.get(preset.key)!;
      expect(list).toHaveLength(placements.length);
      expect(spread(list.map((each) => each.eyeLine))).toBeLessThanOrEqual(2);
      expect(spread(list.map((each) => each.eyeDistance))).toBeLessThanOrEqual(2);
      expect(spread(list.map((each) => each.centre))).toBeLessThanOrEqual(2);
    });

    it(`${preset.key}: found again by the face models, within 2 px (eye line) and 2.5 % (eye distance)`, () => {
      const list = found.get(preset.key)!;
      expect(list).toHaveLength(placements.length);
      const distances = list.map((each) => each.eyeDistance);
      expect(spread(list.map((each) => each.eyeLine))).toBeLessThanOrEqual(2);
      expect(spread(distances)).toBeLessThanOrEqual(0.025 * Math.min(...distances));
    });
  }

  it('ID badge: inside the ISO/IEC 19794-5 ranges for eye line, face centre and eye distance (as quoted in tests/reference/SOURCES.md)', () => {
    const { width, height } = idBadgePreset.rendition;
    for (const each of [...found.get('id_badge')!, ...marked.get('id_badge')!]) {
      expect(each.eyeLine / height).toBeGreaterThanOrEqual(0.3);
      expect(each.eyeLine / height).toBeLessThanOrEqual(0.5);
      expect(each.centre / width).toBeGreaterThanOrEqual(0.45);
      expect(each.centre / width).toBeLessThanOrEqual(0.55);
      expect(each.eyeDistance).toBeGreaterThanOrEqual(90);
    }
  });
});
