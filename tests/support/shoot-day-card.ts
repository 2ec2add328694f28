import { newPassToken } from '../../server/modules/booking/pass';
import { cameraJpeg, dcfName, nextDcf, type FrameSpec } from './camera-cards';

/**
 * One station's card for a short generated day, for the server and browser tests of matching:
 * sittings five minutes apart (common practice for staff headshots), each opening with a slate
 * unless told otherwise, a test frame before the first, a stray frame long after the last,
 * the file numbers rolling over 9999 → 0001 into the next DCF folder (JEITA CP-3461), and a
 * camera clock that is off by `clockOffsetMs` from the server's.
 */
export interface CardPlan {
  sittings: Array<{
    index: number;
    slateToken: string;
    startedAt: Date;
    finishedAt: Date;
    firstFrame: number;
    lastFrame: number;
  }>;
  files: Array<{ cardPath: string; spec: FrameSpec; sitting: number | null; slate: boolean }>;
}

export function planCard(options: {
  firstSittingAt: Date;
  sittings: number;
  framesPerSitting: number;
  clockOffsetMs: number;
  firstNumber: number;
  withoutSlate?: number[];
  /** One more frame of this sitting, shot just after it was finished on the console. */
  lateFrameIn?: number;
  serial?: string;
  /** Pixel size of every frame; small by default, which keeps the tests quick. */
  frame?: { width: number; height: number };
}): CardPlan {
  const serial = options.serial ?? 'CV-40117';
  let position = { folder: 100, number: options.firstNumber };
  const files: CardPlan['files'] = [];
  const sittings: CardPlan['sittings'] = [];
  const shot = (at: number, sitting: number | null, slateToken?: string) => {
    const camera = new Date(at + options.clockOffsetMs).toISOString();
    files.push({
      cardPath: dcfName(position.folder, position.number),
      spec: {
        width: options.frame?.width ?? 640,
        height: options.frame?.height ?? 480,
        dateTimeOriginal: camera.slice(0, 19).replace('T', ' ').replace(/-/g, ':'),
        subSecTimeOriginal: camera.slice(20, 23),
        serial,
        slateToken,
        shade: 60 + ((files.length * 37) % 150),
      },
      sitting,
      slate: slateToken !== undefined,
    });
    position = nextDcf(position);
  };
  const start = options.firstSittingAt.getTime();
  shot(start - 6 * 60_000, null); // a test frame while setting up the lights
  for (let index = 0; index < options.sittings; index += 1) {
    const startedAt = start + index * 5 * 60_000;
    const firstFrame = position.number;
    const slateToken = newPassToken();
    const slated = !(options.withoutSlate ?? []).includes(index);
    if (slated) shot(startedAt + 15_000, index, slateToken);
    for (let frame = 0; frame < options.framesPerSitting; frame += 1) {
      shot(startedAt + 30_000 + frame * 20_000, index);
    }
    if (options.lateFrameIn === index) shot(startedAt + 4 * 60_000 + 20_000, index);
    sittings.push({
      index,
      slateToken,
      startedAt: new Date(startedAt),
      finishedAt: new Date(startedAt + 4 * 60_000),
      firstFrame,
      lastFrame: files[files.length - 1]!.cardPath.endsWith('.JPG')
        ? Number(files[files.length - 1]!.cardPath.slice(-8, -4))
        : firstFrame,
    });
  }
  shot(start + options.sittings * 5 * 60_000 + 40 * 60_000, null); // long after the last
  return { sittings, files };
}

export const cardFileBytes = (file: CardPlan['files'][number]) => cameraJpeg(file.spec);
