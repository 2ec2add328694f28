import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { Notice } from '../../../components/ui/notice';
import { formatDateTime, plural } from '../../../lib/format';
import { useSessions } from '../api/list-sessions';
import { useSignOutElsewhere } from '../api/sign-out-elsewhere';

/** Where this account is signed in, and a way to end every other place at once. */
export function SessionList() {
  const sessions = useSessions();
  const signOut = useSignOutElsewhere();
  const list = sessions.data?.sessions ?? [];
  const others = list.filter((session) => !session.current).length;

  return (
    <Card title="Where you are signed in">
      {sessions.isError ? <Notice tone="caution">{sessions.error.message}</Notice> : null}
      <ul aria-label="Sessions" className="mb-4 flex flex-col divide-y divide-line">
        {list.map((session) => (
          <li key={session.id} className="py-2">
            <div className="font-medium">
              {session.userAgent ?? 'Unknown browser'}
              {session.current ? ' (this device)' : ''}
            </div>
            <div className="text-sm text-ink-muted">
              Signed in {formatDateTime(session.createdAt)}
              {session.ipAddress ? ` from ${session.ipAddress}` : ''} · ends{' '}
              {formatDateTime(session.expiresAt)}
            </div>
          </li>
        ))}
      </ul>
      {signOut.isSuccess ? (
        <Notice tone="success">
          Signed out of {plural(signOut.data.ended, 'other session')}. This device stays signed in.
        </Notice>
      ) : null}
      {signOut.isError ? <Notice tone="danger">{signOut.error.message}</Notice> : null}
      <div className="mt-3">
        <Button
          variant="secondary"
          busy={signOut.isPending}
          disabled={others === 0}
          onClick={() => signOut.mutate()}
        >
          Sign out everywhere else
        </Button>
      </div>
    </Card>
  );
}
