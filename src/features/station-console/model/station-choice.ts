/** The day and station this tablet runs: chosen once, remembered on the tablet. */
const key = 'likeness.console.station';

export interface StationChoice {
  dayId: string;
  stationId: string;
}

export function loadStationChoice(): StationChoice | null {
  try {
    const parsed: unknown = JSON.parse(localStorage.getItem(key) ?? 'null');
    if (
      parsed &&
      typeof parsed === 'object' &&
      'dayId' in parsed &&
      'stationId' in parsed &&
      typeof parsed.dayId === 'string' &&
      typeof parsed.stationId === 'string'
    ) {
      return { dayId: parsed.dayId, stationId: parsed.stationId };
    }
  } catch {
    // A damaged entry is the same as no choice.
  }
  return null;
}

export function saveStationChoice(choice: StationChoice) {
  localStorage.setItem(key, JSON.stringify(choice));
}

export function forgetStationChoice() {
  localStorage.removeItem(key);
}
