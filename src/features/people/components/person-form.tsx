import type { FormEvent } from 'react';
import type { Person } from '../../../../server/schemas/people';
import { savePersonRequestSchema } from '../../../../server/schemas/roster';
import { Button } from '../../../components/ui/button';
import { SelectField, TextField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { useZodForm } from '../../../lib/use-zod-form';
import { useSavePerson } from '../api/save-person';

type Field =
  'givenName' | 'familyName' | 'preferredName' | 'email' | 'employeeId' | 'department' | 'jobTitle';

const fields: Array<{ key: Field; label: string; type?: string }> = [
  { key: 'givenName', label: 'Given name' },
  { key: 'familyName', label: 'Family name' },
  { key: 'preferredName', label: 'Preferred name (optional)' },
  { key: 'email', label: 'Work e-mail', type: 'email' },
  { key: 'employeeId', label: 'Employee id (optional)' },
  { key: 'department', label: 'Department (optional)' },
  { key: 'jobTitle', label: 'Job title (optional)' },
];

/** Add one person or edit one, with the same rules as a roster row. */
export function PersonForm({
  clientId,
  person,
  offices,
  onDone,
}: {
  clientId: string;
  person: Person | null;
  offices: Array<{ id: string; name: string }>;
  onDone: () => void;
}) {
  const form = useZodForm(savePersonRequestSchema, {
    givenName: person?.givenName ?? '',
    familyName: person?.familyName ?? '',
    preferredName: person?.preferredName ?? '',
    email: person?.email ?? '',
    employeeId: person?.employeeId ?? '',
    department: person?.department ?? '',
    jobTitle: person?.jobTitle ?? '',
    officeId: person?.officeId ?? '',
  });
  const save = useSavePerson();

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const values = form.validate();
    if (!values) return;
    save.mutate(
      { clientId, personId: person?.id, values: { ...values, officeId: values.officeId ?? '' } },
      { onSuccess: onDone, onError: form.showServerError },
    );
  };

  return (
    <form
      onSubmit={submit}
      noValidate
      aria-label={person ? `Edit ${person.givenName} ${person.familyName}` : 'Add a person'}
      className="flex flex-col gap-4"
    >
      {form.formError ? <Notice tone="danger">{form.formError}</Notice> : null}
      <div className="grid gap-4 sm:grid-cols-2">
        {fields.map(({ key, label, type }) => (
          <TextField
            key={key}
            label={label}
            type={type}
            value={String(form.values[key] ?? '')}
            onChange={(value) => form.set(key, value)}
            error={form.errors[key]}
          />
        ))}
        <SelectField
          label="Office"
          value={String(form.values.officeId ?? '')}
          onChange={(value) => form.set('officeId', value)}
          error={form.errors.officeId}
          options={[
            { value: '', label: 'No office' },
            ...offices.map((office) => ({ value: office.id, label: office.name })),
          ]}
        />
      </div>
      <div className="flex flex-wrap gap-3">
        <Button type="submit" busy={save.isPending}>
          {person ? 'Save changes' : 'Add person'}
        </Button>
        <Button variant="secondary" onClick={onDone} disabled={save.isPending}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
