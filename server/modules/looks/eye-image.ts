import sharp from 'sharp';
import type { RgbImage } from './eye-human';

/** A source image with its size once turned upright by its EXIF orientation. */
export interface UprightImage {
  input: Buffer | string;
  width: number;
  height: number;
}

export interface Region {
  left: number;
  top: number;
  width: number;
  height: number;
}

export async function openUpright(input: Buffer | string): Promise<UprightImage> {
  const { width, height } = (await sharp(input).metadata()).autoOrient;
  if (!width || !height) throw new Error('the image has no size');
  return { input, width, height };
}

/** The upright image's size scaled so its long edge is at most `longEdge` (never enlarged). */
export function fitInside(
  image: UprightImage,
  longEdge: number,
): { width: number; height: number } {
  const factor = Math.min(1, longEdge / Math.max(image.width, image.height));
  return {
    width: Math.max(1, Math.round(image.width * factor)),
    height: Math.max(1, Math.round(image.height * factor)),
  };
}

/**
 * The upright image (or an RGB copy of it) scaled to `size`, then cut to `region` (in scaled
 * pixels), as RGB. sharp shrinks while decoding a JPEG, so a 24 MP frame is not decoded at full
 * size unless the region needs every pixel.
 */
export async function readScaled(
  source: UprightImage | RgbImage,
  size: { width: number; height: number },
  region?: Region,
): Promise<RgbImage> {
  const decoded =
    'data' in source
      ? sharp(source.data, { raw: { width: source.width, height: source.height, channels: 3 } })
      : sharp(source.input).rotate();
  let pipeline = decoded
    .resize({ ...size, fit: 'fill' })
    .removeAlpha()
    .toColourspace('srgb');
  if (region) pipeline = pipeline.extract(region);
  const { data, info } = await pipeline.raw().toBuffer({ resolveWithObject: true });
  if (info.channels !== 3) throw new Error(`expected RGB, got ${info.channels} channels`);
  return { data, width: info.width, height: info.height };
}

/** A rectangle of an RGB image, copied row by row (no decoding). */
export function cropRgb(image: RgbImage, region: Region): RgbImage {
  const data = Buffer.alloc(region.width * region.height * 3);
  for (let row = 0; row < region.height; row += 1) {
    const start = ((region.top + row) * image.width + region.left) * 3;
    image.data.copy(data, row * region.width * 3, start, start + region.width * 3);
  }
  return { data, width: region.width, height: region.height };
}

/** The image flipped left to right. */
export function mirrorRgb(image: RgbImage): RgbImage {
  const data = Buffer.alloc(image.data.length);
  for (let row = 0; row < image.height; row += 1) {
    for (let column = 0; column < image.width; column += 1) {
      const from = (row * image.width + column) * 3;
      image.data.copy(data, (row * image.width + image.width - 1 - column) * 3, from, from + 3);
    }
  }
  return { ...image, data };
}

/**
 * Half-size tiles overlapping by half, 3 x 3: any face up to a quarter of the image's size lies
 * wholly inside one. The face detector sees each at twice the scale of the whole image.
 */
export function overlappingTiles(width: number, height: number): Region[] {
  const tileWidth = Math.ceil(width / 2);
  const tileHeight = Math.ceil(height / 2);
  const tiles: Region[] = [];
  for (const fy of [0, 0.5, 1]) {
    for (const fx of [0, 0.5, 1]) {
      const left = Math.round((width - tileWidth) * fx);
      const top = Math.round((height - tileHeight) * fy);
      tiles.push({ left, top, width: tileWidth, height: tileHeight });
    }
  }
  return tiles;
}

/**
 * A square of side `side` around a centre: the part inside the image (`region`) and how far the
 * square reaches past each edge (`pad`). Null when the part inside is too small to use.
 */
export function squareAround(
  centre: { x: number; y: number },
  side: number,
  size: { width: number; height: number },
): { region: Region; pad: { left: number; top: number; right: number; bottom: number } } | null {
  const wantedLeft = Math.floor(centre.x - side / 2);
  const wantedTop = Math.floor(centre.y - side / 2);
  const wantedRight = Math.ceil(centre.x + side / 2);
  const wantedBottom = Math.ceil(centre.y + side / 2);
  const left = Math.max(0, wantedLeft);
  const top = Math.max(0, wantedTop);
  const right = Math.min(size.width, wantedRight);
  const bottom = Math.min(size.height, wantedBottom);
  if (right - left < 16 || bottom - top < 16) return null;
  return {
    region: { left, top, width: right - left, height: bottom - top },
    pad: {
      left: left - wantedLeft,
      top: top - wantedTop,
      right: Math.max(0, wantedRight - right),
      bottom: Math.max(0, wantedBottom - bottom),
    },
  };
}

/**
 * The image set on a mid-grey mount, `pad` pixels wider on each side. A tightly cropped portrait
 * (a retoucher's final, a rendition) fills the detector's view edge to edge, and the face models
 * place the eyes less steadily than when the face has room around it, as in a camera frame.
 */
export function mountRgb(
  image: RgbImage,
  pad: { left: number; top: number; right: number; bottom: number },
): RgbImage {
  if (pad.left + pad.top + pad.right + pad.bottom === 0) return image;
  const width = image.width + pad.left + pad.right;
  const height = image.height + pad.top + pad.bottom;
  const data = Buffer.alloc(width * height * 3, 128);
  for (let row = 0; row < image.height; row += 1) {
    const from = row * image.width * 3;
    const to = ((row + pad.top) * width + pad.left) * 3;
    image.data.copy(data, to, from, from + image.width * 3);
  }
  return { data, width, height };
}
