import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { useRosterSearch } from '../api/search-roster';
import { NewPersonForm, type NewPersonInput } from './new-person-form';
import { PassScanner } from './pass-scanner';

type Mode = 'scan' | 'search' | 'new';

/** Check-in by pass (camera), by name on the roster, or a person not on the roster. */
export function CheckInPanel({
  dayId,
  online,
  onPass,
  onPerson,
  onNewPerson,
  onClose,
}: {
  dayId: string;
  online: boolean;
  onPass: (token: string) => void;
  onPerson: (person: { id: string; name: string }) => void;
  onNewPerson: (input: NewPersonInput) => void;
  onClose: () => void;
}) {
  const [mode, setMode] = useState<Mode>('scan');
  const [text, setText] = useState('');
  const search = useRosterSearch(dayId, mode === 'search' ? text : '');
  const tabs: Array<[Mode, string]> = [
    ['scan', 'Scan pass'],
    ['search', 'Search by name'],
    ['new', 'Not on the roster'],
  ];
  return (
    <section
      aria-labelledby="check-in-title"
      className="flex flex-col gap-4 rounded-card border border-line bg-paper-raised p-4 shadow-card"
    >
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="check-in-title" className="text-2xl font-semibold">
          Check in
        </h2>
        <Button variant="secondary" onClick={onClose}>
          Close
        </Button>
      </div>
      <div role="tablist" aria-label="How to check in" className="flex flex-wrap gap-2">
        {tabs.map(([value, label]) => (
          <button
            key={value}
            role="tab"
            type="button"
            aria-selected={mode === value}
            onClick={() => setMode(value)}
            className={`min-h-touch rounded-control border px-4 text-base font-semibold ${
              mode === value
                ? 'border-spruce-600 bg-spruce-600 text-paper-raised'
                : 'border-line-strong bg-paper-raised text-spruce-700'
            }`}
          >
            {label}
          </button>
        ))}
      </div>
      {mode === 'scan' ? <PassScanner onCode={onPass} /> : null}
      {mode === 'search' ? (
        <div className="flex flex-col gap-3">
          <TextField
            label="Name or employee id"
            value={text}
            onChange={setText}
            autoComplete="off"
            hint={
              online
                ? 'Type at least two characters; accents and capitals do not matter.'
                : 'Searching the roster needs the network.'
            }
          />
          {search.isError ? (
            <p role="alert" className="text-base text-danger-600">
              {search.error.message}
            </p>
          ) : null}
          <ul aria-label="Matches" className="flex flex-col gap-2">
            {(text.trim().length >= 2 ? (search.data?.people ?? []) : []).map((person) => (
              <li
                key={person.id}
                className="flex items-center gap-3 rounded-control border border-line p-2"
              >
                <div className="flex-1">
                  <p className="text-lg font-semibold">{person.name}</p>
                  <p className="text-sm text-ink-muted">
                    {[person.employeeId, person.department, person.officeName]
                      .filter(Boolean)
                      .join(' · ')}
                  </p>
                </div>
                {person.checkedIn ? (
                  <span className="text-base text-ink-muted">Already checked in</span>
                ) : (
                  <Button
                    aria-label={`Check in ${person.name}`}
                    onClick={() => onPerson({ id: person.id, name: person.name })}
                  >
                    Check in
                  </Button>
                )}
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      {mode === 'new' ? <NewPersonForm onSubmit={onNewPerson} /> : null}
    </section>
  );
}
