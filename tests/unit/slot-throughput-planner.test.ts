import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { planThroughput } from '../../src/features/days/lib/throughput';
import { generateSlots } from '../../server/modules/days/slots';

// Figures are common practice (tests/reference/SOURCES.md, "common practice"): 12 per station-hour at
// 5 minutes in theory, 8-10 for planning.
describe('throughput planner', () => {
  it('uses 12 per station-hour in theory and 8-10 for planning at 5-minute slots', () => {
    const plan = planThroughput({ headCount: 240, stations: 2, slotMinutes: 5, hoursPerDay: 7 })!;
    expect(plan.theoreticalPerStationHour).toBe(12);
    expect(plan.planningPerStationHour).toEqual({ low: 8, high: 10 });
    expect(plan.theoreticalHours).toBe(10);
    expect(plan.planningHours).toEqual({ fast: 12, slow: 15 });
    expect(plan.days).toBe(3); // 15 h at 7 h a day
  });

  it('agrees with slot generation: theoretical hours seat exactly the head count', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 6 }),
        fc.integer({ min: 1, max: 8 }),
        (stations, hours) => {
          const slots = generateSlots({
            date: '2027-03-04',
            timeZone: 'Europe/London',
            opensAt: '09:00',
            closesAt: `${String(9 + hours).padStart(2, '0')}:00`,
            breaks: [],
            slotMinutes: 5,
          });
          const seats = slots.length * stations;
          const plan = planThroughput({
            headCount: seats,
            stations,
            slotMinutes: 5,
            hoursPerDay: 8,
          })!;
          expect(plan.theoreticalHours).toBeCloseTo(hours, 9);
        },
      ),
    );
  });

  it('scales with the slot length and never plans faster than theory', () => {
    const plan = planThroughput({ headCount: 100, stations: 1, slotMinutes: 10, hoursPerDay: 8 })!;
    expect(plan.theoreticalPerStationHour).toBe(6);
    expect(plan.planningPerStationHour).toEqual({ low: 4, high: 5 });
    const tight = planThroughput({ headCount: 10, stations: 1, slotMinutes: 7, hoursPerDay: 8 })!;
    expect(tight.planningPerStationHour.high).toBeLessThanOrEqual(tight.theoreticalPerStationHour);
  });

  it('refuses nonsense instead of dividing by zero', () => {
    expect(
      planThroughput({ headCount: 10, stations: 0, slotMinutes: 5, hoursPerDay: 8 }),
    ).toBeNull();
    expect(
      planThroughput({ headCount: 10, stations: 1, slotMinutes: 0, hoursPerDay: 8 }),
    ).toBeNull();
    expect(
      planThroughput({ headCount: 0, stations: 1, slotMinutes: 5, hoursPerDay: 8 })?.days,
    ).toBe(0);
  });
});
