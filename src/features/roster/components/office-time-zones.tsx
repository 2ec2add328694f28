import { SelectField } from '../../../components/ui/field';
import { currentTimeZones, currentZoneName } from '../../../lib/time-zones';

/** IANA zones the browser knows, under their current names (old spellings are aliases). */
const zones: string[] = currentTimeZones();

export const browserTimeZone = () =>
  currentZoneName(Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC');

/** One time zone per office the file names and the client does not have yet. */
export function OfficeTimeZones({
  offices,
  value,
  onChange,
  errors,
}: {
  offices: string[];
  value: Record<string, string>;
  onChange: (value: Record<string, string>) => void;
  errors: Record<string, string | undefined>;
}) {
  if (offices.length === 0) return null;
  return (
    <fieldset className="flex flex-col gap-3">
      <legend className="mb-2 font-semibold">New offices: confirm each time zone</legend>
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
        {offices.map((office) => (
          <SelectField
            key={office}
            label={`Time zone of ${office}`}
            value={value[office] ?? ''}
            onChange={(zone) => onChange({ ...value, [office]: zone })}
            error={errors[`office:${office}`]}
            options={[
              { value: '', label: 'Choose a time zone' },
              ...zones.map((zone) => ({ value: zone, label: zone.replace(/_/g, ' ') })),
            ]}
          />
        ))}
      </div>
    </fieldset>
  );
}

/**
 * A zone whose city part is the office's name ("London"); else the zone every office the
 * client already has is in (a new "Manchester" beside "Leeds" on London time); else none, and
 * the coordinator picks. Either way it is shown to be confirmed, not taken silently.
 */
export function guessTimeZone(office: string, knownZones: readonly string[] = []): string {
  const key = office.trim().toLowerCase().replace(/\s+/g, '_');
  const byCity = zones.find((zone) => zone.toLowerCase().endsWith(`/${key}`));
  if (byCity) return byCity;
  const shared = new Set(knownZones.map(currentZoneName));
  return shared.size === 1 ? ([...shared][0] ?? '') : '';
}
