import { useState, type FormEvent } from 'react';
import { z } from 'zod';
import { emailSchema } from '../../../../server/schemas/common';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';

export interface NewPersonInput {
  givenName: string;
  familyName: string;
  email: string;
}

const required = (what: string) =>
  z
    .string()
    .trim()
    .min(1, { error: `Enter the ${what}.` })
    .max(80, { error: 'Use at most 80 characters.' });
const newPersonSchema = z.object({
  givenName: required('given name'),
  familyName: required('family name'),
  email: emailSchema,
});

/** A walk-in who is not on the roster joins it, marked as added on the day. */
export function NewPersonForm({ onSubmit }: { onSubmit: (input: NewPersonInput) => void }) {
  const [values, setValues] = useState<NewPersonInput>({
    givenName: '',
    familyName: '',
    email: '',
  });
  const [errors, setErrors] = useState<Partial<Record<keyof NewPersonInput, string>>>({});
  const submit = (event: FormEvent) => {
    event.preventDefault();
    const parsed = newPersonSchema.safeParse(values);
    if (!parsed.success) {
      const flat = z.flattenError(parsed.error).fieldErrors;
      setErrors({
        givenName: flat.givenName?.[0],
        familyName: flat.familyName?.[0],
        email: flat.email?.[0],
      });
      return;
    }
    onSubmit(parsed.data);
    setValues({ givenName: '', familyName: '', email: '' });
    setErrors({});
  };
  const field = (name: keyof NewPersonInput) => ({
    value: values[name],
    error: errors[name],
    onChange: (value: string) => setValues((current) => ({ ...current, [name]: value })),
  });
  return (
    <form aria-label="Add a walk-in" noValidate onSubmit={submit} className="flex flex-col gap-3">
      <TextField label="Given name" autoComplete="off" {...field('givenName')} />
      <TextField label="Family name" autoComplete="off" {...field('familyName')} />
      <TextField
        label="E-mail"
        type="email"
        autoComplete="off"
        hint="Their portraits are delivered here."
        {...field('email')}
      />
      <Button type="submit">Add and check in</Button>
    </form>
  );
}
