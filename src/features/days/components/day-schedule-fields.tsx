import { slotMinuteChoices } from '../../../../server/schemas/days';
import { SelectField, TextField } from '../../../components/ui/field';

/** The fields of a day's date, place, hours and booking window: shared by creating and changing. */
export interface DayScheduleValues {
  date: string;
  address: string;
  room: string;
  opensAt: string;
  closesAt: string;
  breakStart: string;
  breakEnd: string;
  slotMinutes: string;
  bookingOpensAt: string;
  bookingClosesAt: string;
  changesCloseAt: string;
}

/**
 * The grid's fields (without the grid, so a form can add its own after them). Every date-time is
 * in the office's zone, named in its label, whatever the browser's zone.
 */
export function DayScheduleFields({
  fields,
  set,
  errors,
  zone,
  zoneHint,
}: {
  fields: DayScheduleValues;
  set: (key: keyof DayScheduleValues) => (value: string) => void;
  errors: Record<string, string | undefined>;
  zone: string;
  zoneHint?: string;
}) {
  const instant = (label: string, key: 'bookingOpensAt' | 'bookingClosesAt' | 'changesCloseAt') => (
    <TextField
      label={`${label} (${zone})`}
      type="datetime-local"
      hint={zoneHint}
      value={fields[key]}
      onChange={set(key)}
      error={errors[key]}
    />
  );
  return (
    <>
      <TextField
        label="Date"
        type="date"
        value={fields.date}
        onChange={set('date')}
        error={errors.date}
      />
      <SelectField
        label="Slot length (minutes)"
        value={fields.slotMinutes}
        onChange={set('slotMinutes')}
        error={errors.slotMinutes}
        options={slotMinuteChoices.map((choice) => ({
          value: String(choice),
          label: `${choice} minutes`,
        }))}
      />
      <TextField
        label="Address"
        value={fields.address}
        onChange={set('address')}
        error={errors.address}
        autoComplete="street-address"
      />
      <TextField label="Room" value={fields.room} onChange={set('room')} error={errors.room} />
      <TextField
        label="Opens"
        type="time"
        value={fields.opensAt}
        onChange={set('opensAt')}
        error={errors.opensAt}
      />
      <TextField
        label="Closes"
        type="time"
        value={fields.closesAt}
        onChange={set('closesAt')}
        error={errors.closesAt}
      />
      <TextField
        label="Break starts"
        type="time"
        value={fields.breakStart}
        onChange={set('breakStart')}
        hint="Clear both to have no break."
      />
      <TextField
        label="Break ends"
        type="time"
        value={fields.breakEnd}
        onChange={set('breakEnd')}
        error={errors.breakEnd}
      />
      {instant('Booking opens', 'bookingOpensAt')}
      {instant('Booking closes', 'bookingClosesAt')}
      {instant('Sitters can change until', 'changesCloseAt')}
    </>
  );
}
