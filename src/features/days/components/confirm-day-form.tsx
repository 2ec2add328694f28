import { useState, type FormEvent } from 'react';
import type { Day } from '../../../../server/schemas/days';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { useTeam } from '../../team/api/list-team';
import { useConfirmDay } from '../api/confirm-day';

/** The studio staffs a coordinator's proposed day and confirms it. */
export function ConfirmDayForm({ day }: { day: Day }) {
  const team = useTeam();
  const confirm = useConfirmDay();
  const [choice, setChoice] = useState<Record<string, string>>(
    Object.fromEntries(day.stations.map((station) => [station.id, station.photographerId ?? ''])),
  );
  const [error, setError] = useState<string | null>(null);
  const photographers = (team.data?.users ?? []).filter(
    (user) => user.role === 'photographer' && user.active,
  );

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (day.stations.some((station) => !choice[station.id])) {
      setError('Assign a photographer to every station.');
      return;
    }
    setError(null);
    confirm.mutate({
      dayId: day.id,
      stations: day.stations.map((station) => ({
        id: station.id,
        photographerId: choice[station.id] ?? '',
      })),
    });
  };

  return (
    <form onSubmit={submit} noValidate aria-label="Confirm the day" className="flex flex-col gap-3">
      <p>The coordinator proposed this day. Assign photographers to confirm it.</p>
      {error ? <Notice tone="danger">{error}</Notice> : null}
      {confirm.isError ? <Notice tone="danger">{confirm.error.message}</Notice> : null}
      {day.stations.map((station) => (
        <SelectField
          key={station.id}
          label={`${station.name} photographer`}
          value={choice[station.id] ?? ''}
          onChange={(value) => setChoice((current) => ({ ...current, [station.id]: value }))}
          options={[
            { value: '', label: 'Pick a photographer' },
            ...photographers.map((user) => ({ value: user.id, label: user.displayName })),
          ]}
        />
      ))}
      <Button type="submit" busy={confirm.isPending}>
        Confirm the day
      </Button>
    </form>
  );
}
