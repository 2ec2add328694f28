import type { CardLight, SetupCard } from '../../../../server/schemas/setup-card';
import {
  circleOfConfusionMm,
  cropFactors,
  depthOfField,
  FACE_DEPTH_MM,
  type DepthOfField,
} from './depth-of-field';
import {
  apertureForGuideNumber,
  assumesEqualOutput,
  backgroundFalloffStops,
  exposureValue,
  lightingRatio,
  stopsBetweenLights,
  type LightingRatio,
} from './exposure';

export interface CardWarning {
  code:
    | 'shutter_slow'
    | 'shutter_over_sync'
    | 'iso_above_base'
    | 'fill_brighter_than_key'
    | 'ratio_dramatic'
    | 'background_close'
    | 'depth_too_shallow';
  message: string;
}

/** What a figure rests on that the photographer should know (shown under the figures). */
export interface CardAssumption {
  code: 'equal_output' | 'background_in_line';
  message: string;
}

export interface LightFigure {
  role: CardLight['role'];
  /**
   * This light relative to the key on the sitter, stops (key = 0). A background light is
   * measured where it points: on the background, at its distance to the background.
   */
  stopsRelativeToKey: number;
  /** Aperture this light alone would need, from its guide number, power, modifier and ISO. */
  apertureFromGuideNumber: number | null;
}

export interface CardFigures {
  lights: LightFigure[];
  ratio: LightingRatio | null;
  exposureValue: number;
  cropFactor: number;
  circleOfConfusionMm: number;
  depth: DepthOfField;
  coversFace: boolean;
  /** Stops the background sits below the sitter under the key (light in line behind the sitter). */
  backgroundStopsBelowSitter: number;
  warnings: CardWarning[];
  assumptions: CardAssumption[];
}

const BASE_ISO = 100;
const SLOWEST_HANDHELD_SECONDS = 1 / 60;
const MINIMUM_BACKGROUND_METRES = 1.5;
/** Key-to-fill above 8:1 (3 stops) reads as a dramatic look, not a corporate one (common practice). */
const DRAMATIC_KEY_TO_FILL = 8;

export function cropFactorOf(camera: SetupCard['camera']): number {
  if (camera.sensorFormat === 'custom') return camera.customCropFactor ?? 1;
  return cropFactors[camera.sensorFormat];
}

const asSubject = (light: CardLight) => ({
  power: light.power,
  distanceMetres: light.distanceMetres,
  modifierLossStops: light.modifierLossStops ?? 0,
  guideNumber: light.guideNumber,
});

/** Everything the card shows, worked out from what the photographer entered. */
export function computeCard(card: SetupCard): CardFigures {
  const { camera } = card;
  const key = card.lights.find((light) => light.role === 'key') ?? card.lights[0];
  if (!key) throw new RangeError('A card needs a key light.');
  const fill = card.lights.find((light) => light.role === 'fill');

  const lights = card.lights.map((light) => ({
    role: light.role,
    stopsRelativeToKey: stopsBetweenLights(asSubject(light), asSubject(key)),
    apertureFromGuideNumber: light.guideNumber
      ? apertureForGuideNumber({
          guideNumber: light.guideNumber,
          distanceMetres: light.distanceMetres,
          iso: camera.iso,
          power: light.power,
          modifierLossStops: light.modifierLossStops ?? 0,
        })
      : null,
  }));
  const keyOverFill = fill ? stopsBetweenLights(asSubject(key), asSubject(fill)) : null;

  const cropFactor = cropFactorOf(camera);
  const circle = circleOfConfusionMm(cropFactor);
  const depth = depthOfField({
    focalLengthMm: camera.focalLengthMm,
    aperture: camera.aperture,
    focusDistanceMm: camera.cameraToSitterMetres * 1000,
    circleOfConfusionMm: circle,
  });
  const backgroundStopsBelowSitter = backgroundFalloffStops(
    key.distanceMetres,
    key.distanceMetres + camera.sitterToBackgroundMetres,
  );

  const warnings: CardWarning[] = [];
  const epsilon = 1e-9;
  if (camera.shutterSeconds > SLOWEST_HANDHELD_SECONDS + epsilon) {
    warnings.push({
      code: 'shutter_slow',
      message: 'Shutter slower than 1/60 s: ambient light and movement may blur the frame.',
    });
  }
  if (camera.shutterSeconds < camera.flashSyncSeconds - epsilon) {
    warnings.push({
      code: 'shutter_over_sync',
      message:
        "Shutter faster than the body's flash sync speed: part of the frame will be dark, unless high-speed sync or a leaf shutter is used.",
    });
  }
  if (camera.iso > BASE_ISO) {
    warnings.push({
      code: 'iso_above_base',
      message:
        'ISO above 100, the base of most bodies: more noise than needed with flash (common practice).',
    });
  }
  if (keyOverFill !== null && keyOverFill < 0) {
    warnings.push({
      code: 'fill_brighter_than_key',
      message: 'The fill is brighter than the key on the sitter.',
    });
  }
  const ratio = keyOverFill === null ? null : lightingRatio(keyOverFill);
  if (ratio && ratio.keyToFill > DRAMATIC_KEY_TO_FILL + epsilon) {
    warnings.push({
      code: 'ratio_dramatic',
      message: `Key-to-fill ${ratio.keyToFill.toFixed(0)}:1 is above 8:1, a dramatic look: corporate sets usually sit at about 2:1 to 4:1 (common practice).`,
    });
  }
  if (camera.sitterToBackgroundMetres < MINIMUM_BACKGROUND_METRES) {
    warnings.push({
      code: 'background_close',
      message:
        'Sitter closer than 1.5 m to the background: shadows will land on it (common practice 1.5–3 m).',
    });
  }
  const coversFace = depth.totalMm >= FACE_DEPTH_MM;
  if (!coversFace) {
    warnings.push({
      code: 'depth_too_shallow',
      message: 'Depth of field is under about 10 cm: the ears or the nose may be soft.',
    });
  }

  const assumptions: CardAssumption[] = [];
  const others = card.lights.filter((light) => light !== key);
  if (others.some((light) => assumesEqualOutput(asSubject(light), asSubject(key)))) {
    assumptions.push({
      code: 'equal_output',
      message:
        "Stops between lights assume heads of equal output; enter each light's guide number to compare different heads.",
    });
  }
  assumptions.push({
    code: 'background_in_line',
    message:
      'The background fall-off is approximate: it takes the key as in line with the sitter and the background; a key off to the side falls off less.',
  });

  return {
    lights,
    ratio,
    exposureValue: exposureValue(camera.aperture, camera.shutterSeconds),
    cropFactor,
    circleOfConfusionMm: circle,
    depth,
    coversFace,
    backgroundStopsBelowSitter,
    warnings,
    assumptions,
  };
}
