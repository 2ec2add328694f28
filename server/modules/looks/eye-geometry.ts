import type { FaceResult } from '@vladmandic/human';

export interface Point {
  x: number;
  y: number;
}

/** A face's two eye centres, in the pixels of the image it was detected in. */
export interface EyePair {
  /** The eye on the image's left (smaller x): the sitter's right eye. */
  left: Point;
  right: Point;
  /** `iris`: the iris model's centres; `lids`: the middle of the eyelid contour. */
  source: 'iris' | 'lids';
}

/**
 * Thresholds for sending a portrait to the "needs a hand" list. On the test portrait human scores
 * 0.87-0.93 (detector) and 1.0 (mesh) when the face is seen large; a cropped, blurred or turned
 * face drops the mesh score first, so the mesh bar is the high one.
 * - a face counts when human's overall score (the mesh's) reaches COUNTED_FACE: weaker
 *   detections are background clutter and must not turn a portrait into "several faces";
 * - the one counted face is trusted when, on the second, close look (see eye-finder), its
 *   detector score reaches MIN_BOX_SCORE, its mesh score MIN_MESH_SCORE, and its eyes are at
 *   least MIN_EYE_DISTANCE_PX original pixels apart (below that the iris model's 64 px eye crop
 *   is blown up from a handful of pixels and its centres wander).
 */
export const CONFIDENCE = {
  COUNTED_FACE: 0.5,
  MIN_BOX_SCORE: 0.6,
  MIN_MESH_SCORE: 0.85,
  MIN_EYE_DISTANCE_PX: 24,
} as const;

// facemesh indices (human's meshAnnotations): iris centre + 4 rim points, and the lid contours.
const IRIS_A = [468, 469, 470, 471, 472];
const IRIS_B = [473, 474, 475, 476, 477];
const LIDS_A = [466, 388, 387, 386, 385, 384, 398, 263, 249, 390, 373, 374, 380, 381, 382, 362];
const LIDS_B = [246, 161, 160, 159, 158, 157, 173, 33, 7, 163, 144, 145, 153, 154, 155, 133];

/**
 * The mean of mesh points. Human truncates every coordinate to whole pixels; adding half a pixel
 * removes that bias, and averaging the iris centre with its rim points (symmetric about it)
 * spreads the rounding error over five points.
 */
function meanOf(mesh: FaceResult['mesh'], indices: number[]): Point | null {
  let x = 0;
  let y = 0;
  for (const index of indices) {
    const point = mesh[index];
    if (!point) return null;
    x += point[0] + 0.5;
    y += point[1] + 0.5;
  }
  return { x: x / indices.length, y: y / indices.length };
}

export function eyesOf(face: FaceResult): EyePair | null {
  const hasIris = face.mesh.length >= 478;
  const a = meanOf(face.mesh, hasIris ? IRIS_A : LIDS_A);
  const b = meanOf(face.mesh, hasIris ? IRIS_B : LIDS_B);
  if (!a || !b) return null;
  const [left, right] = a.x <= b.x ? [a, b] : [b, a];
  return { left, right, source: hasIris ? 'iris' : 'lids' };
}

/** Eyes seen in a mirrored image of `width` px, in the unmirrored image's pixels. */
export function unmirror(eyes: EyePair, width: number): EyePair {
  const flip = ({ x, y }: Point): Point => ({ x: width - x, y });
  return { left: flip(eyes.right), right: flip(eyes.left), source: eyes.source };
}

/** The mean of several looks at the same face (at least one). */
export function meanOfAll(looks: EyePair[]): EyePair {
  const mean = (pick: (eyes: EyePair) => Point): Point => ({
    x: looks.reduce((sum, eyes) => sum + pick(eyes).x, 0) / looks.length,
    y: looks.reduce((sum, eyes) => sum + pick(eyes).y, 0) / looks.length,
  });
  return {
    left: mean((eyes) => eyes.left),
    right: mean((eyes) => eyes.right),
    source: looks[0]!.source,
  };
}

export function distance(a: Point, b: Point): number {
  return Math.hypot(b.x - a.x, b.y - a.y);
}

/**
 * The eye line's angle from the image's horizontal, in degrees, positive when the line falls to
 * the right (clockwise on screen, as sharp's rotate). Straightening a portrait is a rotation by
 * minus this angle. Taken from the eyes, not from human's head pose, whose roll is a few degrees
 * off for a sitter who looks up.
 */
export function rollDegrees(eyes: EyePair): number {
  return (Math.atan2(eyes.right.y - eyes.left.y, eyes.right.x - eyes.left.x) * 180) / Math.PI;
}

export function countedFaces(faces: FaceResult[]): FaceResult[] {
  return faces.filter((face) => face.score >= CONFIDENCE.COUNTED_FACE);
}

/** min(detector, mesh): the weaker of the two models' beliefs. */
export function confidenceOf(face: FaceResult): number {
  return Math.min(face.boxScore, face.faceScore || face.score);
}

/** `eyes` in original pixels. */
export function isTrusted(face: FaceResult, eyes: EyePair): boolean {
  return (
    face.boxScore >= CONFIDENCE.MIN_BOX_SCORE &&
    (face.faceScore || face.score) >= CONFIDENCE.MIN_MESH_SCORE &&
    distance(eyes.left, eyes.right) >= CONFIDENCE.MIN_EYE_DISTANCE_PX
  );
}

/** Centre and side of a face's box, moved by `offset` (where its tile lies in the whole). */
export function faceSquare(face: FaceResult, offset: Point = { x: 0, y: 0 }) {
  const [x, y, width, height] = face.box;
  return {
    x: offset.x + x + width / 2,
    y: offset.y + y + height / 2,
    side: Math.max(width, height),
  };
}

/** The face nearest a point: picks the refined face out of a crop that may show a neighbour. */
export function nearestFace(faces: FaceResult[], to: Point): FaceResult | null {
  let best: FaceResult | null = null;
  let bestDistance = Infinity;
  for (const face of faces) {
    const gap = distance(faceSquare(face), to);
    if (gap < bestDistance) [best, bestDistance] = [face, gap];
  }
  return best;
}
