import type { QueryClient } from '@tanstack/react-query';
import { Link, Outlet, useLocation, useNavigate, type LoaderFunctionArgs } from 'react-router-dom';
import type { Role } from '../../../server/schemas/common';
import { roleLabels } from '../../../server/schemas/common';
import { Button } from '../../components/ui/button';
import { Logo } from '../../components/ui/logo';
import { useSession } from '../../features/auth/api/get-session';
import { useSignOut } from '../../features/auth/api/sign-out';
import { requireSession } from '../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireSession(queryClient, request);
    return null;
  };

/** A menu entry; `within` marks the pages it stands for besides its own path. */
interface NavigationItem {
  to: string;
  label: string;
  within?: RegExp;
}

const navigation: Record<Role, NavigationItem[]> = {
  studio_admin: [
    { to: '/', label: 'Overview' },
    { to: '/studio/clients', label: 'Clients' },
    { to: '/days', label: 'Shoot days' },
    { to: '/studio/team', label: 'Team' },
    { to: '/studio/mailbox', label: 'Mailbox' },
  ],
  photographer: [
    { to: '/', label: 'My days' },
    { to: '/console', label: 'Station console' },
  ],
  coordinator: [
    { to: '/', label: 'Overview' },
    // /people redirects to the client's directory, so the tab must light up there too.
    { to: '/people', label: 'People', within: /^\/clients\/[^/]+\/people(\/|$)/ },
    { to: '/days', label: 'Shoot days' },
  ],
  sitter: [{ to: '/', label: 'My portrait' }],
};

export function SignedInLayout() {
  const { data: session } = useSession();
  const signOut = useSignOut();
  const navigate = useNavigate();
  const { pathname } = useLocation();
  if (!session) return null;
  const { user } = session;

  return (
    <>
      <header className="no-print border-b border-line bg-paper-raised">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-2">
          <Logo size={28} />
          <nav aria-label="Main" className="flex flex-1 flex-wrap gap-1">
            {navigation[user.role].map((item) => {
              const active = pathname === item.to || Boolean(item.within?.test(pathname));
              return (
                <Link
                  key={item.to}
                  to={item.to}
                  aria-current={active ? 'page' : undefined}
                  className={`inline-flex min-h-touch items-center rounded-control px-3 font-medium ${
                    active ? 'bg-spruce-50 text-spruce-700' : 'text-ink-muted hover:text-ink'
                  }`}
                >
                  {item.label}
                </Link>
              );
            })}
          </nav>
          <div className="flex items-center gap-3 text-sm">
            <span className="text-ink-muted">
              <span className="font-medium text-ink">{user.displayName}</span> ·{' '}
              {roleLabels[user.role]}
              {user.clientName ? ` · ${user.clientName}` : ''}
            </span>
            <Link
              to="/account"
              aria-current={pathname === '/account' ? 'page' : undefined}
              className="inline-flex min-h-touch items-center rounded-control px-2 font-medium text-spruce-700 underline"
            >
              Account
            </Link>
            <Button
              variant="secondary"
              busy={signOut.isPending}
              onClick={() =>
                signOut.mutate(undefined, {
                  onSuccess: () => navigate('/sign-in', { replace: true }),
                })
              }
            >
              Sign out
            </Button>
          </div>
        </div>
      </header>
      <main className="mx-auto w-full max-w-6xl px-4 py-6">
        <Outlet />
      </main>
    </>
  );
}
