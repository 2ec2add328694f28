import type { FormEvent } from 'react';
import { createClientRequestSchema } from '../../../../server/schemas/clients';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { useZodForm } from '../../../lib/use-zod-form';
import { useCreateClient } from '../api/create-client';

export function CreateClientForm() {
  const form = useZodForm(createClientRequestSchema, { name: '' });
  const create = useCreateClient();

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const input = form.validate();
    if (!input) return;
    create.mutate(input, {
      onSuccess: () => form.setValues({ name: '' }),
      onError: form.showServerError,
    });
  };

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4" aria-label="Add a client">
      {form.formError ? <Notice tone="danger">{form.formError}</Notice> : null}
      {create.isSuccess ? <Notice tone="success">{create.data.name} was added.</Notice> : null}
      <TextField
        label="Company name"
        value={form.values.name}
        onChange={(value) => form.set('name', value)}
        error={form.errors.name}
      />
      <Button type="submit" busy={create.isPending}>
        Add client
      </Button>
    </form>
  );
}
