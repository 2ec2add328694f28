import type { CardLight, SetupCard } from '../../../../server/schemas/setup-card';
import {
  circleOfConfusionMm,
  cropFactors,
  depthOfField,
  FACE_DEPTH_MM,
  type DepthOfField,
} from './depth-of-field';
import {
  backgroundFalloffStops,
  exposureValue,
  apertureForGuideNumber,
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
    | 'background_close'
    | 'depth_too_shallow';
  message: string;
}

export interface LightFigure {
  role: CardLight['role'];
  /** Light on the sitter relative to the key, stops (key = 0). */
  stopsRelativeToKey: number;
  /** Aperture this light alone would need, from its guide number, at the card's ISO. */
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
}

const BASE_ISO = 100;
const SLOWEST_HANDHELD_SECONDS = 1 / 60;
const MINIMUM_BACKGROUND_METRES = 1.5;

export function cropFactorOf(camera: SetupCard['camera']): number {
  if (camera.sensorFormat === 'custom') return camera.customCropFactor ?? 1;
  return cropFactors[camera.sensorFormat];
}

const asSubject = (light: CardLight) => ({
  power: light.power,
  distanceMetres: light.distanceMetres,
  modifierLossStops: light.modifierLossStops ?? 0,
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
      ? apertureForGuideNumber(light.guideNumber, light.distanceMetres, camera.iso)
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
      message: "Shutter faster than the body's flash sync speed: part of the frame will be dark.",
    });
  }
  if (camera.iso > BASE_ISO) {
    warnings.push({
      code: 'iso_above_base',
      message:
        'ISO above the base value of 100: more noise than needed with flash (common practice).',
    });
  }
  if (keyOverFill !== null && keyOverFill < 0) {
    warnings.push({
      code: 'fill_brighter_than_key',
      message: 'The fill is brighter than the key on the sitter.',
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

  return {
    lights,
    ratio: keyOverFill === null ? null : lightingRatio(keyOverFill),
    exposureValue: exposureValue(camera.aperture, camera.shutterSeconds),
    cropFactor,
    circleOfConfusionMm: circle,
    depth,
    coversFace,
    backgroundStopsBelowSitter,
    warnings,
  };
}
