import type { CropRefusalReason, Point, Rendition } from '../../schemas/looks';

/**
 * Where a rendition's crop lies in a photo, from the two eye centres: pure arithmetic, no
 * image library, so it can be tested for every kind of input.
 *
 * Frames of reference (all in pixels, x to the right, y down; (0, 0) is the top-left corner of
 * the top-left pixel, so pixel (i, j) covers [i, i+1) x [j, j+1) and has its centre at
 * (i + 0.5, j + 0.5)):
 * - the source: the upright original, i.e. after its EXIF orientation is applied. Eye positions
 *   and imageWidth/imageHeight are given in this frame.
 * - the levelled frame: the source turned by rotationDeg (clockwise on screen, as sharp's
 *   rotate() takes it) about its centre, on a canvas just large enough to hold all of it: the
 *   canvas libvips makes for sharp's rotate(), to the pixel (see levelledFrame). The crop is an
 *   integer rectangle in this frame, so the renderer extracts exactly it. With rotationDeg 0
 *   the levelled frame is the source itself.
 * - the output: outputWidth x outputHeight pixels; eyesAt is given in it.
 */

/**
 * Average adult proportions used to turn the eye distance (between the pupil centres) into
 * other head measures. Common anthropometry, values from memory, verify before relying on them:
 * interpupillary distance about 63 mm (Dodgson 2004, Proc. SPIE 5291, mean adult IPD), head
 * breadth (eurion to eurion) about 150 mm, pupils to chin (menton) about 110 mm, crown (vertex)
 * to chin about 227 mm. Individual faces differ by 10 % or more, so these only set the frame.
 */
export const faceProportions = {
  /** eye distance / head width: 63 / 150 (from memory). */
  eyeDistancePerHeadWidth: 0.42,
  /** eye-to-chin / eye distance: 110 / 63 (from memory). */
  eyeToChinPerEyeDistance: 1.75,
  /** crown-to-chin / eye distance: 227 / 63 (from memory); the eyes sit about halfway. */
  crownToChinPerEyeDistance: 3.6,
} as const;

export interface CropRequest {
  imageWidth: number;
  imageHeight: number;
  /** The eye nearer the image's left edge (the sitter's right eye), in the upright source. */
  leftEye: Point;
  /** The eye nearer the image's right edge (the sitter's left eye), in the upright source. */
  rightEye: Point;
  rendition: Rendition;
}

export interface Sides {
  left: number;
  top: number;
  right: number;
  bottom: number;
}

export interface CropPlan {
  ok: true;
  /** The source's size; the renderer checks the file it is given has the same upright size. */
  imageWidth: number;
  imageHeight: number;
  /** Clockwise on screen, about the source's centre; levels the eye line. */
  rotationDeg: number;
  /** Output pixels per source pixel (the crop is resized by this, up to rounding). */
  scale: number;
  /** In the levelled frame (see above); integers, so the renderer extracts it exactly. */
  crop: { left: number; top: number; width: number; height: number };
  outputWidth: number;
  outputHeight: number;
  /** Where the eye centres land in the output, after the integer crop is resized. */
  eyesAt: { left: Point; right: Point };
  /**
   * How far the crop reaches past each edge of the source, in output pixels, rounded up; 0 when
   * inside. Measured along the source's axes (they differ from the output's by the rotation).
   */
  overflow: Sides;
}

export interface CropRefusal {
  ok: false;
  reason: CropRefusalReason;
  message: string;
}

export type CropResult = CropPlan | CropRefusal;

const degrees = (radians: number) => (radians * 180) / Math.PI;
const radians = (deg: number) => (deg * Math.PI) / 180;
/** Floating-point slack when comparing against edges; far below a pixel. */
const EPSILON = 1e-6;

/** C's rounding as libvips uses it (VIPS_ROUND_INT): halves away from zero. */
const roundHalfAway = (value: number) =>
  value < 0 ? -Math.floor(-value + 0.5) : Math.floor(value + 0.5);

export interface LevelledFrame {
  /** The canvas size of sharp's rotate() for this source and angle. */
  width: number;
  height: number;
  fromSource(point: Point): Point;
  toSource(point: Point): Point;
}

/**
 * The levelled frame for a source of width x height turned by rotationDeg. libvips rotates
 * about the origin with pixel centres as the sample points (so a pixel index i stands at
 * i + 0.5), then sets its canvas to the rotated corners' bounding box, rounded to whole pixels
 * (vips__transform_set_area). Modelling that exactly, rather than an ideal canvas, keeps the
 * extracted crop where the plan put it instead of up to half a pixel off.
 */
export function levelledFrame(width: number, height: number, rotationDeg: number): LevelledFrame {
  const cos = Math.cos(radians(rotationDeg));
  const sin = Math.sin(radians(rotationDeg));
  const xs = [0, width * cos, -height * sin, width * cos - height * sin];
  const ys = [0, width * sin, height * cos, width * sin + height * cos];
  const originX = roundHalfAway(Math.min(...xs));
  const originY = roundHalfAway(Math.min(...ys));
  return {
    width: roundHalfAway(Math.max(...xs) - Math.min(...xs)),
    height: roundHalfAway(Math.max(...ys) - Math.min(...ys)),
    fromSource: ({ x, y }) => ({
      x: cos * (x - 0.5) - sin * (y - 0.5) + 0.5 - originX,
      y: sin * (x - 0.5) + cos * (y - 0.5) + 0.5 - originY,
    }),
    toSource: ({ x, y }) => {
      const dx = x - 0.5 + originX;
      const dy = y - 0.5 + originY;
      return { x: cos * dx + sin * dy + 0.5, y: -sin * dx + cos * dy + 0.5 };
    },
  };
}

/** The eye distance in output pixels that the rendition's head size asks for. */
export function targetEyeDistance(rendition: Rendition): number {
  const measured = rendition.headSize.fraction * rendition.width;
  return rendition.headSize.measure === 'eye_distance'
    ? measured
    : measured / faceProportions.eyeToChinPerEyeDistance;
}

const refuse = (reason: CropRefusalReason, message: string): CropRefusal => ({
  ok: false,
  reason,
  message,
});

export function planCrop(request: CropRequest): CropResult {
  const { imageWidth: width, imageHeight: height, leftEye, rightEye, rendition } = request;
  if (!(Number.isInteger(width) && Number.isInteger(height) && width > 0 && height > 0)) {
    throw new RangeError(`Image size must be whole pixels, not ${width} x ${height}.`);
  }
  const inside = (eye: Point) => eye.x >= 0 && eye.x <= width && eye.y >= 0 && eye.y <= height;
  if (!inside(leftEye) || !inside(rightEye)) {
    return refuse('eyes_outside_image', 'The eye positions lie outside the photo.');
  }
  const dx = rightEye.x - leftEye.x;
  const dy = rightEye.y - leftEye.y;
  const eyeDistance = Math.hypot(dx, dy);
  if (dx <= 0) {
    return refuse(
      'eyes_reversed',
      'The right-hand eye is not to the right of the left-hand one; check the eye positions.',
    );
  }

  // The eye line's angle below the horizontal; turning the photo by its negative levels it.
  const roll = degrees(Math.atan2(dy, dx));
  if (Math.abs(roll) > rendition.maxRotationDeg + EPSILON) {
    return refuse(
      'rotation_too_large',
      `The head is tilted ${Math.abs(roll).toFixed(1)}°; ${rendition.name} levels at most ` +
        `${rendition.maxRotationDeg}°. Move the eye marks if they are off the eyes, or choose another frame.`,
    );
  }
  const rotationDeg = roll === 0 ? 0 : -roll;

  // Enlarging would make the rendition softer than the photo (and an ID photo's minimum eye
  // distance is about real detail), so a face too small for the output is refused.
  const wantedEyeDistance = targetEyeDistance(rendition);
  const scale = wantedEyeDistance / eyeDistance;
  if (scale > 1) {
    return refuse(
      'eyes_too_close',
      `The eyes are ${eyeDistance.toFixed(0)} px apart; ${rendition.name} needs at least ` +
        `${Math.ceil(wantedEyeDistance)} px without enlarging the photo.`,
    );
  }

  const frame = levelledFrame(width, height, rotationDeg);
  const left = frame.fromSource(leftEye);
  const right = frame.fromSource(rightEye);
  const mid = { x: (left.x + right.x) / 2, y: (left.y + right.y) / 2 };
  const target = {
    x: rendition.centreX * rendition.width,
    y: rendition.eyeLine * rendition.height,
  };

  // Round the crop's size first, then place it from the rounded size: the eye midpoint then
  // misses its target only by the placement's rounding (at most half a source pixel, which is
  // at most half an output pixel since scale <= 1), and the eye distance by under half a pixel.
  const cropWidth = Math.round(rendition.width / scale);
  const cropHeight = Math.round(rendition.height / scale);
  const cropLeft = Math.round(mid.x - (target.x * cropWidth) / rendition.width);
  const cropTop = Math.round(mid.y - (target.y * cropHeight) / rendition.height);
  const scaleX = rendition.width / cropWidth;
  const scaleY = rendition.height / cropHeight;
  const toOutput = (point: Point): Point => ({
    x: (point.x - cropLeft) * scaleX,
    y: (point.y - cropTop) * scaleY,
  });

  // The crop's corners taken back into the source show how far it reaches past the photo.
  const corners = [
    { x: cropLeft, y: cropTop },
    { x: cropLeft + cropWidth, y: cropTop },
    { x: cropLeft, y: cropTop + cropHeight },
    { x: cropLeft + cropWidth, y: cropTop + cropHeight },
  ].map((corner) => frame.toSource(corner));
  const past = (amount: number) => Math.max(0, Math.ceil(amount * scale - EPSILON));
  const overflow: Sides = {
    left: past(-Math.min(...corners.map((corner) => corner.x))),
    top: past(-Math.min(...corners.map((corner) => corner.y))),
    right: past(Math.max(...corners.map((corner) => corner.x)) - width),
    bottom: past(Math.max(...corners.map((corner) => corner.y)) - height),
  };
  const overflows = overflow.left + overflow.top + overflow.right + overflow.bottom > 0;
  if (overflows && rendition.overflow === 'refuse') {
    const sides = (Object.keys(overflow) as Array<keyof Sides>)
      .filter((side) => overflow[side] > 0)
      .map((side) => `${overflow[side]} px ${side}`)
      .join(', ');
    return refuse(
      'leaves_frame',
      `${rendition.name} would reach past the photo (${sides}); the face is too near the edge ` +
        'or too large for this framing.',
    );
  }

  return {
    ok: true,
    imageWidth: width,
    imageHeight: height,
    rotationDeg,
    scale,
    crop: { left: cropLeft, top: cropTop, width: cropWidth, height: cropHeight },
    outputWidth: rendition.width,
    outputHeight: rendition.height,
    eyesAt: { left: toOutput(left), right: toOutput(right) },
    overflow,
  };
}
