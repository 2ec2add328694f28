import type { ProgressCounts, ProgressGroup } from '../../schemas/days';

/** One person's furthest step on a day, as the console recorded it. */
export interface PersonOnDay {
  id: string;
  officeName: string | null;
  department: string | null;
  invited: boolean;
  /** Holds an active booking that the console did not mark as a no-show. */
  booked: boolean;
  checkedIn: boolean;
  photographed: boolean;
  noShow: boolean;
}

export const emptyCounts = (): ProgressCounts => ({
  invited: 0,
  booked: 0,
  checkedIn: 0,
  photographed: 0,
  noShow: 0,
});

export function addPerson(counts: ProgressCounts, person: PersonOnDay) {
  if (person.invited) counts.invited += 1;
  if (person.booked) counts.booked += 1;
  if (person.checkedIn) counts.checkedIn += 1;
  if (person.photographed) counts.photographed += 1;
  if (person.noShow) counts.noShow += 1;
}

export function addCounts(total: ProgressCounts, more: ProgressCounts) {
  total.invited += more.invited;
  total.booked += more.booked;
  total.checkedIn += more.checkedIn;
  total.photographed += more.photographed;
  total.noShow += more.noShow;
}

/**
 * Counts per group (office or department). Walk-ins who were not invited still count where
 * they were checked in and photographed, so the day's totals match what the stations did.
 */
export function groupPeople(
  people: readonly PersonOnDay[],
  key: (person: PersonOnDay) => string,
): ProgressGroup[] {
  const groups = new Map<string, ProgressGroup>();
  for (const person of people) {
    const label = key(person);
    const group = groups.get(label) ?? { label, ...emptyCounts() };
    addPerson(group, person);
    groups.set(label, group);
  }
  return [...groups.values()].sort((a, b) => a.label.localeCompare(b.label));
}

/** Adds each day's groups into the client's totals, label by label. */
export function mergeGroups(totals: ProgressGroup[], groups: readonly ProgressGroup[]) {
  for (const group of groups) {
    const total = totals.find((candidate) => candidate.label === group.label);
    if (total) addCounts(total, group);
    else totals.push({ ...group });
  }
}
