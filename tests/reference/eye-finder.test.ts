import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createEyeFinder, type EyeFinder } from '../../server/modules/looks/eye-finder';
import type { Point } from '../../server/modules/looks/eye-geometry';
import { debianPortrait, placePortrait, type Placement } from '../support/debian-portrait';

/**
 * The eye finder against a real photograph: NASA's portrait of astronaut Eileen Collins, public
 * domain, as shipped in Debian's python3-skimage (skimage/data/astronaut.png, 512 x 512). It is
 * fetched from Debian's archive by the test setup, never committed. Placed into large generated
 * frames at known offsets, scales and rolls, the eyes found in each frame, carried back into the
 * portrait's own pixels, must be the same eyes.
 */

// Pupil centres read by hand from the portrait enlarged 8x (a pixel grid over each eye).
const PUPILS_BY_HAND = { left: { x: 204, y: 101 }, right: { x: 247, y: 103 } };

// 3,000-6,000 px frames, the portrait at 0.8-2.5x and rolled by -4 to +4 degrees.
const placements: Placement[] = [
  { frameWidth: 3000, frameHeight: 2000, left: 400, top: 300, scale: 2.5, rollDeg: 0 },
  { frameWidth: 4000, frameHeight: 3000, left: 1700, top: 900, scale: 1.6, rollDeg: 3 },
  { frameWidth: 6000, frameHeight: 4000, left: 2500, top: 1200, scale: 2, rollDeg: -4 },
  { frameWidth: 3000, frameHeight: 4500, left: 900, top: 1500, scale: 0.8, rollDeg: 2 },
  { frameWidth: 5000, frameHeight: 3300, left: 100, top: 50, scale: 1.2, rollDeg: -2 },
  { frameWidth: 6000, frameHeight: 4000, left: 3000, top: 2500, scale: 1, rollDeg: 4 },
];

const TOLERANCE_PX = 2; // in the portrait's pixels
const ROLL_TOLERANCE_DEG = 1;

const grey = { r: 128, g: 128, b: 128 };
const blankFrame = (width: number, height: number) =>
  sharp({ create: { width, height, channels: 3, background: grey } })
    .jpeg()
    .toBuffer();

describe("eye finder on Debian's astronaut portrait (NASA, public domain)", () => {
  let finder: EyeFinder;
  let portrait: Buffer;

  beforeAll(async () => {
    portrait = await debianPortrait();
    finder = createEyeFinder();
  }, 180_000);
  afterAll(() => finder.close());

  it('finds the pupils read by hand in the portrait itself', async () => {
    const finding = await finder.find(portrait);
    expect(finding).toMatchObject({ status: 'found', faces: 1, width: 512, height: 512 });
    for (const side of ['left', 'right'] as const) {
      const found = side === 'left' ? finding.leftEye : finding.rightEye;
      expect(Math.abs(found!.x - PUPILS_BY_HAND[side].x)).toBeLessThanOrEqual(TOLERANCE_PX);
      expect(Math.abs(found!.y - PUPILS_BY_HAND[side].y)).toBeLessThanOrEqual(TOLERANCE_PX);
    }
  }, 60_000);

  it('finds the same eye line and eye distance, within 2 portrait px, in every frame', async () => {
    const seen: Array<{ placement: Placement; left: Point; right: Point; rollDeg: number }> = [];
    for (const placement of placements) {
      const placed = await placePortrait(portrait, placement);
      const finding = await finder.find(placed.frame);
      expect(finding, JSON.stringify(placement)).toMatchObject({
        status: 'found',
        faces: 1,
        width: placement.frameWidth,
        height: placement.frameHeight,
      });
      seen.push({
        placement,
        left: placed.toPortrait(finding.leftEye!),
        right: placed.toPortrait(finding.rightEye!),
        rollDeg: finding.rollDeg!,
      });
    }
    const [first, ...others] = seen;
    const eyeDistance = (eyes: (typeof seen)[number]) =>
      Math.hypot(eyes.right.x - eyes.left.x, eyes.right.y - eyes.left.y);
    for (const other of others) {
      const label = JSON.stringify(other.placement);
      for (const side of ['left', 'right'] as const) {
        expect(Math.abs(other[side].x - first![side].x), label).toBeLessThanOrEqual(TOLERANCE_PX);
        expect(Math.abs(other[side].y - first![side].y), label).toBeLessThanOrEqual(TOLERANCE_PX);
      }
      expect(Math.abs(eyeDistance(other) - eyeDistance(first!)), label).toBeLessThanOrEqual(
        TOLERANCE_PX,
      );
      // The sitter's own tilt is in every frame; what differs is the roll we applied.
      const appliedRoll = other.placement.rollDeg - first!.placement.rollDeg;
      expect(Math.abs(other.rollDeg - first!.rollDeg - appliedRoll), label).toBeLessThanOrEqual(
        ROLL_TOLERANCE_DEG,
      );
    }
  }, 180_000);

  it('answers calls made at once one by one, each as if alone', async () => {
    const placed = await placePortrait(portrait, placements[1]!);
    const blank = await blankFrame(3000, 2000);
    const alone = await finder.find(placed.frame);
    const together = await Promise.all([
      finder.find(placed.frame),
      finder.find(blank),
      finder.find(placed.frame),
    ]);
    expect(together.map((finding) => finding.status)).toEqual(['found', 'no_face', 'found']);
    expect(together[0]).toEqual(alone);
    expect(together[2]).toEqual(alone);
  }, 60_000);

  it('reports no face in a blank frame', async () => {
    const finding = await finder.find(await blankFrame(4000, 3000));
    expect(finding).toEqual({
      status: 'no_face',
      faces: 0,
      leftEye: null,
      rightEye: null,
      rollDeg: null,
      confidence: 0,
      width: 4000,
      height: 3000,
    });
  }, 60_000);

  it('reports several faces when two portraits stand side by side', async () => {
    const scaled = await sharp(portrait).resize(1000, 1000).png().toBuffer();
    const frame = await sharp(await blankFrame(4000, 2000))
      .composite([
        { input: scaled, left: 400, top: 500 },
        { input: scaled, left: 2400, top: 400 },
      ])
      .jpeg()
      .toBuffer();
    const finding = await finder.find(frame);
    expect(finding).toMatchObject({ status: 'several_faces', faces: 2, leftEye: null });
  }, 60_000);

  it('answers in upright pixels for a JPEG stored on its side (EXIF orientation 6)', async () => {
    const placement = placements[0]!;
    const placed = await placePortrait(portrait, placement);
    // Orientation 6 says "turn 90 degrees clockwise to view": store the frame turned the other way.
    const sideways = await sharp(placed.frame)
      .rotate(270)
      .withMetadata({ orientation: 6 })
      .jpeg({ quality: 90 })
      .toBuffer();
    expect((await sharp(sideways).metadata()).width).toBe(placement.frameHeight);
    const upright = await finder.find(placed.frame);
    const finding = await finder.find(sideways);
    expect(finding).toMatchObject({
      status: 'found',
      width: placement.frameWidth,
      height: placement.frameHeight,
    });
    const frameTolerance = TOLERANCE_PX * placement.scale;
    for (const side of ['leftEye', 'rightEye'] as const) {
      expect(Math.abs(finding[side]!.x - upright[side]!.x)).toBeLessThanOrEqual(frameTolerance);
      expect(Math.abs(finding[side]!.y - upright[side]!.y)).toBeLessThanOrEqual(frameTolerance);
    }
  }, 60_000);
});
