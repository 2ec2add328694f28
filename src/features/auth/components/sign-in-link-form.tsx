import type { FormEvent } from 'react';
import { signInLinkRequestSchema } from '../../../../server/schemas/auth';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { useZodForm } from '../../../lib/use-zod-form';
import { useRequestSignInLink } from '../api/request-sign-in-link';

/** Sitters have no password: they ask for a one-time link by e-mail. */
export function SignInLinkForm({ initialEmail = '' }: { initialEmail?: string }) {
  const form = useZodForm(signInLinkRequestSchema, { email: initialEmail });
  const request = useRequestSignInLink();

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const input = form.validate();
    if (!input) return;
    request.mutate(input, { onError: form.showServerError });
  };

  if (request.isSuccess) return <Notice tone="success">{request.data.message}</Notice>;

  return (
    <form
      onSubmit={submit}
      noValidate
      className="flex flex-col gap-4"
      aria-label="Get a sign-in link"
    >
      {form.formError ? <Notice tone="danger">{form.formError}</Notice> : null}
      <TextField
        label="Work e-mail"
        type="email"
        autoComplete="email"
        value={form.values.email}
        onChange={(value) => form.set('email', value)}
        error={form.errors.email}
        hint="The address your employer gave the studio."
      />
      <Button type="submit" variant="secondary" busy={request.isPending}>
        E-mail me a sign-in link
      </Button>
    </form>
  );
}
