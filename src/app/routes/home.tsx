import { useSession } from '../../features/auth/api/get-session';
import { CoordinatorHome } from '../../features/clients/components/coordinator-home';
import { PhotographerHome } from '../../features/team/components/photographer-home';
import { SitterHome } from '../../features/sitter/components/sitter-home';
import { StudioHome } from '../../features/clients/components/studio-home';

/** Each role lands on a page that says what to do next. */
export function HomePage() {
  const { data: session } = useSession();
  if (!session) return null;
  switch (session.user.role) {
    case 'studio_admin':
      return <StudioHome name={session.user.displayName} />;
    case 'photographer':
      return <PhotographerHome name={session.user.displayName} />;
    case 'coordinator':
      return <CoordinatorHome name={session.user.displayName} />;
    case 'sitter':
      return <SitterHome />;
  }
}
