import { useState } from 'react';
import type { ReviewSitter } from '../../../../server/schemas/matching';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { useRosterSearch } from '../../station-console/api/search-roster';

/**
 * Picks who the chosen frames belong to. "move" offers the day's sitters; "split" offers
 * anyone on the client's roster, for someone photographed without a sitting of their own.
 */
export function ChoosePerson({
  dayId,
  mode,
  sitters,
  frames,
  onPick,
  onCancel,
}: {
  dayId: string;
  mode: 'move' | 'split';
  sitters: ReviewSitter[];
  frames: number;
  onPick: (personId: string) => void;
  onCancel: () => void;
}) {
  const [text, setText] = useState('');
  const roster = useRosterSearch(dayId, mode === 'split' ? text : '');
  const needle = text.trim().toLowerCase();
  const choices =
    mode === 'move'
      ? sitters
          .filter((sitter) => sitter.sittingId !== null)
          .filter(
            (sitter) =>
              needle === '' ||
              sitter.name.toLowerCase().includes(needle) ||
              (sitter.employeeId ?? '').toLowerCase().includes(needle),
          )
          .map((sitter) => ({ id: sitter.personId, name: sitter.name, note: sitter.employeeId }))
      : (roster.data?.people ?? []).map((person) => ({
          id: person.id,
          name: person.name,
          note: person.department,
        }));
  const title =
    mode === 'move'
      ? `Give ${frames} frame${frames === 1 ? '' : 's'} to a sitter of the day`
      : `Split ${frames} frame${frames === 1 ? '' : 's'} off to someone else on the roster`;
  return (
    <div role="group" aria-label={title} className="flex flex-col gap-2">
      <p className="font-medium text-ink">{title}</p>
      <TextField
        label={
          mode === 'move' ? 'Find a sitter' : 'Find someone on the roster (two letters or more)'
        }
        value={text}
        onChange={setText}
        autoFocus
      />
      <ul className="flex max-h-64 flex-col gap-1 overflow-y-auto">
        {choices.slice(0, 40).map((choice) => (
          <li key={choice.id}>
            <Button
              variant="secondary"
              className="w-full justify-start"
              onClick={() => onPick(choice.id)}
            >
              {choice.name}
              {choice.note ? <span className="text-ink-muted">· {choice.note}</span> : null}
            </Button>
          </li>
        ))}
        {choices.length === 0 ? (
          <li className="text-sm text-ink-muted">
            {mode === 'split' && needle.length < 2 ? 'Type a name to search.' : 'Nobody found.'}
          </li>
        ) : null}
      </ul>
      <div>
        <Button variant="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </div>
  );
}
