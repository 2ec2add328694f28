import type { QueryClient } from '@tanstack/react-query';
import { redirect, useNavigate, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Card } from '../../components/ui/card';
import { sessionQueryOptions } from '../../features/auth/api/get-session';
import { SignInForm } from '../../features/auth/components/sign-in-form';
import { SignInLinkForm } from '../../features/auth/components/sign-in-link-form';
import { PublicFrame } from './public-frame';

/** Only same-site paths are followed after sign-in. */
export function safeNext(value: string | null): string {
  return value && value.startsWith('/') && !value.startsWith('//') ? value : '/';
}

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const session = await queryClient.ensureQueryData(sessionQueryOptions());
    if (session) return redirect(safeNext(new URL(request.url).searchParams.get('next')));
    return null;
  };

export function SignInPage() {
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const next = safeNext(params.get('next'));
  return (
    <PublicFrame title="Sign in">
      <Card title="Studio and HR team">
        <SignInForm onSignedIn={() => navigate(next, { replace: true })} />
      </Card>
      <Card title="Having your portrait taken?">
        <p className="mb-4 text-ink-muted">
          No password needed. Enter your work e-mail and we will send you a link to your booking
          page.
        </p>
        <SignInLinkForm />
      </Card>
    </PublicFrame>
  );
}
