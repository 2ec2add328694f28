import { describe, expect, it } from 'vitest';
import { setupCardSchema, type SetupCardInput } from '../../server/schemas/setup-card';
import { computeCard } from '../../src/features/setup-card/model/compute-card';

// A typical key-plus-fill headshot (common practice): key at 1/2, fill 4 stops lower at 1/32,
// ISO 100, 1/125 s, a kit zoom at 50 mm and about f/5, camera 1.5 m from the sitter, sitter 2 m from the background.
const typical: SetupCardInput = {
  lights: [
    { role: 'key', power: 1 / 2, modifier: 'shoot-through umbrella', distanceMetres: 1.2 },
    { role: 'fill', power: 1 / 32, modifier: 'small diffuser', distanceMetres: 1.2 },
  ],
  camera: {
    sensorFormat: 'aps_c_15',
    focalLengthMm: 50,
    aperture: 5,
    shutterSeconds: 1 / 125,
    iso: 100,
    flashSyncSeconds: 1 / 200,
    cameraToSitterMetres: 1.5,
    sitterToBackgroundMetres: 2,
  },
};

const card = (change: (input: SetupCardInput) => void = () => undefined) => {
  const input = structuredClone(typical);
  change(input);
  return computeCard(setupCardSchema.parse(input));
};

describe('setup card figures', () => {
  it('gives the typical set no warnings and a 4-stop, 17:1 incident ratio', () => {
    const figures = card();
    expect(figures.warnings).toEqual([]);
    expect(figures.ratio?.stops).toBeCloseTo(4, 10);
    expect(figures.ratio?.incident).toBeCloseTo(17, 10);
    expect(figures.lights.find((light) => light.role === 'fill')?.stopsRelativeToKey).toBeCloseTo(
      -4,
      10,
    );
    expect(figures.coversFace).toBe(true);
  });

  it('combines power, distance and modifier loss for each light relative to the key', () => {
    const figures = card((input) => {
      input.lights[1] = { role: 'fill', power: 1 / 2, distanceMetres: 2.4, modifierLossStops: 1 };
    });
    // Same power, twice the distance (-2), one stop more modifier loss (-1).
    expect(figures.lights[1]?.stopsRelativeToKey).toBeCloseTo(-3, 10);
  });

  const changes: Array<[string, (input: SetupCardInput) => void]> = [
    [
      'shutter_slow',
      (input) => {
        input.camera.shutterSeconds = 1 / 30;
      },
    ],
    [
      'shutter_over_sync',
      (input) => {
        input.camera.shutterSeconds = 1 / 500;
      },
    ],
    [
      'iso_above_base',
      (input) => {
        input.camera.iso = 400;
      },
    ],
    [
      'fill_brighter_than_key',
      (input) => {
        input.lights[1] = { role: 'fill', power: 1, distanceMetres: 1.2 };
      },
    ],
    [
      'background_close',
      (input) => {
        input.camera.sitterToBackgroundMetres = 1;
      },
    ],
    [
      'depth_too_shallow',
      (input) => {
        input.camera.aperture = 1.2;
      },
    ],
  ];
  it.each(changes)('warns %s', (code, change) => {
    expect(card(change).warnings.map((warning) => warning.code)).toContain(code);
  });

  it('puts the background two stops below the sitter when it is as far again behind', () => {
    const figures = card((input) => {
      input.lights[0] = { role: 'key', power: 1 / 2, distanceMetres: 2 };
      input.camera.sitterToBackgroundMetres = 2;
    });
    expect(figures.backgroundStopsBelowSitter).toBeCloseTo(2, 10);
  });

  it('refuses a card without a key light or with a power outside 1/1..1/128', () => {
    expect(
      setupCardSchema.safeParse({
        ...typical,
        lights: [{ role: 'fill', power: 0.5, distanceMetres: 1 }],
      }).success,
    ).toBe(false);
    expect(
      setupCardSchema.safeParse({
        ...typical,
        lights: [{ role: 'key', power: 2, distanceMetres: 1 }],
      }).success,
    ).toBe(false);
    expect(
      setupCardSchema.safeParse({
        ...typical,
        lights: [{ role: 'key', power: 1 / 256, distanceMetres: 1 }],
      }).success,
    ).toBe(false);
  });
});
