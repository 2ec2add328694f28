import type { FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { signInRequestSchema } from '../../../../server/schemas/auth';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { useZodForm } from '../../../lib/use-zod-form';
import { useSignIn } from '../api/sign-in';

export function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const form = useZodForm(signInRequestSchema, { email: '', password: '' });
  const signIn = useSignIn();

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const input = form.validate();
    if (!input) return;
    signIn.mutate(input, { onSuccess: onSignedIn, onError: form.showServerError });
  };

  return (
    <form
      onSubmit={submit}
      noValidate
      className="flex flex-col gap-4"
      aria-label="Sign in with a password"
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
      <TextField
        label="Password"
        type="password"
        autoComplete="current-password"
        value={form.values.password}
        onChange={(value) => form.set('password', value)}
        error={form.errors.password}
      />
      <Button type="submit" busy={signIn.isPending}>
        Sign in
      </Button>
      <Link to="/forgot-password" className="text-sm font-medium text-spruce-700 underline">
        Forgot your password?
      </Link>
    </form>
  );
}
