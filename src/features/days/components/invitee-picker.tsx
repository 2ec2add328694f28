import { useState } from 'react';
import { TextField } from '../../../components/ui/field';
import { usePeople } from '../../people/api/list-people';

/** A hand-picked invitation list: search the office's active people and tick them. */
export function InviteePicker({
  clientId,
  officeId,
  selected,
  onChange,
  error,
}: {
  clientId: string;
  officeId: string;
  selected: string[];
  onChange: (ids: string[]) => void;
  error?: string | undefined;
}) {
  const [search, setSearch] = useState('');
  const people = usePeople(clientId, { q: search, officeId, status: 'active', pageSize: 200 });
  const chosen = new Set(selected);
  const toggle = (id: string) =>
    onChange(chosen.has(id) ? selected.filter((other) => other !== id) : [...selected, id]);
  return (
    <fieldset className="flex flex-col gap-2">
      <legend className="mb-1 text-sm font-medium">
        People to invite ({selected.length} picked)
      </legend>
      <TextField label="Search the roster" type="search" value={search} onChange={setSearch} />
      {people.isError ? <p role="alert">{people.error.message}</p> : null}
      <ul className="max-h-64 overflow-auto rounded-control border border-line">
        {(people.data?.people ?? []).map((person) => (
          <li key={person.id} className="border-b border-line last:border-b-0">
            <label className="flex min-h-touch cursor-pointer items-center gap-3 px-3">
              <input
                type="checkbox"
                checked={chosen.has(person.id)}
                onChange={() => toggle(person.id)}
                className="size-5 accent-spruce-600"
              />
              <span>
                {person.preferredName ?? person.givenName} {person.familyName}
                <span className="text-sm text-ink-muted">
                  {' '}
                  · {person.department ?? 'No department'}
                </span>
              </span>
            </label>
          </li>
        ))}
        {people.data && people.data.people.length === 0 ? (
          <li className="px-3 py-2 text-ink-muted">Nobody matches: import the roster first.</li>
        ) : null}
      </ul>
      {error ? (
        <p role="alert" className="text-sm font-medium text-danger-600">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}
