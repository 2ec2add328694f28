/**
 * Depth of field with the thin-lens equations used by common calculators (after Greenleaf):
 * H = f^2 / (N c) + f; near = s (H - f) / (H + s - 2f); far = s (H - f) / (H - s), infinite once s >= H.
 * All lengths in millimetres.
 */
export interface DepthOfField {
  hyperfocalMm: number;
  nearMm: number;
  farMm: number;
  totalMm: number;
}

export function depthOfField(input: {
  focalLengthMm: number;
  aperture: number;
  focusDistanceMm: number;
  circleOfConfusionMm: number;
}): DepthOfField {
  const { focalLengthMm: f, aperture: n, focusDistanceMm: s, circleOfConfusionMm: c } = input;
  for (const [value, name] of [
    [f, 'focal length'],
    [n, 'aperture'],
    [s, 'focus distance'],
    [c, 'circle of confusion'],
  ] as const) {
    if (!(Number.isFinite(value) && value > 0))
      throw new RangeError(`The ${name} must be a positive number.`);
  }
  if (s <= f) throw new RangeError('The focus distance must be longer than the focal length.');
  const hyperfocalMm = (f * f) / (n * c) + f;
  const nearMm = (s * (hyperfocalMm - f)) / (hyperfocalMm + s - 2 * f);
  const farMm = s >= hyperfocalMm ? Infinity : (s * (hyperfocalMm - f)) / (hyperfocalMm - s);
  return { hyperfocalMm, nearMm, farMm, totalMm: farMm - nearMm };
}

export type SensorFormat = 'full_frame' | 'aps_c_15' | 'aps_c_16' | 'micro_four_thirds' | 'custom';

export const cropFactors: Record<Exclude<SensorFormat, 'custom'>, number> = {
  full_frame: 1,
  aps_c_15: 1.5,
  aps_c_16: 1.6,
  micro_four_thirds: 2,
};

/** 0.030 mm on full frame, divided by the crop factor (the usual convention). */
export function circleOfConfusionMm(cropFactor: number): number {
  if (!(Number.isFinite(cropFactor) && cropFactor > 0))
    throw new RangeError('The crop factor must be positive.');
  return 0.03 / cropFactor;
}

/** About 10 cm from the tip of the nose to the ears (common practice). */
export const FACE_DEPTH_MM = 100;
