import type { SlotWithSeats } from '../../../../server/schemas/days';
import { Notice } from '../../../components/ui/notice';
import { useSlots } from '../api/list-slots';

/**
 * Open slots as a group of radio buttons, in the day's own local time with the zone named.
 * A full slot stays visible but cannot be picked, so the day's shape is clear.
 */
export function SlotPicker({
  dayId,
  value,
  onChange,
  error,
  currentStartsAt,
}: {
  dayId: string;
  value: string;
  onChange: (startsAt: string) => void;
  error?: string | undefined;
  currentStartsAt?: string;
}) {
  const slots = useSlots(dayId);
  if (slots.isPending) return <p role="status">Loading the free times…</p>;
  if (slots.isError) return <Notice tone="danger">{slots.error.message}</Notice>;
  const { timeZone } = slots.data;
  const list = slots.data.slots;
  const anyFree = list.some((slot) => slot.free > 0);
  const offsets = new Set(list.map((slot) => slot.offset));
  const label = (slot: SlotWithSeats) =>
    offsets.size > 1 ? `${slot.localTime} ${slot.offset.replace('UTC', '')}` : slot.localTime;

  return (
    <fieldset
      className="flex flex-col gap-2"
      aria-describedby={error ? `${dayId}-slot-error` : undefined}
    >
      <legend className="mb-1 text-sm font-medium">
        Pick a time ({timeZone} time{offsets.size === 1 ? `, ${[...offsets][0]}` : ''})
      </legend>
      {!anyFree ? (
        <Notice tone="caution">
          Every slot is taken. Ask your coordinator: the studio may add a station or a day.
        </Notice>
      ) : null}
      <div className="grid grid-cols-3 gap-2 sm:grid-cols-5">
        {list.map((slot) => {
          const mine = slot.startsAt === currentStartsAt;
          const full = slot.free === 0 && !mine;
          return (
            <label
              key={slot.startsAt}
              className={`flex min-h-touch cursor-pointer items-center justify-center rounded-control border text-base has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-spruce-600 ${
                value === slot.startsAt
                  ? 'border-spruce-600 bg-spruce-600 text-paper-raised'
                  : full
                    ? 'cursor-not-allowed border-line bg-paper-sunk text-ink-muted line-through'
                    : 'border-line-strong bg-paper-raised text-ink'
              }`}
            >
              <input
                type="radio"
                name={`slot-${dayId}`}
                value={slot.startsAt}
                checked={value === slot.startsAt}
                disabled={full}
                onChange={() => onChange(slot.startsAt)}
                className="sr-only"
              />
              {label(slot)}
              <span className="sr-only">{full ? ' (full)' : mine ? ' (your time now)' : ''}</span>
            </label>
          );
        })}
      </div>
      {error ? (
        <p id={`${dayId}-slot-error`} role="alert" className="text-sm font-medium text-danger-600">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}
