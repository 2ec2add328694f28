import { Button } from '../../../components/ui/button';
import { SelectField, TextField } from '../../../components/ui/field';

export interface StationDraft {
  /** Set for a station the day already has (editing); absent for one being added. */
  id?: string;
  name: string;
  photographerId: string;
}

/** The day's stations; the studio assigns a photographer to each, a coordinator only names them. */
export function StationFields({
  stations,
  onChange,
  photographers,
  error,
}: {
  stations: StationDraft[];
  onChange: (stations: StationDraft[]) => void;
  photographers: Array<{ id: string; displayName: string }> | null;
  error?: string | undefined;
}) {
  const update = (index: number, patch: Partial<StationDraft>) =>
    onChange(stations.map((station, i) => (i === index ? { ...station, ...patch } : station)));
  return (
    <fieldset className="flex flex-col gap-3">
      <legend className="mb-1 text-sm font-medium">Stations</legend>
      {stations.map((station, index) => (
        <div
          key={index}
          className="grid gap-3 rounded-control border border-line p-3 sm:grid-cols-[1fr_1fr_auto]"
        >
          <TextField
            label={`Station ${index + 1} name`}
            value={station.name}
            onChange={(name) => update(index, { name })}
          />
          {photographers ? (
            <SelectField
              label={`Station ${index + 1} photographer`}
              value={station.photographerId}
              onChange={(photographerId) => update(index, { photographerId })}
              options={[
                { value: '', label: 'Pick a photographer' },
                ...photographers.map((person) => ({ value: person.id, label: person.displayName })),
              ]}
            />
          ) : (
            <p className="self-end text-sm text-ink-muted">The studio assigns the photographer.</p>
          )}
          <Button
            variant="quiet"
            className="self-end"
            disabled={stations.length === 1}
            onClick={() => onChange(stations.filter((_, i) => i !== index))}
          >
            Remove
          </Button>
        </div>
      ))}
      {error ? (
        <p role="alert" className="text-sm font-medium text-danger-600">
          {error}
        </p>
      ) : null}
      <Button
        variant="secondary"
        className="self-start"
        onClick={() =>
          onChange([
            ...stations,
            { name: `Station ${String.fromCharCode(65 + stations.length)}`, photographerId: '' },
          ])
        }
      >
        Add a station
      </Button>
    </fieldset>
  );
}
