import { z } from 'zod';
import { controlCharacterPattern } from './common';

/**
 * A look is a named set of renditions; a rendition says how one delivered file is framed and
 * written. Shared with the client's forms, so nothing server-only is imported here.
 */

const nameSchema = (what: string) =>
  z
    .string({ error: `Enter the ${what}.` })
    .trim()
    .min(1, { error: `Enter the ${what}.` })
    .max(60, { error: 'Use at most 60 characters.' })
    .refine((value) => !controlCharacterPattern.test(value), {
      error: 'Use letters, digits and punctuation only (no control characters).',
    });

const pixelsSchema = (what: string) =>
  z
    .number({ error: `Enter the ${what} in pixels.` })
    .int({ error: `The ${what} is a whole number of pixels.` })
    .min(100, { error: `The ${what} is at least 100 px.` })
    .max(8000, { error: `The ${what} is at most 8000 px.` });

const fractionSchema = (what: string, min: number, max: number) =>
  z
    .number({ error: `Enter the ${what}.` })
    .min(min, { error: `The ${what} is at least ${min}.` })
    .max(max, { error: `The ${what} is at most ${max}.` });

export const headMeasures = ['eye_distance', 'eye_to_chin'] as const;
export const headMeasureSchema = z.enum(headMeasures);
export type HeadMeasure = z.infer<typeof headMeasureSchema>;

export const overflowModes = ['refuse', 'extend'] as const;
export const overflowModeSchema = z.enum(overflowModes);
export type OverflowMode = z.infer<typeof overflowModeSchema>;

export const renditionSchema = z.object({
  name: nameSchema('rendition name'),
  width: pixelsSchema('width'),
  height: pixelsSchema('height'),
  /** Where the (levelled) eye line sits: fraction of the height, from the top. */
  eyeLine: fractionSchema('eye line', 0.2, 0.7),
  /** The head's size: a measure as a fraction of the output width. */
  headSize: z.object({
    measure: headMeasureSchema,
    fraction: fractionSchema('head size', 0.05, 0.8),
  }),
  /** Where the midpoint between the eyes sits: fraction of the width, from the left. */
  centreX: fractionSchema('horizontal centre', 0.3, 0.7),
  /** A crop that reaches past the photo: refuse it, or extend the photo with fillColour. */
  overflow: overflowModeSchema,
  /** Used when overflow is 'extend' (and for the thin edge a rotation brings in). */
  fillColour: z
    .string()
    .regex(/^#[0-9a-f]{6}$/i, { error: 'Use a colour like #f2f2f2.' })
    .transform((value) => value.toLowerCase())
    .default('#ffffff'),
  jpegQuality: z.number().int().min(50).max(100),
  /** The largest roll the eyes may be levelled by; a larger one is refused. */
  maxRotationDeg: fractionSchema('largest rotation', 0, 10).default(5),
  /** Output is always sRGB. GPS and camera serials are never kept: there is no option for them. */
  keepMetadata: z.object({ copyright: z.boolean(), credit: z.boolean() }),
});
export type Rendition = z.infer<typeof renditionSchema>;
export type RenditionInput = z.input<typeof renditionSchema>;

export const lookSchema = z.object({
  name: nameSchema('look name'),
  renditions: z
    .array(renditionSchema)
    .min(1, { error: 'A look has at least one rendition.' })
    .max(6, { error: 'A look has at most six renditions.' })
    .refine(
      (renditions) =>
        new Set(renditions.map((rendition) => rendition.name.toLowerCase())).size ===
        renditions.length,
      { error: 'Each rendition in a look has its own name.' },
    ),
});
export type Look = z.infer<typeof lookSchema>;
export type LookInput = z.input<typeof lookSchema>;

/** A point in pixels; x to the right, y down, (0, 0) the top-left corner of the top-left pixel. */
export const pointSchema = z.object({ x: z.number(), y: z.number() });
export type Point = z.infer<typeof pointSchema>;

/**
 * Where the hand marks start on a photo with no eyes found: either side of the middle, 16 % of
 * the shorter side apart, two fifths down (a head-and-shoulders frame, common practice; the
 * shorter side, so a landscape frame does not start with a face too large for its framing).
 */
export function startingEyeMarks(width: number, height: number): { left: Point; right: Point } {
  const half = (Math.min(width, height) * 0.16) / 2;
  return {
    left: { x: width / 2 - half, y: height * 0.4 },
    right: { x: width / 2 + half, y: height * 0.4 },
  };
}

/** What the client is told about one planned rendition (plan, or the reason it was refused). */
export const cropRefusalReasons = [
  'eyes_outside_image',
  'eyes_reversed',
  'eyes_too_close',
  'rotation_too_large',
  'leaves_frame',
] as const;
export const cropRefusalReasonSchema = z.enum(cropRefusalReasons);
export type CropRefusalReason = z.infer<typeof cropRefusalReasonSchema>;

export const renditionPlanResponseSchema = z.discriminatedUnion('ok', [
  z.object({
    ok: z.literal(true),
    rendition: z.string(),
    rotationDeg: z.number(),
    scale: z.number(),
    outputWidth: z.number().int(),
    outputHeight: z.number().int(),
    eyesAt: z.object({ left: pointSchema, right: pointSchema }),
    overflow: z.object({
      left: z.number(),
      top: z.number(),
      right: z.number(),
      bottom: z.number(),
    }),
  }),
  z.object({
    ok: z.literal(false),
    rendition: z.string(),
    reason: cropRefusalReasonSchema,
    message: z.string(),
  }),
]);
export type RenditionPlanResponse = z.infer<typeof renditionPlanResponseSchema>;
