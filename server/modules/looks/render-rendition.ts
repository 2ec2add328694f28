import sharp from 'sharp';
import type { Rendition } from '../../schemas/looks';
import { levelledFrame, type CropPlan } from './crop-geometry';

export interface RenditionMetadata {
  /** Written as Exif Copyright (IFD0 0x8298) when the rendition keeps it. */
  copyright?: string;
  /** The studio's credit, written as Exif Artist (IFD0 0x013B) when the rendition keeps it. */
  credit?: string;
}

export interface RenderRequest {
  /** The original file, as delivered by the camera (any orientation). */
  input: string | Buffer;
  /** From planCrop for this file; its eye positions were measured in the upright image. */
  plan: CropPlan;
  rendition: Rendition;
  metadata: RenditionMetadata;
  /** sharp's decoding limit; the frames module passes its own. */
  maxPixels?: number;
}

export class RenditionError extends Error {
  override name = 'RenditionError';
}

function hexToRgb(hex: string) {
  const value = Number.parseInt(hex.slice(1), 16);
  return { r: (value >> 16) & 255, g: (value >> 8) & 255, b: value & 255 };
}

/**
 * Renders one rendition from the original: upright by its EXIF orientation first (the plan's
 * eye positions are in the upright image), levelled, cropped, resized with lanczos3, sRGB,
 * JPEG, with only the metadata the rendition keeps.
 *
 * Two passes, because sharp applies extend after resize: the first turns and extracts the crop
 * in source pixels, padding any part past the picture with the fill colour, and hands it on as
 * raw sRGB pixels (the size of the crop, not the frame); the second resizes and encodes.
 */
export async function renderRendition(request: RenderRequest): Promise<Buffer> {
  const { input, plan, rendition, metadata } = request;
  const limitInputPixels = request.maxPixels ?? 268_402_689;
  const { overflow } = plan;
  if (
    rendition.overflow === 'refuse' &&
    overflow.left + overflow.top + overflow.right + overflow.bottom > 0
  ) {
    throw new RenditionError(`${rendition.name} refuses a crop that reaches past the photo.`);
  }

  const info = await sharp(input, { limitInputPixels }).metadata();
  const turned = (info.orientation ?? 1) >= 5;
  const uprightWidth = turned ? info.height : info.width;
  const uprightHeight = turned ? info.width : info.height;
  if (uprightWidth !== plan.imageWidth || uprightHeight !== plan.imageHeight) {
    throw new RenditionError(
      `The plan is for a ${plan.imageWidth} x ${plan.imageHeight} photo, but this one is ` +
        `${uprightWidth} x ${uprightHeight} upright; plan with the upright eye positions.`,
    );
  }

  const fill = hexToRgb(rendition.fillColour);
  const canvas = levelledFrame(plan.imageWidth, plan.imageHeight, plan.rotationDeg);
  const { crop } = plan;
  // The part of the crop on the rotated canvas is extracted; the rest is fill. Inside the
  // canvas but outside the picture, rotate() has already painted the fill colour.
  const left = Math.max(crop.left, 0);
  const top = Math.max(crop.top, 0);
  const right = Math.min(crop.left + crop.width, canvas.width);
  const bottom = Math.min(crop.top + crop.height, canvas.height);

  let levelled = sharp(input, { limitInputPixels }).autoOrient().flatten({ background: fill });
  if (plan.rotationDeg !== 0) levelled = levelled.rotate(plan.rotationDeg, { background: fill });
  const cropped = await levelled
    .extract({ left, top, width: right - left, height: bottom - top })
    .extend({
      left: left - crop.left,
      top: top - crop.top,
      right: crop.left + crop.width - right,
      bottom: crop.top + crop.height - bottom,
      background: fill,
    })
    // 16-bit originals are worked in a wider space by sharp; withIccProfile brings them to sRGB.
    .toColourspace('srgb')
    .withIccProfile('srgb', { attach: false })
    .raw({ depth: 'uchar' })
    .toBuffer({ resolveWithObject: true });

  const exif: Record<string, string> = {};
  if (rendition.keepMetadata.copyright && metadata.copyright) exif.Copyright = metadata.copyright;
  if (rendition.keepMetadata.credit && metadata.credit) exif.Artist = metadata.credit;

  let output = sharp(cropped.data, {
    raw: {
      width: cropped.info.width,
      height: cropped.info.height,
      channels: cropped.info.channels,
    },
  })
    .resize({
      width: plan.outputWidth,
      height: plan.outputHeight,
      fit: 'fill',
      kernel: 'lanczos3',
    })
    .toColourspace('srgb')
    .withIccProfile('srgb');
  // The raw pixels carry no metadata, so nothing of the original's (GPS, serials, maker notes)
  // can leak; only these two IFD0 tags are written.
  if (Object.keys(exif).length > 0) output = output.withExif({ IFD0: exif });
  return output
    .jpeg({
      quality: rendition.jpegQuality,
      chromaSubsampling: rendition.jpegQuality >= 90 ? '4:4:4' : '4:2:0',
    })
    .toBuffer();
}
