import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { ApiError } from '../../lib/api-client';
import { isDatabaseOutage, OUTAGE_MESSAGE, useWhenDatabaseIsBack } from '../../lib/database-outage';
import { Logo } from '../../components/ui/logo';

/** The error boundary: says what happened in plain words and how to get back. */
export function RouteError() {
  const error = useRouteError();
  const outage = isDatabaseOutage(error);
  // The page could not load because the database was away: load it again once it is back.
  useWhenDatabaseIsBack(outage, reloadPage);
  let title = 'Something went wrong';
  let message = 'The page could not be shown. Try again, or go back to your home page.';
  if (isRouteErrorResponse(error)) {
    if (error.status === 403) title = 'Not available for your role';
    if (error.status === 404) title = 'Page not found';
    message = typeof error.data === 'string' ? error.data : message;
  } else if (outage) {
    title = 'Waiting for the database';
    message = OUTAGE_MESSAGE;
  } else if (error instanceof ApiError) {
    message = error.message;
  }
  return (
    <main className="mx-auto flex min-h-dvh max-w-lg flex-col items-start justify-center gap-4 p-6">
      <Logo />
      <h1 className="text-2xl font-semibold">{title}</h1>
      <p className="text-ink-muted">{message}</p>
      <div className="flex gap-3">
        <Link to="/" className="font-medium text-spruce-700 underline">
          Go to my home page
        </Link>
        <button
          type="button"
          className="font-medium text-spruce-700 underline"
          onClick={reloadPage}
        >
          Try again
        </button>
      </div>
    </main>
  );
}

function reloadPage() {
  window.location.reload();
}
