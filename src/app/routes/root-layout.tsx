import { Outlet, useNavigation } from 'react-router-dom';
import { DatabaseOutageNotice } from '../../components/ui/database-outage-notice';

export function RootLayout() {
  const navigation = useNavigation();
  return (
    <div className="min-h-dvh bg-paper font-sans text-ink">
      {navigation.state === 'loading' ? (
        <div
          role="progressbar"
          aria-label="Loading page"
          className="fixed inset-x-0 top-0 h-1 animate-pulse bg-clay-500"
        />
      ) : null}
      <DatabaseOutageNotice />
      <Outlet />
    </div>
  );
}
