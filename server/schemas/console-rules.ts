/**
 * Pure rules of the station console, shared by the server and the tablet (which applies them
 * to changes still waiting in its offline queue).
 */

/** DCF file numbers run 0001-9999; after 9999 the camera goes on at 0001 in the next folder
 * (JEITA CP-3461, DCF 2.0, as quoted in camera manuals). */
export const firstFrameNumber = 1;
export const lastFrameNumber = 9999;

export function frameAfter(frame: number): number {
  return frame >= lastFrameNumber ? firstFrameNumber : frame + 1;
}

/** How many frames a sitting spans, counting the wrap from 9999 back to 0001. */
export function framesInSitting(firstFrame: number, lastFrame: number): number {
  return lastFrame >= firstFrame
    ? lastFrame - firstFrame + 1
    : lastFrameNumber - firstFrame + 1 + (lastFrame - firstFrameNumber + 1);
}

/**
 * A sitting yields about 10-25 frames (common practice); anything past this many is a mistyped
 * counter, most often a last frame below the first that is not a wrap past 9999.
 */
export const mostFramesInSitting = 500;

/** Four digits, as the camera shows them. */
export function formatFrame(frame: number): string {
  return String(frame).padStart(4, '0');
}

/** Why a sitting's last frame cannot follow its first, or null when it can (or is unknown). */
export function implausibleFrames(firstFrame: number, lastFrame: number | null): string | null {
  if (lastFrame === null || framesInSitting(firstFrame, lastFrame) <= mostFramesInSitting) {
    return null;
  }
  return `The last frame ${formatFrame(lastFrame)} does not follow the first, ${formatFrame(firstFrame)}: check the camera's frame counter.`;
}

/**
 * The frame number the camera should show next on a station: one after the last frame of its
 * latest sitting. When the latest sitting ended without a last frame we cannot know how many
 * frames were taken, so there is no guess (null) rather than a wrong one.
 */
export function expectedNextFrame(
  sittings: ReadonlyArray<{ startedAt: string; firstFrame: number; lastFrame: number | null }>,
): number | null {
  let latest: (typeof sittings)[number] | undefined;
  for (const sitting of sittings) {
    if (!latest || sitting.startedAt > latest.startedAt) latest = sitting;
  }
  if (!latest) return null;
  return latest.lastFrame === null ? null : frameAfter(latest.lastFrame);
}

/** A booked sitter may be marked no-show once the grace period after their start has passed. */
export function noShowAllowedFrom(startsAt: string | Date, graceMinutes: number): Date {
  return new Date(new Date(startsAt).getTime() + graceMinutes * 60_000);
}

export function mayMarkNoShow(startsAt: string | Date, graceMinutes: number, now: Date): boolean {
  return now.getTime() >= noShowAllowedFrom(startsAt, graceMinutes).getTime();
}

const statusOrder = { in_chair: 0, arrived: 1, booked: 2, done: 3, no_show: 4, cancelled: 5 };

/**
 * Queue order: booked time first (walk-ins take their check-in time), so the list reads like
 * the day's timetable; equal times keep the sitter who is further along first.
 */
export function compareQueueEntries(
  a: {
    startsAt: string | null;
    checkIn: { at: string } | null;
    status: keyof typeof statusOrder;
    name: string;
  },
  b: {
    startsAt: string | null;
    checkIn: { at: string } | null;
    status: keyof typeof statusOrder;
    name: string;
  },
): number {
  const timeA = new Date(a.startsAt ?? a.checkIn?.at ?? 0).getTime();
  const timeB = new Date(b.startsAt ?? b.checkIn?.at ?? 0).getTime();
  if (timeA !== timeB) return timeA - timeB;
  if (statusOrder[a.status] !== statusOrder[b.status]) {
    return statusOrder[a.status] - statusOrder[b.status];
  }
  return a.name.localeCompare(b.name);
}
