import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { ConfirmStep } from '../../../components/ui/confirm-step';
import { TextField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { formatCalendarDate, formatDateTime } from '../../../lib/format';
import { useProofProgress, useReleaseProofs, useRemindProofs } from '../api/day-proofs';

const when = (iso: string) =>
  new Intl.DateTimeFormat('en-GB', { dateStyle: 'long', timeStyle: 'short' }).format(new Date(iso));

const weekAfter = (date: string) =>
  new Date(Date.parse(`${date}T00:00:00Z`) + 7 * 86_400_000).toISOString().slice(0, 10);

/**
 * Proofs for a day: the studio sends them once the review is done (with the pick deadline);
 * studio and coordinator follow how many have chosen and remind the rest.
 */
export function ProofsPanel({
  dayId,
  dayDate,
  canRelease,
}: {
  dayId: string;
  dayDate: string;
  canRelease: boolean;
}) {
  const { data } = useProofProgress(dayId);
  const release = useReleaseProofs(dayId);
  const remind = useRemindProofs(dayId);
  const [closeOn, setCloseOn] = useState(() => weekAfter(dayDate));
  const [message, setMessage] = useState<{ tone: 'success' | 'danger'; text: string } | null>(null);
  const [confirming, setConfirming] = useState(false);
  if (!data) return null;
  const failed = (error: Error) =>
    setMessage({ tone: 'danger', text: error instanceof ApiError ? error.message : error.message });

  return (
    <div className="flex flex-col gap-3">
      {data.released ? (
        <p>
          Proofs sent {data.releasedAt ? when(data.releasedAt) : ''}; choosing{' '}
          {data.open ? 'closes' : 'closed'} {data.picksCloseAt ? when(data.picksCloseAt) : ''}.{' '}
          <strong>
            {data.picked} of {data.withProofs}
          </strong>{' '}
          have chosen.
        </p>
      ) : (
        <p>
          {data.withProofs} sitter{data.withProofs === 1 ? ' has' : 's have'} matched frames. Send
          the proofs when the review is done: each sitter gets an e-mail with a link to their own
          frames, and chooses{' '}
          {data.settings.picksIncluded === 1
            ? 'one portrait'
            : `${data.settings.picksIncluded} portraits`}
          .
        </p>
      )}
      {canRelease ? (
        <div className="flex flex-wrap items-end gap-3">
          <div className="w-56">
            <TextField
              label="Last day to choose"
              type="date"
              value={closeOn}
              onChange={setCloseOn}
            />
          </div>
          {/* The e-mails go at once and are not called back: one more step, saying so. */}
          <ConfirmStep
            open={confirming}
            label="Confirm sending the proofs"
            trigger={
              data.released ? 'Send proofs to anyone new, and set the deadline' : 'Send proofs'
            }
            confirm="Send them now"
            busy={release.isPending}
            disabled={data.withProofs === 0 || closeOn === ''}
            onOpen={() => {
              setMessage(null);
              setConfirming(true);
            }}
            onCancel={() => setConfirming(false)}
            onConfirm={() =>
              release.mutate(
                { picksCloseOn: closeOn },
                {
                  onSuccess: (result) =>
                    setMessage({
                      tone: 'success',
                      // A second click finds everyone sent already: say that, not "0 queued".
                      text: `${
                        result.queued === 0 && result.alreadySent > 0
                          ? `Proofs are sent or on their way to all ${result.alreadySent} sitters; nobody new to send them to.`
                          : `Proofs queued for ${result.queued} sitter${result.queued === 1 ? '' : 's'}${result.alreadySent > 0 ? ` (${result.alreadySent} had them already)` : ''}.`
                      }${
                        result.toldOfNewDate > 0
                          ? ` The new date to choose by is mailed to the ${result.toldOfNewDate} sent their proofs before.`
                          : ''
                      }`,
                    }),
                  onError: failed,
                  onSettled: () => setConfirming(false),
                },
              )
            }
          >
            <p>
              {data.released
                ? `Sitters with frames who were not sent their proofs yet get an e-mail with their link now. If the last day to choose moved, everyone sent their proofs before is mailed the new date.`
                : `Each of the ${data.withProofs} sitter${data.withProofs === 1 ? '' : 's'} with matched frames gets an e-mail with a link to their own frames now.`}{' '}
              Choosing closes at the end of {closeOn ? formatCalendarDate(closeOn) : ''}. An e-mail
              sent is not called back.
            </p>
          </ConfirmStep>
        </div>
      ) : null}
      {data.released && data.open && data.notPicked > 0 ? (
        <div>
          <Button
            variant="secondary"
            busy={remind.isPending}
            onClick={() =>
              remind.mutate(undefined, {
                onSuccess: (result) =>
                  setMessage({
                    tone: 'success',
                    text:
                      result.queued > 0
                        ? `Reminder queued for ${result.queued}.`
                        : `Nobody was reminded: the ${result.coolingDown} not chosen yet had a reminder lately${result.nextReminderAt ? `; the next is possible from ${formatDateTime(result.nextReminderAt)}` : ''}.`,
                  }),
                onError: failed,
              })
            }
          >
            Remind the {data.notPicked} who have not chosen
          </Button>
        </div>
      ) : null}
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
    </div>
  );
}
