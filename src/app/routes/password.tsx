import type { FormEvent } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { setPasswordRequestSchema } from '../../../server/schemas/auth';
import { Button } from '../../components/ui/button';
import { Card } from '../../components/ui/card';
import { TextField } from '../../components/ui/field';
import { Notice } from '../../components/ui/notice';
import { useSetPassword } from '../../features/auth/api/set-password';
import { useZodForm } from '../../lib/use-zod-form';
import { PublicFrame } from './public-frame';

/** Where both the staff invitation and the forgotten-password mail lead. */
export function PasswordPage() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const form = useZodForm(setPasswordRequestSchema, { token, password: '', confirmPassword: '' });
  const save = useSetPassword();

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const input = form.validate();
    if (input) {
      save.mutate(input, {
        onSuccess: () => navigate('/', { replace: true }),
        onError: form.showServerError,
      });
    }
  };

  return (
    <PublicFrame title="Choose your password">
      <Card>
        <form
          onSubmit={submit}
          noValidate
          className="flex flex-col gap-4"
          aria-label="Choose a password"
        >
          {form.formError ? <Notice tone="danger">{form.formError}</Notice> : null}
          <TextField
            label="New password"
            type="password"
            autoComplete="new-password"
            value={form.values.password}
            onChange={(value) => form.set('password', value)}
            error={form.errors.password}
            hint="At least 12 characters. A few unrelated words work well."
          />
          <TextField
            label="The same password again"
            type="password"
            autoComplete="new-password"
            value={form.values.confirmPassword}
            onChange={(value) => form.set('confirmPassword', value)}
            error={form.errors.confirmPassword}
          />
          <Button type="submit" busy={save.isPending}>
            Save password and sign in
          </Button>
        </form>
      </Card>
      <Link to="/forgot-password" className="font-medium text-spruce-700 underline">
        Link expired? Ask for a new one
      </Link>
    </PublicFrame>
  );
}
