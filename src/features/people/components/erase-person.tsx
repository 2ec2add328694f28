import { useState, type FormEvent } from 'react';
import type { Person } from '../../../../server/schemas/people';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { useErasePerson } from '../api/erase-person';

/** Data-protection erasure, confirmed by typing the person's e-mail address. */
export function ErasePerson({
  clientId,
  person,
  onDone,
}: {
  clientId: string;
  person: Person;
  onDone: (erased: boolean) => void;
}) {
  const [confirmEmail, setConfirmEmail] = useState('');
  const [error, setError] = useState<string | undefined>();
  const erase = useErasePerson();

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (confirmEmail.trim().toLowerCase() !== person.email.toLowerCase()) {
      setError("Type this person's e-mail address exactly to confirm.");
      return;
    }
    erase.mutate(
      { clientId, personId: person.id, confirmEmail },
      {
        onSuccess: () => onDone(true),
        onError: (failure) =>
          setError(
            failure instanceof ApiError
              ? (failure.fieldErrors.confirmEmail?.[0] ?? failure.message)
              : 'Something went wrong.',
          ),
      },
    );
  };

  return (
    <form onSubmit={submit} noValidate aria-label="Erase a person" className="flex flex-col gap-4">
      <Notice tone="danger">
        Erasing removes {person.givenName} {person.familyName} for good: their details, bookings and
        photos. This cannot be undone. To keep them on record but stop inviting them, deactivate
        them instead.
      </Notice>
      <TextField
        label={`Type ${person.email} to confirm`}
        value={confirmEmail}
        onChange={(value) => {
          setConfirmEmail(value);
          setError(undefined);
        }}
        error={error}
        autoComplete="off"
      />
      <div className="flex flex-wrap gap-3">
        <Button type="submit" variant="danger" busy={erase.isPending}>
          Erase for good
        </Button>
        <Button variant="secondary" onClick={() => onDone(false)} disabled={erase.isPending}>
          Keep this person
        </Button>
      </div>
    </form>
  );
}
