import { planThroughput } from '../lib/throughput';

const oneDecimal = (value: number) => value.toLocaleString('en-GB', { maximumFractionDigits: 1 });
const hours = (value: number) => `${oneDecimal(value)} h`;

/** Live estimate beside the day form; the figures are trade rules of thumb, and it says so. */
export function ThroughputPlanner(props: {
  headCount: number;
  stations: number;
  slotMinutes: number;
  hoursPerDay: number;
}) {
  const plan = planThroughput(props);
  return (
    <section aria-labelledby="planner-heading" className="flex flex-col gap-2" aria-live="polite">
      <h3 id="planner-heading" className="font-semibold">
        Throughput planner
      </h3>
      {!plan ? (
        <p className="text-sm text-ink-muted">Enter the head count, stations and slot length.</p>
      ) : (
        <>
          <p>
            {props.headCount.toLocaleString('en-GB')} people at {props.stations} station
            {props.stations === 1 ? '' : 's'} need about{' '}
            <strong>
              {hours(plan.planningHours.fast)}–{hours(plan.planningHours.slow)}
            </strong>{' '}
            of shooting: <strong>{plan.days}</strong> day{plan.days === 1 ? '' : 's'} of{' '}
            {hours(props.hoursPerDay)}.
          </p>
          <p className="text-sm text-ink-muted">
            In theory a {props.slotMinutes}-minute slot seats{' '}
            {oneDecimal(plan.theoreticalPerStationHour)} an hour per station (
            {hours(plan.theoreticalHours)} in all); plan on{' '}
            {oneDecimal(plan.planningPerStationHour.low)}–
            {oneDecimal(plan.planningPerStationHour.high)} to leave room for walk-ins and retakes.
            These are common practice, not a rule.
          </p>
        </>
      )}
    </section>
  );
}
