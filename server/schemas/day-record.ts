/**
 * The day sheet printed after the day: per station, what the console recorded for every
 * booking there and for everyone photographed there without one.
 */
export type RecordedOutcome =
  | 'photographed'
  | 'in_chair'
  | 'checked_in'
  | 'photographed_elsewhere'
  | 'no_show'
  | 'not_recorded';

export interface RecordedRow {
  key: string;
  /** The booked time, or the check-in time for someone without a booking here. */
  localTime: string;
  name: string;
  /** Null for a booking; how someone photographed here without a booking here came. */
  arrival: 'walk_in' | 'added_on_the_day' | 'booked_elsewhere' | null;
  outcome: RecordedOutcome;
  checkedInAt: string | null;
  /** The station where the sitting was, when it was not this one. */
  otherStationName: string | null;
  firstFrame: number | null;
  lastFrame: number | null;
  flashSensitive: boolean;
}

export interface RecordedDay {
  dayId: string;
  officeName: string;
  date: string;
  timeZone: string;
  stations: Array<{ id: string; name: string; rows: RecordedRow[] }>;
}
