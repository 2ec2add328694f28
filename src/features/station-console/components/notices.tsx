import { Button } from '../../../components/ui/button';
import type { OutboxNotice } from '../offline/outbox';

/**
 * The latest answer from the server, over the page so the queue never moves: each notice
 * replaces the one before and fades (one that offers a fix stays until replaced or dismissed).
 */
export function Notices({
  notices,
  onDismiss,
  onFix,
}: {
  notices: OutboxNotice[];
  onDismiss: (id: string) => void;
  onFix: (noticeId: string, fix: NonNullable<OutboxNotice['fix']>) => void;
}) {
  return (
    <div
      aria-live="polite"
      aria-label="Notices"
      role="region"
      className="pointer-events-none fixed inset-x-0 top-20 z-20 flex flex-col items-center gap-2 px-4"
    >
      {notices.map((notice) => (
        <div
          key={notice.id}
          role={notice.tone === 'danger' ? 'alert' : 'status'}
          className={`pointer-events-auto flex w-full max-w-2xl flex-wrap items-center gap-3 rounded-control border-l-4 px-4 py-2 text-lg shadow-card ${
            notice.tone === 'danger'
              ? 'border-danger-600 bg-danger-50 text-danger-700'
              : 'border-success-600 bg-success-50 text-ink'
          }`}
        >
          <p className="flex-1">{notice.text}</p>
          {notice.fix ? (
            <Button variant="secondary" onClick={() => onFix(notice.id, notice.fix!)}>
              Correct the first frame
            </Button>
          ) : null}
          <Button variant="quiet" onClick={() => onDismiss(notice.id)}>
            Dismiss
          </Button>
        </div>
      ))}
    </div>
  );
}
