import { execFile } from 'node:child_process';
import { existsSync } from 'node:fs';
import { mkdir, readdir, readFile, rename, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import sharp from 'sharp';

/**
 * A real portrait for the face tests, taken from Debian's archive instead of the repository:
 * `astronaut.png` in python3-skimage's sample data, NASA's portrait of astronaut Eileen Collins
 * ("No known copyright restrictions, released into the public domain", says the docstring of
 * skimage.data.astronaut). The package is fetched with `apt-get download` once per machine,
 * unpacked with `dpkg-deb -x`, and only the 512 x 512 PNG is kept in the cache folder.
 */
const run = promisify(execFile);
const cacheFolder = path.join(os.tmpdir(), 'likeness-debian-portrait');
const cachedPortrait = path.join(cacheFolder, 'astronaut.png');
const PACKAGE = 'python3-skimage';
const WANTED = path.join('skimage', 'data', 'astronaut.png');

let pending: Promise<Buffer> | null = null;

export function debianPortrait(): Promise<Buffer> {
  pending ??= loadPortrait().catch((error: unknown) => {
    pending = null;
    throw error;
  });
  return pending;
}

async function loadPortrait(): Promise<Buffer> {
  if (existsSync(cachedPortrait)) return readFile(cachedPortrait);
  const work = path.join(cacheFolder, `work-${process.pid}-${Date.now()}`);
  await mkdir(work, { recursive: true });
  try {
    const deb = await downloadPackage(work);
    const tree = path.join(work, 'tree');
    await run('dpkg-deb', ['-x', deb, tree]);
    const found = await findFile(tree, WANTED);
    if (!found) throw new Error(`${PACKAGE} has no ${WANTED}`);
    const portrait = await readFile(found);
    // Written beside and renamed, so a parallel test file never reads half a PNG.
    const partial = `${cachedPortrait}.${process.pid}`;
    await writeFile(partial, portrait);
    await rename(partial, cachedPortrait);
    return portrait;
  } catch (error) {
    throw new Error(
      `Could not get the test portrait from Debian's ${PACKAGE} (apt-get download, dpkg-deb -x): ` +
        String(error instanceof Error ? error.message : error),
    );
  } finally {
    await rm(work, { recursive: true, force: true });
  }
}

/** `apt-get download` into `folder`; on a machine whose package lists are empty, updates first. */
async function downloadPackage(folder: string): Promise<string> {
  const download = () =>
    run('apt-get', ['download', '-q', PACKAGE], { cwd: folder, maxBuffer: 16 * 1024 * 1024 });
  try {
    await download();
  } catch {
    // Containers often ship without /var/lib/apt/lists; updating needs root, which tests have.
    await run('apt-get', ['update', '-q'], { maxBuffer: 16 * 1024 * 1024 });
    await download();
  }
  const deb = (await readdir(folder)).find((name) => name.endsWith('.deb'));
  if (!deb) throw new Error(`apt-get download left no .deb in ${folder}`);
  return path.join(folder, deb);
}

async function findFile(folder: string, tail: string): Promise<string | null> {
  for (const entry of await readdir(folder, { withFileTypes: true, recursive: true })) {
    const full = path.join(entry.parentPath, entry.name);
    if (entry.isFile() && full.endsWith(path.sep + tail)) return full;
  }
  return null;
}

export interface Placement {
  frameWidth: number;
  frameHeight: number;
  /** Where the (scaled, rotated) portrait's top-left corner goes in the frame. */
  left: number;
  top: number;
  scale: number;
  /** Degrees, clockwise on screen, as sharp's rotate. */
  rollDeg: number;
  /** Grain over the grey, for timings: a flat frame decodes unrealistically fast. */
  noise?: boolean;
}

export interface PlacedPortrait {
  /** The frame as a JPEG, the way a camera would deliver it. */
  frame: Buffer;
  /** A point of the portrait (pixels, from its top-left corner) in the frame. */
  toFrame(point: { x: number; y: number }): { x: number; y: number };
  /** A point of the frame back in the portrait's own pixels. */
  toPortrait(point: { x: number; y: number }): { x: number; y: number };
}

const GREY = { r: 128, g: 128, b: 128 };

/**
 * The portrait scaled, rotated about its centre and pasted into a grey frame at a known place,
 * with the exact map between the two: what a detector reports in the frame can be brought back
 * to the portrait's pixels and compared across placements.
 */
export async function placePortrait(
  portrait: Buffer,
  placement: Placement,
): Promise<PlacedPortrait> {
  const meta = await sharp(portrait).metadata();
  const width = Math.round(meta.width * placement.scale);
  const height = Math.round(meta.height * placement.scale);
  const sx = width / meta.width;
  const sy = height / meta.height;
  const scaled = await sharp(portrait).resize({ width, height, fit: 'fill' }).png().toBuffer();
  const rotated = await sharp(scaled)
    .rotate(placement.rollDeg, { background: GREY })
    .png()
    .toBuffer({ resolveWithObject: true });
  const { width: rotatedWidth, height: rotatedHeight } = rotated.info;
  const frame = await sharp({
    create: {
      width: placement.frameWidth,
      height: placement.frameHeight,
      channels: 3,
      background: GREY,
      ...(placement.noise && { noise: { type: 'gaussian', mean: 128, sigma: 24 } }),
    },
  })
    .composite([{ input: rotated.data, left: placement.left, top: placement.top }])
    .jpeg({ quality: 90 })
    .toBuffer();
  const angle = (placement.rollDeg * Math.PI) / 180;
  const [cos, sin] = [Math.cos(angle), Math.sin(angle)];
  const centre = { x: width / 2, y: height / 2 };
  const placedCentre = {
    x: placement.left + rotatedWidth / 2,
    y: placement.top + rotatedHeight / 2,
  };
  return {
    frame,
    toFrame({ x, y }) {
      const dx = x * sx - centre.x;
      const dy = y * sy - centre.y;
      return { x: placedCentre.x + cos * dx - sin * dy, y: placedCentre.y + sin * dx + cos * dy };
    },
    toPortrait({ x, y }) {
      const dx = x - placedCentre.x;
      const dy = y - placedCentre.y;
      return {
        x: (centre.x + cos * dx + sin * dy) / sx,
        y: (centre.y - sin * dx + cos * dy) / sy,
      };
    },
  };
}
