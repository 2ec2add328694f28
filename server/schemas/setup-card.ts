import { z } from 'zod';

const positive = (what: string, max: number) =>
  z
    .number({ error: `Enter the ${what}.` })
    .positive({ error: `The ${what} must be more than zero.` })
    .max(max, { error: `The ${what} looks too large (at most ${max}).` });

/** Apertures the card accepts: the widest lenses sold open to about f/0.95, the narrowest stop to f/64. */
export const WIDEST_APERTURE = 0.95;
export const NARROWEST_APERTURE = 64;

export const lightRoles = ['key', 'fill', 'background', 'hair'] as const;

export const cardLightSchema = z.object({
  role: z.enum(lightRoles),
  /** Fraction of full power: 1 down to 1/128. */
  power: z
    .number({ error: 'Choose a power setting.' })
    .min(1 / 128 - 1e-9, { error: 'The lowest setting is 1/128.' })
    .max(1, { error: 'The highest setting is full power (1/1).' }),
  modifier: z.string().trim().max(80, { error: 'Use at most 80 characters.' }).default(''),
  modifierLossStops: z
    .number()
    .min(0, { error: 'A modifier loses light, so use zero or more stops.' })
    .max(6, { error: 'At most 6 stops.' })
    .nullable()
    .default(null),
  /** To the sitter; for a background light, to the background it lights. */
  distanceMetres: positive('distance', 20),
  guideNumber: z.number().positive().max(200).nullable().default(null),
});
export type CardLight = z.infer<typeof cardLightSchema>;

export const sensorFormatSchema = z.enum([
  'full_frame',
  'aps_c_15',
  'aps_c_16',
  'micro_four_thirds',
  'custom',
]);

export const setupCardSchema = z
  .object({
    lights: z
      .array(cardLightSchema)
      .min(1)
      .max(4)
      .refine((lights) => lights.some((light) => light.role === 'key'), {
        error: 'A card needs a key light.',
      })
      .refine((lights) => new Set(lights.map((light) => light.role)).size === lights.length, {
        error: 'Each light role appears once.',
      }),
    camera: z.object({
      sensorFormat: sensorFormatSchema,
      customCropFactor: z.number().min(0.5).max(8).nullable().default(null),
      focalLengthMm: positive('focal length', 1200),
      aperture: z
        .number({ error: 'Enter the aperture.' })
        .min(WIDEST_APERTURE, { error: `The widest aperture accepted is f/${WIDEST_APERTURE}.` })
        .max(NARROWEST_APERTURE, {
          error: `The narrowest aperture accepted is f/${NARROWEST_APERTURE}.`,
        }),
      shutterSeconds: positive('shutter speed', 30),
      iso: z.number().int().min(25).max(409600),
      flashSyncSeconds: positive('flash sync speed', 1),
      cameraToSitterMetres: positive('camera-to-sitter distance', 30),
      sitterToBackgroundMetres: positive('sitter-to-background distance', 30),
    }),
    notes: z.string().max(2000).default(''),
  })
  .refine(
    (card) => card.camera.sensorFormat !== 'custom' || card.camera.customCropFactor !== null,
    {
      error: 'Enter the crop factor of the custom sensor.',
      path: ['camera', 'customCropFactor'],
    },
  );
export type SetupCard = z.infer<typeof setupCardSchema>;
export type SetupCardInput = z.input<typeof setupCardSchema>;

export const stationCardSchema = z.object({
  stationId: z.string(),
  stationName: z.string(),
  position: z.number(),
  photographerName: z.string().nullable(),
  card: setupCardSchema.nullable(),
  updatedAt: z.string().nullable(),
});
export type StationCard = z.infer<typeof stationCardSchema>;

export const daySetupCardsSchema = z.object({
  dayId: z.string(),
  dayDate: z.string(),
  clientName: z.string(),
  officeName: z.string(),
  address: z.string(),
  room: z.string(),
  stations: z.array(stationCardSchema),
});
export type DaySetupCards = z.infer<typeof daySetupCardsSchema>;

export const saveSetupCardRequestSchema = z.object({ card: setupCardSchema });
export type SaveSetupCardRequest = z.input<typeof saveSetupCardRequestSchema>;

export const copySetupCardRequestSchema = z.object({
  fromStationId: z.uuid({ error: 'Choose the station to copy from.' }),
});
export type CopySetupCardRequest = z.infer<typeof copySetupCardRequestSchema>;

export const cardSourceSchema = z.object({
  stationId: z.string(),
  label: z.string(),
});
export const cardSourceListSchema = z.object({ sources: z.array(cardSourceSchema) });
export type CardSourceList = z.infer<typeof cardSourceListSchema>;
