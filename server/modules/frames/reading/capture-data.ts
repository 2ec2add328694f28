import exifr from 'exifr';
import { controlCharacterPattern } from '../../../schemas/common';

export interface CaptureData {
  /** 'YYYY-MM-DDTHH:MM:SS' plus '.fff' when the camera wrote sub-seconds; the camera's own clock. */
  capturedLocal: string | null;
  /** '+HH:MM' / '-HH:MM' from OffsetTimeOriginal (Exif 2.31), null when the camera wrote none. */
  offset: string | null;
  cameraSerial: string | null;
  make: string | null;
  model: string | null;
  orientation: number | null;
  pixelWidth: number | null;
  pixelHeight: number | null;
}

const empty: CaptureData = {
  capturedLocal: null,
  offset: null,
  cameraSerial: null,
  make: null,
  model: null,
  orientation: null,
  pixelWidth: null,
  pixelHeight: null,
};

// Exif writes DateTimeOriginal as 'YYYY:MM:DD HH:MM:SS' (CIPA DC-008), 24-hour, without a zone.
const exifDateTime = /^(\d{4}):(\d{2}):(\d{2}) (\d{2}):(\d{2}):(\d{2})$/;

/**
 * Reads capture data from the first bytes of a file. Values stay raw (`reviveValues: false`):
 * a revived date would be placed in this server's time zone, and the camera's clock has none.
 */
export async function readCaptureData(head: Buffer): Promise<CaptureData> {
  let tags: Record<string, unknown> | undefined;
  try {
    tags = (await exifr.parse(head, {
      tiff: true,
      exif: true,
      gps: false,
      interop: false,
      ifd1: false,
      xmp: false,
      icc: false,
      iptc: false,
      reviveValues: false,
      translateValues: false,
      translateKeys: true,
    })) as Record<string, unknown> | undefined;
  } catch {
    return empty;
  }
  if (!tags) return empty;
  return {
    capturedLocal: localTime(text(tags.DateTimeOriginal), text(tags.SubSecTimeOriginal)),
    offset: offsetOf(text(tags.OffsetTimeOriginal)),
    // exifr names tag 0xA431 (BodySerialNumber in Exif) "SerialNumber".
    cameraSerial: text(tags.SerialNumber) ?? text(tags.BodySerialNumber),
    make: text(tags.Make),
    model: text(tags.Model),
    orientation: wholeNumber(tags.Orientation, 1, 8),
    pixelWidth: wholeNumber(tags.ExifImageWidth ?? tags.ImageWidth, 1, 1_000_000),
    pixelHeight: wholeNumber(tags.ExifImageHeight ?? tags.ImageHeight, 1, 1_000_000),
  };
}

function localTime(dateTime: string | null, subSeconds: string | null): string | null {
  const match = dateTime ? exifDateTime.exec(dateTime) : null;
  if (!match) return null;
  const [, year, month, day, hour, minute, second] = match;
  const base = `${year}-${month}-${day}T${hour}:${minute}:${second}`;
  // SubSecTimeOriginal holds the digits of a decimal fraction: "13" is 0.13 s, "130" too.
  const digits = subSeconds && /^\d+$/.test(subSeconds) ? subSeconds : null;
  return digits ? `${base}.${digits.padEnd(3, '0').slice(0, 3)}` : base;
}

function offsetOf(value: string | null): string | null {
  return value && /^[+-]\d{2}:\d{2}$/.test(value) ? value : null;
}

const controlCharacters = new RegExp(controlCharacterPattern.source, 'g');

/** Camera strings are padded with NULs and spaces; keep at most 100 printable characters. */
function text(value: unknown): string | null {
  if (typeof value === 'number') return String(value);
  if (typeof value !== 'string') return null;
  const cleaned = value.replace(controlCharacters, '').trim().slice(0, 100);
  return cleaned.length > 0 ? cleaned : null;
}

function wholeNumber(value: unknown, min: number, max: number): number | null {
  return typeof value === 'number' && Number.isInteger(value) && value >= min && value <= max
    ? value
    : null;
}
