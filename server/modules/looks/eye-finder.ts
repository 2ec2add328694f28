import type { FaceResult } from '@vladmandic/human';
import {
  confidenceOf,
  countedFaces,
  distance,
  eyesOf,
  faceSquare,
  isTrusted,
  meanOfAll,
  nearestFace,
  rollDegrees,
  unmirror,
  type EyePair,
  type Point,
} from './eye-geometry';
import { loadFaceModel, type FaceModel, type RgbImage } from './eye-human';
import {
  cropRgb,
  mirrorRgb,
  mountRgb,
  fitInside,
  openUpright,
  overlappingTiles,
  readScaled,
  squareAround,
  type UprightImage,
} from './eye-image';

export type EyeFindingStatus = 'found' | 'no_face' | 'several_faces' | 'low_confidence';

/**
 * Where a portrait's eyes are. Coordinates are in the original image's pixels once turned upright
 * by its EXIF orientation, measured from its top-left corner (a pixel's centre is at +0.5).
 * Anything but `found` puts the portrait on the "needs a hand" list.
 */
export interface EyeFinding {
  status: EyeFindingStatus;
  /** Faces counted; when none reaches the counting bar, the weak ones human still reported. */
  faces: number;
  /** The eye on the image's left (smaller x); null unless one face was found. */
  leftEye: Point | null;
  rightEye: Point | null;
  /** The eye line's angle from horizontal in degrees, positive clockwise (see eye-geometry). */
  rollDeg: number | null;
  /** min(detector score, mesh score) of the face reported, 0..1; 0 when there is none. */
  confidence: number;
  /** The upright original's size. */
  width: number;
  height: number;
}

export interface EyeFinder {
  find(input: Buffer | string): Promise<EyeFinding>;
  /** Frees the model; waits for the queued calls first. */
  close(): Promise<void>;
}

/** Long edge of the copy the faces are searched in (the 1,024 px). */
export const DETECTION_EDGE = 1024;
/**
 * Long edge of the one decoded copy kept for the close look. A 6000 px JPEG shrinks by 4 while
 * decoding, so this costs what decoding to 1,024 px does (about 200 ms on two cores; 2,048 px
 * would need a shrink by 2 and take 340).
 */
const WORKING_EDGE = 1536;
/** Long edge of the second, close look at the one face. */
const CLOSE_LOOK_EDGE = 1024;
/**
 * How far the close look may enlarge a small image. Human truncates its landmarks to whole pixels
 * of the image it saw, so in a 420 px badge half a pixel is 0.5 % of the eye distance; seen at
 * twice the size it is half that.
 */
const CLOSE_LOOK_MAX_ENLARGEMENT = 4;
/** The close look's crop side as a multiple of the face box side: hair to chin, ear to ear. */
const CLOSE_LOOK_MARGIN = 2;

/** A face seen in the detection copy, with its box's centre and side in the copy's pixels. */
interface Sighting {
  face: FaceResult;
  square: { x: number; y: number; side: number };
}

/**
 * Faces in the detection copy. The detector looks at the whole image at 256 px, so a face under
 * about 5% of the long edge goes unseen; when nothing counts, it looks again at nine overlapping
 * half-size tiles (faces down to about 2.5%; this costs time only on frames without a face).
 */
async function sightFaces(model: FaceModel, copy: RgbImage): Promise<Sighting[]> {
  const whole = (await model.detect(copy)).map((face) => ({ face, square: faceSquare(face) }));
  if (countedFaces(whole.map(({ face }) => face)).length > 0) return whole;
  const found: Sighting[] = [];
  for (const tile of overlappingTiles(copy.width, copy.height)) {
    for (const face of await model.detect(cropRgb(copy, tile))) {
      const square = faceSquare(face, { x: tile.left, y: tile.top });
      // Tiles overlap: a face seen in two of them is one face.
      const twin = found.find((seen) => distance(seen.square, square) < seen.square.side / 2);
      if (!twin) found.push({ face, square });
      else if (face.score > twin.face.score) Object.assign(twin, { face, square });
    }
  }
  return found.length > 0 ? found : whole;
}

/**
 * A second look on a crop around the face, the face about a quarter of the crop. Human reports
 * whole pixels of the image it saw, and in the 1,024 px copy of a 24 MP frame one of those is six
 * original pixels; here one is a fraction of that. The crop is seen straight and mirrored (the
 * models' left-right leanings cancel in the mean of the two). A crop reaching past the picture is
 * mounted on grey rather than cut. Null when the crop shows no face.
 */
async function closeLook(
  model: FaceModel,
  image: UprightImage,
  working: RgbImage,
  square: { x: number; y: number; side: number },
): Promise<{ face: FaceResult; eyes: EyePair } | null> {
  const side = square.side * CLOSE_LOOK_MARGIN;
  const wanted = Math.min(CLOSE_LOOK_MAX_ENLARGEMENT, CLOSE_LOOK_EDGE / side);
  // The working copy serves when it holds the face at least half as large as wanted (the face
  // mesh sees 192 px anyway), else the original is decoded again.
  const workingFactor = working.width / image.width;
  const source = workingFactor >= wanted / 2 ? working : image;
  const factor = source === working ? wanted / workingFactor : wanted;
  const scaled = {
    width: Math.max(1, Math.round(source.width * factor)),
    height: Math.max(1, Math.round(source.height * factor)),
  };
  // From here on, scaled pixels against the original's.
  const fx = scaled.width / image.width;
  const fy = scaled.height / image.height;
  const around = squareAround({ x: square.x * fx, y: square.y * fy }, side * fx, scaled);
  if (!around) return null;
  const { region, pad } = around;
  const crop = mountRgb(await readScaled(source, scaled, region), pad);
  // The crop's own pixels start `pad` before the region's.
  const origin = { x: region.left - pad.left, y: region.top - pad.top };
  const centre = { x: square.x * fx - origin.x, y: square.y * fy - origin.y };
  const face = nearestFace(await model.detect(crop), centre);
  const direct = face ? eyesOf(face) : null;
  if (!face || !direct) return null;
  const mirroredCentre = { x: crop.width - centre.x, y: centre.y };
  const mirroredFace = nearestFace(await model.detect(mirrorRgb(crop)), mirroredCentre);
  const mirrored = mirroredFace ? eyesOf(mirroredFace) : null;
  const back = ({ x, y }: Point): Point => ({
    x: (x + origin.x) / fx,
    y: (y + origin.y) / fy,
  });
  const inOriginal = (eyes: EyePair): EyePair => ({
    left: back(eyes.left),
    right: back(eyes.right),
    source: eyes.source,
  });
  const looks = [inOriginal(direct)];
  if (mirrored) looks.push(inOriginal(unmirror(mirrored, crop.width)));
  return { face, eyes: meanOfAll(looks) };
}

async function findEyes(model: FaceModel, input: Buffer | string): Promise<EyeFinding> {
  const image = await openUpright(input);
  const working = await readScaled(image, fitInside(image, WORKING_EDGE));
  const copy = await readScaled(working, fitInside(image, DETECTION_EDGE));
  const fx = copy.width / image.width;
  const fy = copy.height / image.height;
  const sightings = await sightFaces(model, copy);
  const counted = sightings.filter(({ face }) => countedFaces([face]).length === 1);
  const base = { leftEye: null, rightEye: null, rollDeg: null };
  const size = { width: image.width, height: image.height };
  if (counted.length > 1) {
    const confidence = Math.max(...counted.map(({ face }) => confidenceOf(face)));
    return { ...base, ...size, status: 'several_faces', faces: counted.length, confidence };
  }
  const sighting = counted[0] ?? sightings[0];
  if (!sighting) return { ...base, ...size, status: 'no_face', faces: 0, confidence: 0 };

  const inOriginal = { x: sighting.square.x / fx, y: sighting.square.y / fy };
  const side = sighting.square.side / Math.min(fx, fy);
  const close = await closeLook(model, image, working, { ...inOriginal, side });
  const firstEyes = eyesOf(sighting.face);
  const eyes: EyePair | null =
    close?.eyes ??
    (firstEyes && {
      left: { x: firstEyes.left.x / fx, y: firstEyes.left.y / fy },
      right: { x: firstEyes.right.x / fx, y: firstEyes.right.y / fy },
      source: firstEyes.source,
    });
  const face = close?.face ?? sighting.face;
  const trusted = counted.length === 1 && close !== null && isTrusted(close.face, close.eyes);
  return {
    ...size,
    status: trusted ? 'found' : 'low_confidence',
    faces: counted.length || sightings.length,
    leftEye: eyes?.left ?? null,
    rightEye: eyes?.right ?? null,
    rollDeg: eyes ? rollDegrees(eyes) : null,
    confidence: confidenceOf(face),
  };
}

/**
 * One face model for the process, loaded on the first call (about half a second). Its tensors and
 * the wasm module are shared state, so calls run one after another in the order they came.
 */
export function createEyeFinder(): EyeFinder {
  let model: Promise<FaceModel> | null = null;
  let queue: Promise<unknown> = Promise.resolve();
  const enqueue = <T>(work: () => Promise<T>): Promise<T> => {
    const result = queue.then(work);
    queue = result.catch(() => undefined);
    return result;
  };
  const loaded = () => {
    model ??= loadFaceModel().catch((error: unknown) => {
      model = null; // a later call may try again
      throw error;
    });
    return model;
  };
  return {
    find: (input) => enqueue(async () => findEyes(await loaded(), input)),
    close: () =>
      enqueue(async () => {
        const current = model;
        model = null;
        if (current) await (await current).close();
      }),
  };
}
