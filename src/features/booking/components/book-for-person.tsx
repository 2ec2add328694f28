import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { useProgress } from '../../progress/api/get-progress';
import { useCreateBooking } from '../api/create-booking';
import { useSlots } from '../api/list-slots';
import { SlotPicker } from './slot-picker';

/** A coordinator (or the studio) books a slot on someone's behalf, e.g. for a colleague on leave. */
export function BookForPerson({ dayId }: { dayId: string }) {
  const progress = useProgress(dayId);
  const create = useCreateBooking();
  const [personId, setPersonId] = useState('');
  const [startsAt, setStartsAt] = useState('');
  const [stationId, setStationId] = useState('');
  const slots = useSlots(dayId);
  const chosenSlot = slots.data?.slots.find((slot) => slot.startsAt === startsAt);
  // The stations free at the chosen time; before a time is chosen, every station.
  const stationChoices = (slots.data?.stations ?? []).filter(
    (station) => !chosenSlot?.freeStationIds || chosenSlot.freeStationIds.includes(station.id),
  );
  const [error, setError] = useState<string | null>(null);
  const people = progress.data?.unbookedPeople ?? [];
  if (progress.isSuccess && people.length === 0) {
    return <p className="text-ink-muted">Everyone invited has a slot: nothing to book here.</p>;
  }

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (!personId || !startsAt) {
      setError('Pick the person and a time.');
      return;
    }
    setError(null);
    create.mutate(
      { dayId, personId, startsAt, ...(stationId ? { stationId } : {}) },
      {
        onSuccess: () => {
          setPersonId('');
          setStartsAt('');
          setStationId('');
        },
        onError: (failure) => setError(failure.message),
      },
    );
  };

  return (
    <form
      onSubmit={submit}
      noValidate
      aria-label="Book for someone"
      className="flex flex-col gap-4"
    >
      {error ? <Notice tone="danger">{error}</Notice> : null}
      {create.isSuccess && !error ? (
        <Notice tone="success">
          Booked {create.data.personName} at {create.data.localTime} ({create.data.stationName}).
          They get the confirmation by e-mail.
        </Notice>
      ) : null}
      <SelectField
        label="Person"
        value={personId}
        onChange={setPersonId}
        options={[
          { value: '', label: 'Pick someone not yet booked' },
          ...people.map((person) => ({
            value: person.id,
            label: `${person.name} · ${person.email}`,
          })),
        ]}
      />
      <SlotPicker
        dayId={dayId}
        value={startsAt}
        onChange={(next) => {
          setStartsAt(next);
          setStationId('');
        }}
      />
      {(slots.data?.stations.length ?? 0) > 1 ? (
        <SelectField
          label="Station"
          value={stationId}
          onChange={setStationId}
          options={[
            { value: '', label: 'Any free station' },
            ...stationChoices.map((station) => ({ value: station.id, label: station.name })),
          ]}
        />
      ) : null}
      <Button type="submit" busy={create.isPending}>
        Book for them
      </Button>
    </form>
  );
}
