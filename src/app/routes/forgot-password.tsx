import type { FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { passwordResetRequestSchema } from '../../../server/schemas/auth';
import { Button } from '../../components/ui/button';
import { Card } from '../../components/ui/card';
import { TextField } from '../../components/ui/field';
import { Notice } from '../../components/ui/notice';
import { useRequestPasswordReset } from '../../features/auth/api/request-password-reset';
import { useZodForm } from '../../lib/use-zod-form';
import { PublicFrame } from './public-frame';

export function ForgotPasswordPage() {
  const form = useZodForm(passwordResetRequestSchema, { email: '' });
  const request = useRequestPasswordReset();

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const input = form.validate();
    if (input) request.mutate(input, { onError: form.showServerError });
  };

  return (
    <PublicFrame title="Choose a new password">
      <Card>
        {request.isSuccess ? (
          <Notice tone="success">{request.data.message}</Notice>
        ) : (
          <form
            onSubmit={submit}
            noValidate
            className="flex flex-col gap-4"
            aria-label="Ask for a password link"
          >
            {form.formError ? <Notice tone="danger">{form.formError}</Notice> : null}
            <TextField
              label="E-mail"
              type="email"
              autoComplete="username"
              value={form.values.email}
              onChange={(value) => form.set('email', value)}
              error={form.errors.email}
            />
            <Button type="submit" busy={request.isPending}>
              E-mail me a link
            </Button>
          </form>
        )}
      </Card>
      <Link to="/sign-in" className="font-medium text-spruce-700 underline">
        Back to sign-in
      </Link>
    </PublicFrame>
  );
}
