/**
 * Exposure arithmetic for the setup card. Pure functions, no units hidden: distances in metres
 * unless a name says otherwise, shutter times in seconds, flash power as a fraction of full.
 */

/** Stops from power b up to power a: 1/2 -> 1/32 is 4 stops (each halving is one stop). */
export function stopsBetweenPowers(a: number, b: number): number {
  assertPositive(a, 'power');
  assertPositive(b, 'power');
  return Math.log2(a / b);
}

/** Light change in stops when a light moves from one distance to another (inverse-square law). */
export function stopsForDistance(fromMetres: number, toMetres: number): number {
  assertPositive(fromMetres, 'distance');
  assertPositive(toMetres, 'distance');
  return -2 * Math.log2(toMetres / fromMetres);
}

export interface LightOnSubject {
  /** Fraction of full power, 1 = full. */
  power: number;
  /** Light to subject, metres. */
  distanceMetres: number;
  /** Light lost in the modifier, stops (0 when unknown). */
  modifierLossStops?: number;
}

/** How many stops brighter light a falls on the subject than light b (negative: darker). */
export function stopsBetweenLights(a: LightOnSubject, b: LightOnSubject): number {
  return (
    stopsBetweenPowers(a.power, b.power) +
    stopsForDistance(b.distanceMetres, a.distanceMetres) -
    ((a.modifierLossStops ?? 0) - (b.modifierLossStops ?? 0))
  );
}

export interface LightingRatio {
  stops: number;
  /** Incident convention: (key + fill) : fill. One stop -> 3:1. */
  incident: number;
  /** Separate-meter convention: key : fill. One stop -> 2:1. */
  separateMeter: number;
}

/** The key-to-fill ratio in both conventions, from the key's lead over the fill in stops. */
export function lightingRatio(keyOverFillStops: number): LightingRatio {
  const separateMeter = 2 ** keyOverFillStops;
  return { stops: keyOverFillStops, incident: separateMeter + 1, separateMeter };
}

/** APEX exposure value Ev = Av + Tv, with Av = log2 N^2 and Tv = log2 (1/t). */
export function exposureValue(aperture: number, shutterSeconds: number): number {
  assertPositive(aperture, 'aperture');
  assertPositive(shutterSeconds, 'shutter time');
  return Math.log2(aperture * aperture) + Math.log2(1 / shutterSeconds);
}

/** Aperture for a flash of guide number GN (metres, ISO 100) at a distance and ISO. */
export function apertureForGuideNumber(
  guideNumberIso100: number,
  distanceMetres: number,
  iso = 100,
): number {
  assertPositive(guideNumberIso100, 'guide number');
  assertPositive(distanceMetres, 'distance');
  assertPositive(iso, 'ISO');
  return (guideNumberIso100 * Math.sqrt(iso / 100)) / distanceMetres;
}

/** Stops by which the background is darker than the sitter, both lit by the same light. */
export function backgroundFalloffStops(
  lightToSitterMetres: number,
  lightToBackgroundMetres: number,
): number {
  return -stopsForDistance(lightToSitterMetres, lightToBackgroundMetres);
}

function assertPositive(value: number, what: string) {
  if (!(Number.isFinite(value) && value > 0))
    throw new RangeError(`The ${what} must be a positive number.`);
}
