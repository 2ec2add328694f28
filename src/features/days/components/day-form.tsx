import { useState, type FormEvent } from 'react';
import { createDayRequestSchema, type CreateDayRequest } from '../../../../server/schemas/days';
import { officeLocalToInstant } from '../../../../server/schemas/office-time';
import type { Client } from '../../../../server/schemas/clients';
import { Button } from '../../../components/ui/button';
import { SelectField, TextField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { useCreateDay } from '../api/create-day';
import { InviteePicker } from './invitee-picker';
import { DayScheduleFields } from './day-schedule-fields';
import { StationFields, type StationDraft } from './station-fields';
import { ThroughputPlanner } from './throughput-planner';

type Errors = Record<string, string | undefined>;
const minutes = (time: string) =>
  /^\d\d:\d\d$/.test(time) ? Number(time.slice(0, 2)) * 60 + Number(time.slice(3)) : NaN;

export function DayForm({
  clients,
  photographers,
}: {
  clients: Client[];
  /** Null for a coordinator: their day is a proposal the studio staffs. */
  photographers: Array<{ id: string; displayName: string }> | null;
}) {
  const [clientId, setClientId] = useState(clients[0]?.id ?? '');
  const client = clients.find((candidate) => candidate.id === clientId);
  const [officeId, setOfficeId] = useState(client?.offices[0]?.id ?? '');
  const office = client?.offices.find((candidate) => candidate.id === officeId);
  const [fields, setFields] = useState({
    date: '',
    address: '',
    room: '',
    opensAt: '09:00',
    closesAt: '17:00',
    breakStart: '12:30',
    breakEnd: '13:15',
    slotMinutes: '5',
    bookingOpensAt: '',
    bookingClosesAt: '',
    changesCloseAt: '',
    departments: '',
  });
  const [inviteBy, setInviteBy] = useState<'office' | 'department' | 'list'>('office');
  const [invitePersonIds, setInvitePersonIds] = useState<string[]>([]);
  const [stations, setStations] = useState<StationDraft[]>([
    { name: 'Station A', photographerId: '' },
  ]);
  const [headCount, setHeadCount] = useState<string | null>(null);
  const [errors, setErrors] = useState<Errors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const create = useCreateDay();
  const set = (key: keyof typeof fields) => (value: string) => {
    setFields((current) => ({ ...current, [key]: value }));
    setErrors((current) => ({ ...current, [key]: undefined }));
  };

  const breakMinutes =
    fields.breakStart && fields.breakEnd
      ? minutes(fields.breakEnd) - minutes(fields.breakStart)
      : 0;
  const hoursPerDay =
    (minutes(fields.closesAt) - minutes(fields.opensAt) - (breakMinutes || 0)) / 60;

  const defaultHeadCount =
    inviteBy === 'list' ? invitePersonIds.length : (office?.activePeople ?? 0);

  // The office's wall clock, not the browser's: a day in Hamburg planned from a UTC laptop
  // closes booking at the Hamburg time typed.
  const zone = office?.timeZone ?? 'UTC';
  const toInstant = (value: string) => (value ? officeLocalToInstant(value, zone) : '');
  const zoneHint = `In ${zone} time, like the opening hours.`;

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const input: CreateDayRequest = {
      clientId,
      officeId,
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
      bookingOpensAt: toInstant(fields.bookingOpensAt),
      bookingClosesAt: toInstant(fields.bookingClosesAt),
      changesCloseAt: toInstant(fields.changesCloseAt),
      inviteBy,
      invitePersonIds: inviteBy === 'list' ? invitePersonIds : [],
      inviteDepartments: fields.departments
        .split(',')
        .map((name) => name.trim())
        .filter(Boolean),
      stations: stations.map((station) => ({
        name: station.name,
        photographerId: station.photographerId || null,
      })),
    };
    const parsed = createDayRequestSchema.safeParse(input);
    if (!parsed.success) {
      const next: Errors = {};
      for (const issue of parsed.error.issues) {
        const key = issue.path[0] === 'breaks' ? 'breakEnd' : String(issue.path[0]);
        next[key] ??= issue.message;
      }
      setErrors(next);
      setFormError('Some fields need attention.');
      return;
    }
    setFormError(null);
    create.mutate(input, {
      onSuccess: () => setErrors({}),
      onError: (error) => {
        if (!(error instanceof ApiError))
          return setFormError('Something went wrong. Please try again.');
        setFormError(error.message);
        const next: Errors = {};
        for (const [key, messages] of Object.entries(error.fieldErrors)) next[key] = messages?.[0];
        setErrors(next);
      },
    });
  };

  if (clients.length === 0) {
    return <p>Add a client with offices first: a day belongs to one office.</p>;
  }

  return (
    <form
      onSubmit={submit}
      noValidate
      className="flex flex-col gap-4"
      aria-label="Plan a shoot day"
    >
      {formError ? <Notice tone="danger">{formError}</Notice> : null}
      {create.isSuccess ? (
        <Notice tone="success">
          {create.data.status === 'proposed'
            ? 'Proposed: the studio will confirm it and assign photographers.'
            : `The ${create.data.officeName} day on ${create.data.date} is set up.`}
        </Notice>
      ) : null}
      {clients.length > 1 ? (
        <SelectField
          label="Client"
          value={clientId}
          onChange={(id) => {
            setClientId(id);
            setOfficeId(clients.find((candidate) => candidate.id === id)?.offices[0]?.id ?? '');
          }}
          options={clients.map((candidate) => ({ value: candidate.id, label: candidate.name }))}
        />
      ) : null}
      <SelectField
        label="Office"
        value={officeId}
        onChange={setOfficeId}
        error={errors.officeId}
        hint={
          office
            ? `Times are in the office's zone, ${office.timeZone}.`
            : 'This client has no offices yet: import the roster first.'
        }
        options={(client?.offices ?? []).map((candidate) => ({
          value: candidate.id,
          label: candidate.name,
        }))}
      />
      <div className="grid gap-4 sm:grid-cols-2">
        <DayScheduleFields
          fields={fields}
          set={set}
          errors={errors}
          zone={zone}
          zoneHint={zoneHint}
        />
        <SelectField
          label="Who is invited"
          value={inviteBy}
          onChange={(value) =>
            setInviteBy(value === 'department' || value === 'list' ? value : 'office')
          }
          options={[
            { value: 'office', label: 'Everyone at this office' },
            { value: 'department', label: 'Chosen departments' },
            { value: 'list', label: 'Hand-picked people' },
          ]}
        />
      </div>
      {inviteBy === 'department' ? (
        <TextField
          label="Departments (comma-separated)"
          value={fields.departments}
          onChange={set('departments')}
          error={errors.inviteDepartments}
        />
      ) : null}
      {inviteBy === 'list' && clientId && officeId ? (
        <InviteePicker
          clientId={clientId}
          officeId={officeId}
          selected={invitePersonIds}
          onChange={setInvitePersonIds}
          error={errors.invitePersonIds}
        />
      ) : null}
      <StationFields
        stations={stations}
        onChange={setStations}
        photographers={photographers}
        error={errors.stations}
      />
      <div className="rounded-card bg-paper-sunk p-4">
        <TextField
          label="Head count to plan for"
          type="number"
          inputMode="numeric"
          min={0}
          value={headCount ?? String(defaultHeadCount)}
          onChange={setHeadCount}
          hint="Starts at the office's active roster, or the people picked."
        />
        <div className="mt-3">
          <ThroughputPlanner
            headCount={Number(headCount ?? defaultHeadCount)}
            stations={stations.length}
            slotMinutes={Number(fields.slotMinutes)}
            hoursPerDay={hoursPerDay}
          />
        </div>
      </div>
      <Button type="submit" busy={create.isPending}>
        {photographers ? 'Create the day' : 'Propose the day'}
      </Button>
    </form>
  );
}
