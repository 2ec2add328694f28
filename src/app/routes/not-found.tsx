import { Link } from 'react-router-dom';
import { Logo } from '../../components/ui/logo';

export function NotFoundPage() {
  return (
    <main className="mx-auto flex min-h-dvh max-w-lg flex-col items-start justify-center gap-4 p-6">
      <Logo />
      <h1 className="text-2xl font-semibold">There is no page at this address</h1>
      <p className="text-ink-muted">The link may be mistyped or out of date.</p>
      <Link to="/" className="font-medium text-spruce-700 underline">
        Go to my home page
      </Link>
    </main>
  );
}
