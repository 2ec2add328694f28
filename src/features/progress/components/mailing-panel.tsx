import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { useMailings } from '../api/get-mailings';
import { useQueueMailings } from '../api/queue-mailings';
import { mailStatusLabels } from '../../../../server/schemas/sitter-wording';

const kindLabel = {
  invitation: 'Invitation',
  reminder: 'Reminder',
  day_before: 'Day before',
  proofs: 'Proofs ready',
  proofs_reminder: 'Proofs reminder',
  proofs_deadline: 'New pick date',
  portraits_ready: 'Portraits ready',
};

/** The viewer's own clock for a moment in time, with the date (the cool-down spans days). */
const whenLocal = (instant: string) =>
  new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short' }).format(
    new Date(instant),
  );

/** Sending happens in the background; this shows how far it got and each person's outcome. */
export function MailingPanel({ dayId, confirmed }: { dayId: string; confirmed: boolean }) {
  const log = useMailings(dayId);
  const queue = useQueueMailings();
  const counts = log.data?.counts ?? { queued: 0, sent: 0, failed: 0 };
  const total = counts.queued + counts.sent + counts.failed;
  const done = counts.sent + counts.failed;
  const reminders = log.data?.reminders;

  return (
    <div className="flex flex-col gap-4">
      {!confirmed ? (
        <Notice tone="info">Invitations can go out once the studio confirms this day.</Notice>
      ) : null}
      {queue.isError ? <Notice tone="danger">{queue.error.message}</Notice> : null}
      {queue.isSuccess ? (
        <Notice tone="success">
          {queue.data.queued} queued
          {queue.data.alreadyQueued ? `; ${queue.data.alreadyQueued} already had one` : ''}
          {queue.data.coolingDown
            ? `; ${queue.data.coolingDown} reminded within the last ${reminders?.cooldownHours ?? 24} hours`
            : ''}
          .
        </Notice>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <Button
          disabled={!confirmed}
          busy={queue.isPending && queue.variables?.kind === 'invitations'}
          onClick={() => queue.mutate({ dayId, kind: 'invitations' })}
        >
          Send invitations
        </Button>
        <Button
          variant="secondary"
          disabled={!confirmed || (reminders !== undefined && reminders.dueNow === 0)}
          busy={queue.isPending && queue.variables?.kind === 'reminders'}
          onClick={() => queue.mutate({ dayId, kind: 'reminders' })}
          aria-describedby={`${dayId}-reminder-state`}
        >
          {reminders && reminders.dueNow > 0
            ? `Remind the unbooked (${reminders.dueNow})`
            : 'Remind the unbooked'}
        </Button>
      </div>
      {reminders ? (
        <p id={`${dayId}-reminder-state`} className="text-sm text-ink-muted">
          {reminders.bookingClosed ? 'Booking has closed: reminders to book are over. ' : ''}
          One reminder per person every {reminders.cooldownHours} hours.
          {reminders.nextAt
            ? ` ${reminders.coolingDown} reminded recently; the next reminder is possible from ${whenLocal(reminders.nextAt)}.`
            : ''}
        </p>
      ) : null}
      {total > 0 ? (
        <div className="flex flex-col gap-1">
          <label htmlFor={`${dayId}-sending`} className="text-sm font-medium">
            Sending: {done} of {total} handled ({counts.sent} sent, {counts.failed} failed)
          </label>
          <progress id={`${dayId}-sending`} max={total} value={done} className="h-3 w-full" />
        </div>
      ) : (
        <p className="text-ink-muted">
          Nothing sent yet. Send the invitations when the day is ready.
        </p>
      )}
      {log.data && log.data.entries.length > 0 ? (
        <div className="max-h-80 overflow-auto">
          <table className="w-full text-left text-sm">
            <caption className="sr-only">Per-person mail log</caption>
            <thead>
              <tr className="border-b border-line">
                <th className="py-2 pr-3">Person</th>
                <th className="py-2 pr-3">Message</th>
                <th className="py-2 pr-3">Status</th>
              </tr>
            </thead>
            <tbody>
              {log.data.entries.map((entry) => (
                <tr
                  key={`${entry.personId}-${entry.kind}-${entry.round}`}
                  className="border-b border-line"
                >
                  <td className="py-2 pr-3">
                    {entry.name}
                    <span className="block text-ink-muted">{entry.email}</span>
                  </td>
                  <td className="py-2 pr-3">
                    {kindLabel[entry.kind]}
                    {entry.kind === 'reminder' ? ` ${entry.round}` : ''}
                  </td>
                  <td className="py-2 pr-3">
                    {mailStatusLabels[entry.status]}
                    {entry.nextReminderAt ? (
                      <span className="block text-ink-muted">
                        Next reminder from {whenLocal(entry.nextReminderAt)}
                      </span>
                    ) : null}
                    {entry.reason ? (
                      <span className="block text-danger-700">{entry.reason}</span>
                    ) : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
    </div>
  );
}
