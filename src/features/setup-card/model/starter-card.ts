import type { SetupCard } from '../../../../server/schemas/setup-card';

/**
 * The card a station starts from: a corporate key-plus-fill headshot (common practice) — key
 * through a shoot-through umbrella at 1/2 from 1.2 m, fill at 1/8 from 1.0 m, about 1½ stops
 * under the key (2 stops of power, half a stop back by being closer): key-to-fill about 3:1,
 * where corporate sets usually sit (2:1 to 4:1). ISO 100, 1/125 s, about f/5.6, camera 1.5 m
 * from the sitter, sitter 2 m in front of the background.
 */
export const starterCard: SetupCard = {
  lights: [
    {
      role: 'key',
      power: 1 / 2,
      modifier: 'Shoot-through umbrella',
      modifierLossStops: null,
      distanceMetres: 1.2,
      guideNumber: null,
    },
    {
      role: 'fill',
      power: 1 / 8,
      modifier: 'Small diffuser',
      modifierLossStops: null,
      distanceMetres: 1,
      guideNumber: null,
    },
  ],
  camera: {
    sensorFormat: 'aps_c_15',
    customCropFactor: null,
    focalLengthMm: 50,
    aperture: 5.6,
    shutterSeconds: 1 / 125,
    iso: 100,
    flashSyncSeconds: 1 / 200,
    cameraToSitterMetres: 1.5,
    sitterToBackgroundMetres: 2,
  },
  notes: '',
};

export const shutterChoices = [
  1 / 30,
  1 / 60,
  1 / 80,
  1 / 100,
  1 / 125,
  1 / 160,
  1 / 200,
  1 / 250,
  1 / 320,
  1 / 500,
];

export function shutterLabel(seconds: number): string {
  return seconds >= 1 ? `${seconds} s` : `1/${Math.round(1 / seconds)} s`;
}
