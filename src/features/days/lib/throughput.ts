/**
 * How long a roster takes to photograph. Common practice (not a standard): a 5-minute slot
 * seats 12 people per station-hour in theory; plan on 8-10 an hour to leave room for
 * walk-ins, late arrivals and retakes. Other slot lengths scale the same figures.
 */
export interface ThroughputInput {
  headCount: number;
  stations: number;
  slotMinutes: number;
  hoursPerDay: number;
}

export interface ThroughputPlan {
  theoreticalPerStationHour: number;
  planningPerStationHour: { low: number; high: number };
  /** Hours of shooting needed: at the theoretical rate, and at the planning range. */
  theoreticalHours: number;
  planningHours: { fast: number; slow: number };
  /** Whole shoot days needed at the slow planning rate (the safe figure to book). */
  days: number;
}

export function planThroughput(input: ThroughputInput): ThroughputPlan | null {
  const { headCount, stations, slotMinutes, hoursPerDay } = input;
  if (![headCount, stations, slotMinutes, hoursPerDay].every(Number.isFinite)) return null;
  if (headCount < 0 || stations < 1 || slotMinutes <= 0 || hoursPerDay <= 0) return null;
  const theoretical = 60 / slotMinutes;
  const scale = 5 / slotMinutes;
  const planning = {
    low: Math.min(8 * scale, theoretical),
    high: Math.min(10 * scale, theoretical),
  };
  const hoursAt = (perStationHour: number) => headCount / (stations * perStationHour);
  const slow = hoursAt(planning.low);
  return {
    theoreticalPerStationHour: theoretical,
    planningPerStationHour: planning,
    theoreticalHours: hoursAt(theoretical),
    planningHours: { fast: hoursAt(planning.high), slow },
    days: headCount === 0 ? 0 : Math.ceil(slow / hoursPerDay - 1e-9),
  };
}
