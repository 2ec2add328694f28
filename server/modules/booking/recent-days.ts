/**
 * Days this process read lately, by id, for the claims that follow one another on the same day
 * (a booking burst after the invitations go out). Only a hint: every claim made on a remembered
 * day is checked by the database against the row's current version, so a copy that is out of
 * date costs one more read, never a wrong booking. Bounded in count and in age.
 */
export function createRecentDays<T extends { id: string }>(
  options: { maxDays?: number; maxAgeMs?: number; now?: () => number } = {},
) {
  const maxDays = options.maxDays ?? 200;
  const maxAgeMs = options.maxAgeMs ?? 60_000;
  const now = options.now ?? Date.now;
  const days = new Map<string, { day: T; readAt: number }>();
  return {
    get(id: string): T | undefined {
      const entry = days.get(id);
      if (!entry) return undefined;
      if (now() - entry.readAt > maxAgeMs) {
        days.delete(id);
        return undefined;
      }
      return entry.day;
    },
    remember(day: T) {
      days.delete(day.id);
      days.set(day.id, { day, readAt: now() });
      // A Map keeps insertion order: the first key is the one read longest ago.
      if (days.size > maxDays) days.delete(days.keys().next().value!);
    },
    forget(id: string) {
      days.delete(id);
    },
  };
}
