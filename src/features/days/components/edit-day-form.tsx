import { useState, type FormEvent } from 'react';
import {
  dayChangesSchema,
  type DayChanges,
  type DayChangesRequest,
} from '../../../../server/schemas/day-changes';
import type { Day } from '../../../../server/schemas/days';
import { instantToOfficeLocal, officeLocalToInstant } from '../../../../server/schemas/office-time';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { useEditDay } from '../api/edit-day';
import { usePreviewDayChanges } from '../api/preview-day-changes';
import { useProposeDayChange } from '../api/propose-day-change';
import { DayChangePreviewList } from './day-change-preview';
import { DayScheduleFields } from './day-schedule-fields';
import { StationFields, type StationDraft } from './station-fields';

type Errors = Record<string, string | undefined>;

/** The day as the form starts: as it is now, or as a coordinator proposed it. */
function startingFields(day: Day, changes: DayChanges | undefined) {
  const source = changes ?? day;
  const local = (instant: string) => instantToOfficeLocal(instant, day.timeZone);
  return {
    date: source.date,
    address: source.address,
    room: source.room,
    opensAt: source.opensAt,
    closesAt: source.closesAt,
    breakStart: source.breaks[0]?.start ?? '',
    breakEnd: source.breaks[0]?.end ?? '',
    slotMinutes: String(source.slotMinutes),
    bookingOpensAt: local(source.bookingOpensAt),
    bookingClosesAt: local(source.bookingClosesAt),
    changesCloseAt: local(source.changesCloseAt),
  };
}

/**
 * Changing a day: the studio checks what the change does to the bookings, then saves it; a
 * coordinator checks the same and sends it to the studio as a proposal. Every date-time is in
 * the office's zone.
 */
export function EditDayForm({
  day,
  photographers,
  proposal,
}: {
  day: Day;
  /** Null for a coordinator: they propose, and the studio staffs the stations. */
  photographers: Array<{ id: string; displayName: string }> | null;
  proposal?: { id: string; changes: DayChanges } | undefined;
}) {
  const [fields, setFields] = useState(() => startingFields(day, proposal?.changes));
  const [stations, setStations] = useState<StationDraft[]>(() =>
    (proposal?.changes.stations ?? day.stations).map((station) => ({
      ...(station.id ? { id: station.id } : {}),
      name: station.name,
      // A proposal leaves photographers to the studio: start from who is assigned now.
      photographerId:
        station.photographerId ??
        day.stations.find((current) => current.id === station.id)?.photographerId ??
        '',
    })),
  );
  const [resolution, setResolution] = useState<'move' | 'cancel'>(
    proposal?.changes.resolution ?? 'move',
  );
  const [note, setNote] = useState('');
  const [errors, setErrors] = useState<Errors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const preview = usePreviewDayChanges();
  const save = useEditDay();
  const propose = useProposeDayChange();
  const studio = photographers !== null;
  const zone = day.timeZone;

  const changed = () => {
    preview.reset();
    save.reset();
    propose.reset();
  };
  const set = (key: keyof typeof fields) => (value: string) => {
    setFields((current) => ({ ...current, [key]: value }));
    setErrors((current) => ({ ...current, [key]: undefined }));
    changed();
  };

  const changes = (): DayChangesRequest => ({
    date: fields.date,
    address: fields.address,
    room: fields.room,
    opensAt: fields.opensAt,
    closesAt: fields.closesAt,
    breaks:
      fields.breakStart || fields.breakEnd
        ? [{ start: fields.breakStart, end: fields.breakEnd }]
        : [],
    slotMinutes: Number(fields.slotMinutes),
    bookingOpensAt: officeLocalToInstant(fields.bookingOpensAt, zone),
    bookingClosesAt: officeLocalToInstant(fields.bookingClosesAt, zone),
    changesCloseAt: officeLocalToInstant(fields.changesCloseAt, zone),
    stations: stations.map((station) => ({
      ...(station.id ? { id: station.id } : {}),
      name: station.name,
      photographerId: station.photographerId || null,
    })),
    resolution,
  });

  const showError = (error: Error) => {
    if (!(error instanceof ApiError))
      return setFormError('Something went wrong. Please try again.');
    setFormError(error.message);
    const next: Errors = {};
    for (const [key, messages] of Object.entries(error.fieldErrors)) next[key] = messages?.[0];
    setErrors(next);
  };

  const valid = (input: DayChangesRequest) => {
    const parsed = dayChangesSchema.safeParse(input);
    if (parsed.success) return true;
    const next: Errors = {};
    for (const issue of parsed.error.issues) {
      const key = issue.path[0] === 'breaks' ? 'breakEnd' : String(issue.path[0]);
      next[key] ??= issue.message;
    }
    setErrors(next);
    setFormError('Some fields need attention.');
    return false;
  };

  const check = (event: FormEvent) => {
    event.preventDefault();
    const input = changes();
    if (!valid(input)) return;
    setFormError(null);
    preview.mutate({ dayId: day.id, changes: input }, { onError: showError });
  };

  const commit = () => {
    const input = changes();
    if (!valid(input)) return;
    if (studio) {
      save.mutate(
        { dayId: day.id, changes: input, proposalId: proposal?.id },
        { onError: showError },
      );
    } else {
      propose.mutate(
        { dayId: day.id, proposal: { kind: 'edit', changes: input, note } },
        { onError: showError },
      );
    }
  };

  const blocked = (preview.data?.blocked.length ?? 0) > 0;
  return (
    <form onSubmit={check} noValidate aria-label="Change this day" className="flex flex-col gap-4">
      {proposal ? (
        <Notice tone="info">The form holds the coordinator’s proposal: check it, then save.</Notice>
      ) : null}
      {formError ? <Notice tone="danger">{formError}</Notice> : null}
      <p className="text-sm text-ink-muted">Every time here is {zone} time, the office’s zone.</p>
      <div className="grid gap-4 sm:grid-cols-2">
        <DayScheduleFields fields={fields} set={set} errors={errors} zone={zone} />
      </div>
      <StationFields
        stations={stations}
        onChange={(next) => {
          setStations(next);
          changed();
        }}
        photographers={photographers}
        error={errors.stations}
      />
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 text-sm font-medium">Bookings that no longer fit</legend>
        {(
          [
            ['move', 'Move them to the nearest free seat'],
            ['cancel', 'Cancel them'],
          ] as const
        ).map(([value, label]) => (
          <label key={value} className="flex min-h-touch items-center gap-3">
            <input
              type="radio"
              name={`resolution-${day.id}`}
              value={value}
              checked={resolution === value}
              onChange={() => {
                setResolution(value);
                changed();
              }}
              className="size-5 accent-spruce-600"
            />
            {label}
          </label>
        ))}
      </fieldset>
      {!studio ? (
        <TextField label="Note for the studio" value={note} onChange={setNote} maxLength={500} />
      ) : null}
      <div className="flex flex-wrap gap-3">
        <Button type="submit" variant="secondary" busy={preview.isPending}>
          Check what this changes
        </Button>
        <Button
          disabled={!preview.isSuccess || blocked}
          busy={save.isPending || propose.isPending}
          onClick={commit}
        >
          {studio ? 'Save the changes' : 'Send the proposal to the studio'}
        </Button>
      </div>
      {preview.isSuccess && !save.isSuccess ? (
        <DayChangePreviewList preview={preview.data} />
      ) : null}
      {save.isSuccess ? (
        <>
          <Notice tone="success">Saved. The sitters affected are being told by e-mail.</Notice>
          <DayChangePreviewList preview={save.data.outcome} saved />
        </>
      ) : null}
      {propose.isSuccess ? (
        <Notice tone="success">Sent: the studio will apply it or get back to you.</Notice>
      ) : null}
    </form>
  );
}
