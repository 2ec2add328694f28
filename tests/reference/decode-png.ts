import jsQR from 'jsqr';
import { PNG } from 'pngjs';

/** Decodes a QR code in a PNG with independent libraries: pngjs for pixels, jsqr for the symbol. */
export function decodePng(png: Buffer) {
  const image = PNG.sync.read(png);
  const code = jsQR(new Uint8ClampedArray(image.data), image.width, image.height);
  return { code, image };
}
