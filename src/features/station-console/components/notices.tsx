import { Button } from '../../../components/ui/button';
import type { OutboxNotice } from '../offline/outbox';

/** Answers from the server, newest last; refusals stay until the photographer dismisses them. */
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
    <div aria-live="polite" className="flex flex-col gap-2">
      {notices.map((notice) => (
        <div
          key={notice.id}
          role={notice.tone === 'danger' ? 'alert' : 'status'}
          className={`flex flex-wrap items-center gap-3 rounded-control border-l-4 px-4 py-2 text-lg ${
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
