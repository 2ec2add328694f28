import { describe, expect, it } from 'vitest';
import { setupCardSchema, type SetupCardInput } from '../../server/schemas/setup-card';
import { computeCard } from '../../src/features/setup-card/model/compute-card';
import { starterCard } from '../../src/features/setup-card/model/starter-card';

// A typical key-plus-fill corporate headshot (common practice): key at 1/2 from 1.2 m, fill at
// 1/8 from 1.0 m (about 1½ stops under), ISO 100, 1/125 s, a kit zoom at 50 mm and about f/5,
// camera 1.5 m from the sitter, sitter 2 m from the background.
const typical: SetupCardInput = {
  lights: [
    { role: 'key', power: 1 / 2, modifier: 'shoot-through umbrella', distanceMetres: 1.2 },
    { role: 'fill', power: 1 / 8, modifier: 'small diffuser', distanceMetres: 1 },
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

// 2 stops of power less, 2 log2(1.2) = 0.53 stop back by being closer.
const starterStops = 2 - 2 * Math.log2(1.2);

describe('setup card figures', () => {
  it('starts a station at about 3:1 key-to-fill (fill about 1½ stops under), with no warnings', () => {
    const figures = computeCard(setupCardSchema.parse(starterCard));
    expect(figures.warnings).toEqual([]);
    expect(figures.ratio?.stops).toBeCloseTo(starterStops, 10);
    expect(figures.ratio?.stops).toBeGreaterThan(1.25);
    expect(figures.ratio?.stops).toBeLessThan(1.75);
    // Corporate sets sit at about 2:1 to 4:1 key-to-fill (common practice).
    expect(figures.ratio?.keyToFill).toBeGreaterThan(2.5);
    expect(figures.ratio?.keyToFill).toBeLessThan(3.5);
    expect(figures.ratio?.lighting).toBeCloseTo(2 ** starterStops + 1, 10);
  });

  it('gives the typical set no warnings, and says what its figures assume', () => {
    const figures = card();
    expect(figures.warnings).toEqual([]);
    expect(figures.lights.find((light) => light.role === 'fill')?.stopsRelativeToKey).toBeCloseTo(
      -starterStops,
      10,
    );
    expect(figures.coversFace).toBe(true);
    // No guide numbers given: the card says it takes the heads as equal.
    expect(figures.assumptions.map((item) => item.code)).toEqual([
      'equal_output',
      'background_in_line',
    ]);
    expect(figures.assumptions[1]?.message).toMatch(/approximate/);
  });

  it('warns above 8:1 key-to-fill (a dramatic look), not at 8:1', () => {
    const sixteen = card((input) => {
      input.lights[1] = { role: 'fill', power: 1 / 32, distanceMetres: 1.2 };
    });
    expect(sixteen.ratio?.keyToFill).toBeCloseTo(16, 10);
    expect(sixteen.warnings.map((warning) => warning.code)).toContain('ratio_dramatic');
    const eight = card((input) => {
      input.lights[1] = { role: 'fill', power: 1 / 16, distanceMetres: 1.2 };
    });
    expect(eight.ratio?.keyToFill).toBeCloseTo(8, 10);
    expect(eight.warnings).toEqual([]);
  });

  it('combines power, distance and modifier loss for each light relative to the key', () => {
    const figures = card((input) => {
      input.lights[0] = { role: 'key', power: 1 / 2, distanceMetres: 1.2 };
      input.lights[1] = { role: 'fill', power: 1 / 2, distanceMetres: 2.4, modifierLossStops: 1 };
    });
    // Same power, twice the distance (-2), one stop more modifier loss (-1).
    expect(figures.lights[1]?.stopsRelativeToKey).toBeCloseTo(-3, 10);
  });

  it("uses each light's guide number when both are given, instead of assuming equal heads", () => {
    const figures = card((input) => {
      input.lights[0] = { role: 'key', power: 1 / 2, distanceMetres: 1.2, guideNumber: 40 };
      input.lights[1] = { role: 'fill', power: 1 / 2, distanceMetres: 1.2, guideNumber: 20 };
    });
    // Half the guide number is a quarter of the light: 2 stops.
    expect(figures.lights[1]?.stopsRelativeToKey).toBeCloseTo(-2, 10);
    expect(figures.assumptions.map((item) => item.code)).not.toContain('equal_output');
  });

  it("works the aperture from the guide number with the light's power and modifier loss", () => {
    const figures = card((input) => {
      input.lights[0] = {
        role: 'key',
        power: 1 / 2,
        distanceMetres: 2.5,
        guideNumber: 40,
        modifierLossStops: 1,
      };
    });
    // Half power and one stop lost: a quarter of the light, GN 40 acts as GN 20 -> f/8 at 2.5 m.
    expect(figures.lights[0]?.apertureFromGuideNumber).toBeCloseTo(8, 10);
  });

  it('words the sync and ISO warnings as a photographer would check them', () => {
    const figures = card((input) => {
      input.camera.shutterSeconds = 1 / 500;
      input.camera.iso = 400;
    });
    const messages = figures.warnings.map((warning) => warning.message).join('\n');
    expect(messages).toMatch(/unless high-speed sync or a leaf shutter is used/);
    expect(messages).toMatch(/ISO above 100, the base of most bodies/);
  });

  it('refuses an aperture wider than f/0.95 with a message that names that limit', () => {
    const parsed = setupCardSchema.safeParse({
      ...typical,
      camera: { ...typical.camera, aperture: 0.9 },
    });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues[0]?.message).toMatch(/f\/0\.95/);
    expect(
      setupCardSchema.safeParse({ ...typical, camera: { ...typical.camera, aperture: 0.95 } })
        .success,
    ).toBe(true);
    const narrow = setupCardSchema.safeParse({
      ...typical,
      camera: { ...typical.camera, aperture: 90 },
    });
    expect(narrow.error?.issues[0]?.message).toMatch(/f\/64/);
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
