import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  levelledFrame,
  planCrop,
  type CropPlan,
  type CropRequest,
} from '../../server/modules/looks/crop-geometry';
import { lookPresets, portraitPreset } from '../../server/modules/looks/look-presets';
import { lookSchema, renditionSchema, type Rendition } from '../../server/schemas/looks';

// Stated in crop-geometry.ts (anthropometry, from memory); repeated so a change shows up here.
const EYE_TO_CHIN_PER_EYE_DISTANCE = 1.75;

/** Uniform in [min, max] (fc.double crowds its values near zero, which would test little). */
const between = (min: number, max: number) =>
  fc.integer({ min: 0, max: 1_000_000 }).map((step) => min + ((max - min) * step) / 1_000_000);

const renditionArbitrary: fc.Arbitrary<Rendition> = fc
  .record({
    name: fc.constant('Generated'),
    // Mostly delivery sizes, sometimes anything the schema allows.
    width: fc.oneof(fc.integer({ min: 100, max: 1600 }), fc.integer({ min: 100, max: 8000 })),
    height: fc.oneof(fc.integer({ min: 100, max: 1600 }), fc.integer({ min: 100, max: 8000 })),
    eyeLine: between(0.2, 0.7),
    headSize: fc.record({
      measure: fc.constantFrom('eye_distance' as const, 'eye_to_chin' as const),
      fraction: between(0.05, 0.8),
    }),
    centreX: between(0.3, 0.7),
    overflow: fc.constantFrom('refuse' as const, 'extend' as const),
    fillColour: fc.constant('#808080'),
    jpegQuality: fc.integer({ min: 50, max: 100 }),
    maxRotationDeg: between(0, 10),
    keepMetadata: fc.record({ copyright: fc.boolean(), credit: fc.boolean() }),
  })
  .map((value) => renditionSchema.parse(value));

const anyRendition = fc.oneof(
  renditionArbitrary,
  fc.constantFrom(...lookPresets.map((preset) => preset.rendition)),
);

const wantedEyeDistance = (rendition: Rendition) =>
  rendition.headSize.measure === 'eye_distance'
    ? rendition.headSize.fraction * rendition.width
    : (rendition.headSize.fraction * rendition.width) / EYE_TO_CHIN_PER_EYE_DISTANCE;

/**
 * A face: the eyes' midpoint, their distance (a multiple of what the rendition needs, so some
 * are too small and most are large enough) and the head's roll (degrees, y down).
 */
const requestArbitrary = (rendition: fc.Arbitrary<Rendition>) =>
  fc
    .record({
      imageWidth: fc.integer({ min: 800, max: 8000 }),
      imageHeight: fc.integer({ min: 800, max: 8000 }),
      midX: between(0.05, 0.95),
      midY: between(0.05, 0.95),
      sizeFactor: between(0.8, 3),
      // Mostly small rolls, as sitters hold their heads; some past any limit.
      rollDeg: fc.oneof(
        { arbitrary: between(-3, 3), weight: 3 },
        { arbitrary: between(-12, 12), weight: 1 },
      ),
      rendition,
    })
    .map(({ midX, midY, sizeFactor, rollDeg, ...rest }) => {
      const eyeDistance = wantedEyeDistance(rest.rendition) * sizeFactor;
      const half = eyeDistance / 2;
      const angle = (rollDeg * Math.PI) / 180;
      const along = { x: Math.cos(angle), y: Math.sin(angle) };
      const mid = { x: midX * rest.imageWidth, y: midY * rest.imageHeight };
      const request: CropRequest = {
        ...rest,
        leftEye: { x: mid.x - half * along.x, y: mid.y - half * along.y },
        rightEye: { x: mid.x + half * along.x, y: mid.y + half * along.y },
      };
      return { request, eyeDistance, rollDeg };
    });

const expectWithinPixel = (actual: number, target: number) =>
  expect(Math.abs(actual - target)).toBeLessThanOrEqual(1);

/** The eyes taken through the plan step by step: levelled frame, crop, resize. */
function eyesThroughPlan(request: CropRequest, plan: CropPlan) {
  const frame = levelledFrame(request.imageWidth, request.imageHeight, plan.rotationDeg);
  const toOutput = (point: { x: number; y: number }) => {
    const levelled = frame.fromSource(point);
    return {
      x: ((levelled.x - plan.crop.left) * plan.outputWidth) / plan.crop.width,
      y: ((levelled.y - plan.crop.top) * plan.outputHeight) / plan.crop.height,
    };
  };
  return { left: toOutput(request.leftEye), right: toOutput(request.rightEye) };
}

/** How far the plan's crop reaches past the source, in source pixels, by its mapped corners. */
function reachPastSource(request: CropRequest, plan: CropPlan) {
  const frame = levelledFrame(request.imageWidth, request.imageHeight, plan.rotationDeg);
  const { left, top, width, height } = plan.crop;
  const corners = [left, left + width].flatMap((x) =>
    [top, top + height].map((y) => frame.toSource({ x, y })),
  );
  const { imageWidth, imageHeight } = request;
  return Math.max(...corners.flatMap(({ x, y }) => [-x, -y, x - imageWidth, y - imageHeight]));
}

describe('planCrop puts the eyes where the rendition says, within 1 px', () => {
  it('for every generated face, image and rendition (presets included)', () => {
    const seen: Record<string, number> = {};
    const count = (outcome: string) => (seen[outcome] = (seen[outcome] ?? 0) + 1);
    fc.assert(
      fc.property(requestArbitrary(anyRendition), ({ request, eyeDistance, rollDeg }) => {
        const { rendition } = request;
        const result = planCrop(request);
        const eyesInside = [request.leftEye, request.rightEye].every(
          (eye) =>
            eye.x >= 0 && eye.y >= 0 && eye.x <= request.imageWidth && eye.y <= request.imageHeight,
        );
        const overflows = result.ok && Object.values(result.overflow).some(Boolean);
        count(result.ok ? (overflows ? 'extended' : 'inside') : result.reason);
        if (!eyesInside) {
          expect(result).toMatchObject({ ok: false, reason: 'eyes_outside_image' });
          return;
        }
        if (Math.abs(rollDeg) > rendition.maxRotationDeg + 1e-6) {
          expect(result).toMatchObject({ ok: false, reason: 'rotation_too_large' });
          return;
        }
        if (eyeDistance < wantedEyeDistance(rendition) - 1e-6) {
          expect(result).toMatchObject({ ok: false, reason: 'eyes_too_close' });
          return;
        }
        if (!result.ok) {
          // The only other refusal: a crop past the photo, for a rendition that refuses those;
          // the same framing with 'extend' is then the unshifted crop, and it does reach past.
          expect(result.reason).toBe('leaves_frame');
          expect(rendition.overflow).toBe('refuse');
          const extended = planCrop({
            ...request,
            rendition: { ...rendition, overflow: 'extend' },
          });
          expect(extended.ok).toBe(true);
          if (extended.ok) expect(reachPastSource(request, extended)).toBeGreaterThan(0);
          return;
        }
        const plan = result;
        expect(plan.rotationDeg).toBeCloseTo(-rollDeg, 6);
        expect([plan.outputWidth, plan.outputHeight]).toEqual([rendition.width, rendition.height]);
        const eyes = eyesThroughPlan(request, plan);
        expect(eyes.left.x).toBeCloseTo(plan.eyesAt.left.x, 6);
        expect(eyes.right.y).toBeCloseTo(plan.eyesAt.right.y, 6);
        // Levelled: both eyes on one line, at eyeLine of the height.
        expect(Math.abs(eyes.left.y - eyes.right.y)).toBeLessThan(1e-6);
        expectWithinPixel(eyes.left.y, rendition.eyeLine * rendition.height);
        expectWithinPixel((eyes.left.x + eyes.right.x) / 2, rendition.centreX * rendition.width);
        const distance = eyes.right.x - eyes.left.x;
        const headMeasure =
          rendition.headSize.measure === 'eye_distance'
            ? distance
            : distance * EYE_TO_CHIN_PER_EYE_DISTANCE;
        expectWithinPixel(headMeasure, rendition.headSize.fraction * rendition.width);
        // Overflow is reported exactly when the crop reaches past the photo.
        const reach = reachPastSource(request, plan);
        const reported = Object.values(plan.overflow).some((amount) => amount > 0);
        if (reach > 0.01) expect(reported).toBe(true);
        if (reach <= 0) expect(reported).toBe(false);
        if (rendition.overflow === 'refuse') expect(reported).toBe(false);
      }),
      { numRuns: 3000 },
    );
    // Every outcome was reached often enough for the run to mean something.
    const outcomes = ['inside', 'extended', 'leaves_frame', 'rotation_too_large', 'eyes_too_close'];
    for (const outcome of outcomes) expect(seen[outcome] ?? 0, outcome).toBeGreaterThan(100);
  });

  it('never shifts a crop to keep it inside: near an edge the eyes stay on target', () => {
    const nearEdge = requestArbitrary(
      anyRendition.map((rendition) => ({ ...rendition, overflow: 'extend' as const })),
    ).map((generated) => ({
      ...generated,
      request: {
        ...generated.request,
        leftEye: { ...generated.request.leftEye, y: 2 },
        rightEye: { ...generated.request.rightEye, y: 2 },
      },
      rollDeg: 0,
    }));
    fc.assert(
      fc.property(nearEdge, ({ request }) => {
        const plan = planCrop(request);
        if (!plan.ok) return;
        const eyes = eyesThroughPlan(request, plan);
        expectWithinPixel(eyes.left.y, request.rendition.eyeLine * request.rendition.height);
        // 2 px from the top, and the eye line at least 20 % of at least 100 px down: past the top.
        expect(plan.crop.top).toBeLessThan(0);
        expect(plan.overflow.top).toBeGreaterThan(0);
      }),
    );
  });
});

describe('the levelled frame is a rotation about the source centre on a just-large-enough canvas', () => {
  it('keeps distances, turns by the angle, round-trips, and holds the whole picture', () => {
    const arbitrary = fc.record({
      width: fc.integer({ min: 100, max: 8000 }),
      height: fc.integer({ min: 100, max: 8000 }),
      deg: between(-10, 10),
      x: between(0, 1),
      y: between(0, 1),
    });
    fc.assert(
      fc.property(arbitrary, ({ width, height, deg, x, y }) => {
        const frame = levelledFrame(width, height, deg);
        const point = { x: x * width, y: y * height };
        const moved = frame.fromSource(point);
        const back = frame.toSource(moved);
        expect(back.x).toBeCloseTo(point.x, 6);
        expect(back.y).toBeCloseTo(point.y, 6);
        const step = frame.fromSource({ x: point.x + 100, y: point.y });
        const angle = (Math.atan2(step.y - moved.y, step.x - moved.x) * 180) / Math.PI;
        expect(angle).toBeCloseTo(deg, 6);
        expect(Math.hypot(step.x - moved.x, step.y - moved.y)).toBeCloseTo(100, 6);
        const centre = frame.fromSource({ x: width / 2, y: height / 2 });
        expect(Math.abs(centre.x - frame.width / 2)).toBeLessThanOrEqual(1);
        expect(Math.abs(centre.y - frame.height / 2)).toBeLessThanOrEqual(1);
        // libvips rounds the canvas's origin and size separately, so it may clip a corner of
        // the picture by about a pixel, never more.
        const corners = [0, width].flatMap((cx) => [0, height].map((cy) => ({ x: cx, y: cy })));
        for (const corner of corners.map(frame.fromSource)) {
          expect(Math.min(corner.x, corner.y)).toBeGreaterThanOrEqual(-1.5);
          expect(corner.x - frame.width).toBeLessThanOrEqual(1.5);
          expect(corner.y - frame.height).toBeLessThanOrEqual(1.5);
        }
      }),
    );
  });
});

describe('worked examples, by hand', () => {
  const portrait = portraitPreset.rendition; // 1200 x 1500, eye distance 192 px, eyes at 500

  it('level eyes 200 px apart: scale 0.96, crop 1250 x 1563 at (875, 279), eyes at (504|696, 500)', () => {
    const plan = planCrop({
      imageWidth: 3000,
      imageHeight: 2000,
      leftEye: { x: 1400, y: 800 },
      rightEye: { x: 1600, y: 800 },
      rendition: portrait,
    });
    // 192 / 200 = 0.96; 1200 / 0.96 = 1250; 1500 / 0.96 = 1562.5 -> 1563;
    // left = 1500 - 600 * 1250 / 1200 = 875; top = round(800 - 500 * 1563 / 1500) = 279.
    expect(plan).toMatchObject({
      ok: true,
      rotationDeg: 0,
      scale: 0.96,
      crop: { left: 875, top: 279, width: 1250, height: 1563 },
      overflow: { left: 0, top: 0, right: 0, bottom: 0 },
    });
    if (!plan.ok) return;
    // (1400 - 875) * 0.96 = 504; (800 - 279) * 1500 / 1563 = 500.
    expect(plan.eyesAt.left.x).toBeCloseTo(504, 9);
    expect(plan.eyesAt.right.x).toBeCloseTo(696, 9);
    expect(plan.eyesAt.left.y).toBeCloseTo(500, 9);
  });

  it('a head rolled 3° (right eye lower) is turned 3° anticlockwise', () => {
    const roll = (3 * Math.PI) / 180;
    const plan = planCrop({
      imageWidth: 3000,
      imageHeight: 2000,
      leftEye: { x: 1400, y: 800 },
      rightEye: { x: 1400 + 200 * Math.cos(roll), y: 800 + 200 * Math.sin(roll) },
      rendition: portrait,
    });
    expect(plan.ok && plan.rotationDeg).toBeCloseTo(-3, 9);
  });

  it('a roll beyond maxRotationDeg is refused, not half-levelled', () => {
    const roll = (6 * Math.PI) / 180;
    const request = {
      imageWidth: 3000,
      imageHeight: 2000,
      leftEye: { x: 1400, y: 800 },
      rightEye: { x: 1400 + 200 * Math.cos(roll), y: 800 + 200 * Math.sin(roll) },
    };
    expect(planCrop({ ...request, rendition: portrait })).toMatchObject({
      ok: false,
      reason: 'rotation_too_large',
    });
    const allowing = { ...portrait, maxRotationDeg: 8 };
    expect(planCrop({ ...request, rendition: allowing })).toMatchObject({ ok: true });
  });

  it('eyes 150 px from the top: refused by a refusing rendition, extended (357 px) by another', () => {
    const request = {
      imageWidth: 3000,
      imageHeight: 2000,
      leftEye: { x: 1400, y: 150 },
      rightEye: { x: 1600, y: 150 },
    };
    const refused = planCrop({ ...request, rendition: portrait });
    expect(refused).toMatchObject({ ok: false, reason: 'leaves_frame' });
    expect(!refused.ok && refused.message).toMatch(/357 px top/);
    // top = round(150 - 521) = -371 source px; 371 * 0.96 = 356.2 -> 357 output px.
    const extended = planCrop({ ...request, rendition: { ...portrait, overflow: 'extend' } });
    expect(extended).toMatchObject({
      ok: true,
      crop: { left: 875, top: -371 },
      overflow: { left: 0, top: 357, right: 0, bottom: 0 },
    });
  });

  it('eyes too close for the output size, swapped eyes and eyes off the photo are refused', () => {
    const base = { imageWidth: 3000, imageHeight: 2000, rendition: portrait };
    const close = planCrop({
      ...base,
      leftEye: { x: 1450, y: 800 },
      rightEye: { x: 1550, y: 800 },
    });
    expect(close).toMatchObject({ ok: false, reason: 'eyes_too_close' });
    expect(!close.ok && close.message).toMatch(/100 px apart.*192 px/);
    const swapped = planCrop({
      ...base,
      leftEye: { x: 1600, y: 800 },
      rightEye: { x: 1400, y: 800 },
    });
    expect(swapped).toMatchObject({ ok: false, reason: 'eyes_reversed' });
    const off = planCrop({ ...base, leftEye: { x: -5, y: 800 }, rightEye: { x: 300, y: 800 } });
    expect(off).toMatchObject({ ok: false, reason: 'eyes_outside_image' });
  });

  it('eye-to-chin 0.3 of an 800 px width puts the eyes 240 / 1.75 = 137.1 px apart', () => {
    const square = { ...portrait, width: 800, height: 800 };
    const plan = planCrop({
      imageWidth: 3000,
      imageHeight: 2000,
      leftEye: { x: 1400, y: 900 },
      rightEye: { x: 1600, y: 900 },
      rendition: { ...square, headSize: { measure: 'eye_to_chin', fraction: 0.3 } },
    });
    expect(plan.ok && plan.eyesAt.right.x - plan.eyesAt.left.x).toBeCloseTo(137.1, 0);
  });

  it('a 600 x 400 source turned 3° sits on a 620 x 431 canvas (as sharp 0.35 / libvips 8.18 make it)', () => {
    const frame = levelledFrame(600, 400, 3);
    expect([frame.width, frame.height]).toEqual([620, 431]);
    expect(levelledFrame(600, 400, 0).fromSource({ x: 12.5, y: 7 })).toEqual({ x: 12.5, y: 7 });
  });
});

describe('rendition and look schemas', () => {
  it('refuse control characters in names, duplicate rendition names and more than six renditions', () => {
    const rendition = portraitPreset.rendition;
    expect(renditionSchema.safeParse({ ...rendition, name: 'Bad\u0007name' }).success).toBe(false);
    expect(renditionSchema.safeParse({ ...rendition, eyeLine: 0.75 }).success).toBe(false);
    expect(renditionSchema.safeParse({ ...rendition, fillColour: 'white' }).success).toBe(false);
    expect(lookSchema.safeParse({ name: 'Staff', renditions: [rendition] }).success).toBe(true);
    expect(
      lookSchema.safeParse({ name: 'Staff', renditions: [rendition, rendition] }).success,
    ).toBe(false);
    const six = Array.from({ length: 7 }, (_, index) => ({ ...rendition, name: `R${index}` }));
    expect(lookSchema.safeParse({ name: 'Staff', renditions: six }).success).toBe(false);
  });
});
