import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { planCrop, type CropPlan } from '../../server/modules/looks/crop-geometry';
import {
  idBadgePreset,
  lookPresets,
  portraitPreset,
  squareProfilePreset,
} from '../../server/modules/looks/look-presets';
import { renditionSchema } from '../../server/schemas/looks';

// Ranges as quoted in tests/reference/SOURCES.md ("ISO/IEC 19794-5"; values from open checkers, verify
// against the standards). Clause numbers of ISO/IEC 19794-5:2005 are from memory.
const ISO = 'ISO/IEC 19794-5:2005';
const ICAO = 'ICAO Doc 9303 Part 3';
// Common anthropometry, from memory (see crop-geometry.ts): eye distance / head width is about
// 0.42 for head breadth (eurion to eurion), about 0.46-0.48 for face width (zygion to zygion);
// crown to chin is about 3.6 eye distances. The badge must hold for either head width.
const EYE_DISTANCE_PER_HEAD_WIDTH = [0.42, 0.48];
const CROWN_TO_CHIN_PER_EYE_DISTANCE = 3.6;

const badge = idBadgePreset.rendition;

/** Faces a camera might give for a badge: 2-8k px frames, heads large enough, rolls up to 5°. */
const badgePlans = fc
  .record({
    imageWidth: fc.integer({ min: 2000, max: 8000 }),
    imageHeight: fc.integer({ min: 2000, max: 8000 }),
    midX: fc.integer({ min: 300, max: 700 }),
    midY: fc.integer({ min: 250, max: 600 }),
    eyeDistance: fc.integer({ min: 115, max: 900 }),
    rollTenthsDeg: fc.integer({ min: -50, max: 50 }),
  })
  .map(({ imageWidth, imageHeight, midX, midY, eyeDistance, rollTenthsDeg }) => {
    const roll = (rollTenthsDeg / 10) * (Math.PI / 180);
    const mid = { x: (midX / 1000) * imageWidth, y: (midY / 1000) * imageHeight };
    const half = { x: (eyeDistance / 2) * Math.cos(roll), y: (eyeDistance / 2) * Math.sin(roll) };
    return planCrop({
      imageWidth,
      imageHeight,
      leftEye: { x: mid.x - half.x, y: mid.y - half.y },
      rightEye: { x: mid.x + half.x, y: mid.y + half.y },
      rendition: badge,
    });
  });

/** Runs check on every generated badge plan that could be made; most of them can. */
function forEveryBadge(check: (plan: CropPlan) => void) {
  let planned = 0;
  fc.assert(
    fc.property(badgePlans, (result) => {
      if (!result.ok) {
        expect(result.reason).toBe('leaves_frame');
        return;
      }
      planned += 1;
      check(result);
    }),
    { numRuns: 500 },
  );
  expect(planned).toBeGreaterThan(250);
}

const eyeLineShare = (plan: CropPlan) => plan.eyesAt.left.y / plan.outputHeight;
const eyeDistance = (plan: CropPlan) => plan.eyesAt.right.x - plan.eyesAt.left.x;

describe('ID badge inside the ISO/IEC 19794-5 full-frontal geometry', () => {
  it(`${ISO} clause 8.3.3 (from memory): eye line 30-50 % of the height from the top`, () => {
    forEveryBadge((plan) => {
      expect(eyeLineShare(plan)).toBeGreaterThanOrEqual(0.3);
      expect(eyeLineShare(plan)).toBeLessThanOrEqual(0.5);
      expect(Math.abs(plan.eyesAt.left.y - plan.eyesAt.right.y)).toBeLessThan(1e-6);
    });
  });

  it(`${ISO} clause 8.3.2 (from memory): face centre 45-55 % of the width`, () => {
    forEveryBadge((plan) => {
      const centre = (plan.eyesAt.left.x + plan.eyesAt.right.x) / 2 / plan.outputWidth;
      expect(centre).toBeGreaterThanOrEqual(0.45);
      expect(centre).toBeLessThanOrEqual(0.55);
    });
  });

  it(`${ISO} clause 8.4.1 (from memory): at least 90 px between the eye centres`, () => {
    forEveryBadge((plan) => expect(eyeDistance(plan)).toBeGreaterThanOrEqual(90));
  });

  it(`${ISO} clause 8.3.4 (from memory): head width 50-75 % of the width (ratio 0.42 or 0.48)`, () => {
    forEveryBadge((plan) => {
      for (const ratio of EYE_DISTANCE_PER_HEAD_WIDTH) {
        const headWidth = eyeDistance(plan) / ratio / plan.outputWidth;
        expect(headWidth).toBeGreaterThanOrEqual(0.5);
        expect(headWidth).toBeLessThanOrEqual(0.75);
      }
    });
  });
});

describe('ID badge in the ICAO Doc 9303 35 x 45 mm frame', () => {
  it(`${ICAO} (from memory): 35 x 45 mm is aspect 7:9`, () => {
    expect(badge.width * 9).toBe(badge.height * 7);
  });

  it(`${ICAO} (from memory): crown to chin 70-80 % of the height, the whole head in the frame`, () => {
    forEveryBadge((plan) => {
      const crownToChin = (eyeDistance(plan) * CROWN_TO_CHIN_PER_EYE_DISTANCE) / plan.outputHeight;
      expect(crownToChin).toBeGreaterThanOrEqual(0.7);
      expect(crownToChin).toBeLessThanOrEqual(0.8);
      // The eyes sit about halfway between crown and chin (anthropometry, from memory).
      expect(eyeLineShare(plan) - crownToChin / 2).toBeGreaterThan(0);
      expect(eyeLineShare(plan) + crownToChin / 2).toBeLessThan(1);
    });
  });
});

describe('portrait and square presets (common practice)', () => {
  it('common practice: the portrait is 4:5 with the eyes on the upper third line', () => {
    const { width, height, eyeLine } = portraitPreset.rendition;
    expect(width * 5).toBe(height * 4);
    expect(eyeLine).toBeCloseTo(1 / 3, 9);
  });

  it('common practice: the square profile picture is at least 400 x 400 px', () => {
    const { width, height } = squareProfilePreset.rendition;
    expect(width).toBe(height);
    expect(width).toBeGreaterThanOrEqual(400);
  });
});

describe('every preset value carries its source, honestly marked', () => {
  it.each(lookPresets.map((preset) => [preset.key, preset] as const))('%s', (_key, preset) => {
    for (const field of Object.keys(renditionSchema.shape)) {
      if (field === 'maxRotationDeg' || (field === 'fillColour' && !preset.sources.fillColour)) {
        continue; // schema defaults, not claims about a source
      }
      const source = preset.sources[field as keyof typeof preset.sources];
      expect(source, field).toMatch(/\S/);
      // A standard named without a checked text is marked as such.
      if (/ISO|ICAO/.test(source!)) expect(source, field).toMatch(/from memory|verify/);
    }
    expect(renditionSchema.parse(preset.rendition)).toEqual(preset.rendition);
  });

  it('GPS and camera serials cannot be asked for: keepMetadata has only copyright and credit', () => {
    expect(Object.keys(renditionSchema.shape.keepMetadata.shape).sort()).toEqual([
      'copyright',
      'credit',
    ]);
  });
});
