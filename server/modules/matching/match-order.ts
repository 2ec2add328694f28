import type { MatchFrame } from './match-frames';

/**
 * Each camera's frames by index, cameras in the order they first appear. Frames come in long
 * runs from one camera, so the key is only rebuilt and looked up when the camera changes.
 */
export function framesByCamera(frames: MatchFrame[]): Map<string, number[]> {
  const cameras = new Map<string, number[]>();
  let serial: string | null | undefined = undefined;
  let stationId: string | undefined = undefined;
  let camera: number[] = [];
  for (let index = 0; index < frames.length; index += 1) {
    const frame = frames[index]!;
    // Same as cameraKey(frame): the serial, or the station when the camera has none.
    const unnamed = serial === null || serial === undefined;
    if (frame.cameraSerial !== serial || (unnamed && frame.stationId !== stationId)) {
      serial = frame.cameraSerial;
      stationId = frame.stationId;
      const key = serial ?? `station:${stationId}`;
      const known = cameras.get(key);
      if (known) camera = known;
      else cameras.set(key, (camera = []));
    }
    camera.push(index);
  }
  return cameras;
}

/**
 * A camera's frames in shooting order: by capture time (frames without one last), then DCF
 * folder and number, ties kept in input order. Cards are mostly read in that order already, so
 * a check comes first; only out-of-order frames are sorted, by keys read out once.
 */
export function shootingOrder(frames: MatchFrame[], camera: number[]): number[] {
  let sorted = true;
  for (let position = 1; position < camera.length && sorted; position += 1) {
    const a = frames[camera[position - 1]!]!;
    const b = frames[camera[position]!]!;
    // As the sort compares them, so `sorted` holds exactly when the sort would change nothing.
    const order =
      (a.capturedAt ?? Infinity) - (b.capturedAt ?? Infinity) ||
      (a.folder ?? 0) - (b.folder ?? 0) ||
      (a.number ?? 0) - (b.number ?? 0);
    sorted = !(order > 0);
  }
  if (sorted) return camera;
  const captured = new Float64Array(camera.length);
  const folders = new Float64Array(camera.length);
  const numbers = new Float64Array(camera.length);
  camera.forEach((index, position) => {
    const frame = frames[index]!;
    captured[position] = frame.capturedAt ?? Infinity;
    folders[position] = frame.folder ?? 0;
    numbers[position] = frame.number ?? 0;
  });
  const positions = camera.map((_, position) => position);
  // Array sort is stable, so frames the keys cannot tell apart keep their input order.
  positions.sort(
    (a, b) => captured[a]! - captured[b]! || folders[a]! - folders[b]! || numbers[a]! - numbers[b]!,
  );
  return positions.map((position) => camera[position]!);
}
