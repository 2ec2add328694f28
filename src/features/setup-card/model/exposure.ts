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
  /** Full-power guide number at ISO 100 in metres, when known: heads differ in output. */
  guideNumber?: number | null;
}

/**
 * How many stops brighter light a falls on the subject than light b (negative: darker). When
 * both guide numbers are known their difference counts (GN is proportional to the square root
 * of the light, so 2 log2(GNa/GNb) stops); otherwise the heads are taken as equal in output.
 */
export function stopsBetweenLights(a: LightOnSubject, b: LightOnSubject): number {
  const output = a.guideNumber && b.guideNumber ? 2 * Math.log2(a.guideNumber / b.guideNumber) : 0;
  return (
    output +
    stopsBetweenPowers(a.power, b.power) +
    stopsForDistance(b.distanceMetres, a.distanceMetres) -
    ((a.modifierLossStops ?? 0) - (b.modifierLossStops ?? 0))
  );
}

/** Whether stopsBetweenLights had to assume equal heads (a guide number missing on either). */
export function assumesEqualOutput(a: LightOnSubject, b: LightOnSubject): boolean {
  return !(a.guideNumber && b.guideNumber);
}

export interface LightingRatio {
  stops: number;
  /** Lighting ratio, (key + fill) : fill, as an incident meter sees the lit side. One stop -> 3:1. */
  lighting: number;
  /** Key-to-fill, key alone : fill alone (each light metered separately). One stop -> 2:1. */
  keyToFill: number;
}

/** The ratio in both conventions, from the key's lead over the fill in stops. */
export function lightingRatio(keyOverFillStops: number): LightingRatio {
  const keyToFill = 2 ** keyOverFillStops;
  return { stops: keyOverFillStops, lighting: keyToFill + 1, keyToFill };
}

/** APEX exposure value Ev = Av + Tv, with Av = log2 N^2 and Tv = log2 (1/t). */
export function exposureValue(aperture: number, shutterSeconds: number): number {
  assertPositive(aperture, 'aperture');
  assertPositive(shutterSeconds, 'shutter time');
  return Math.log2(aperture * aperture) + Math.log2(1 / shutterSeconds);
}

export interface GuideNumberExposure {
  /** Guide number at full power and ISO 100, metres (the way guide numbers are quoted). */
  guideNumber: number;
  distanceMetres: number;
  iso?: number;
  /** Fraction of full power, 1 = full. */
  power?: number;
  /** Light lost in the modifier, stops. */
  modifierLossStops?: number;
}

/**
 * Aperture for a flash from its guide number:
 * N = GN x sqrt(ISO/100) x sqrt(power) x 2^(-loss/2) / distance. Light goes with N squared, so
 * each factor of light enters as its square root (half power: GN / sqrt 2; one stop lost: the same).
 */
export function apertureForGuideNumber(input: GuideNumberExposure): number {
  const { guideNumber, distanceMetres, iso = 100, power = 1, modifierLossStops = 0 } = input;
  assertPositive(guideNumber, 'guide number');
  assertPositive(distanceMetres, 'distance');
  assertPositive(iso, 'ISO');
  assertPositive(power, 'power');
  if (!(Number.isFinite(modifierLossStops) && modifierLossStops >= 0))
    throw new RangeError('The modifier loss must be zero or more stops.');
  const light = (iso / 100) * power * 2 ** -modifierLossStops;
  return (guideNumber * Math.sqrt(light)) / distanceMetres;
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
