import { useState } from 'react';
import type { Day } from '../../../../server/schemas/days';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { useCancelDay } from '../api/cancel-day';
import { useProposeDayChange } from '../api/propose-day-change';

/**
 * Cancelling the whole day, behind a second step that says what it does. The studio cancels
 * (every booking is cancelled and each sitter gets a calendar cancellation); a coordinator
 * proposes it to the studio.
 */
export function CancelDayPanel({
  day,
  studio,
  proposalId,
}: {
  day: Day;
  studio: boolean;
  proposalId?: string | undefined;
}) {
  const [asking, setAsking] = useState(proposalId !== undefined);
  const [reason, setReason] = useState('');
  const cancel = useCancelDay();
  const propose = useProposeDayChange();
  const failure = cancel.error ?? propose.error;
  if (cancel.isSuccess) {
    return (
      <Notice tone="success">
        The day is cancelled; {cancel.data.outcome.cancelled.length} sitters are being told.
      </Notice>
    );
  }
  if (propose.isSuccess) return <Notice tone="success">Sent: the studio will decide.</Notice>;
  if (!asking) {
    return (
      <Button variant="secondary" onClick={() => setAsking(true)}>
        {studio ? 'Cancel this day…' : 'Propose cancelling this day…'}
      </Button>
    );
  }
  return (
    <div className="flex flex-col gap-3">
      {failure ? <Notice tone="danger">{failure.message}</Notice> : null}
      <Notice tone="caution">
        {studio
          ? `All ${day.booked} bookings are cancelled and each sitter gets a calendar cancellation. This cannot be undone.`
          : 'The studio decides; nothing changes until then.'}
      </Notice>
      <TextField
        label={studio ? 'Reason (kept with the day)' : 'Note for the studio'}
        value={reason}
        onChange={setReason}
        maxLength={300}
      />
      <div className="flex flex-wrap gap-3">
        <Button
          variant="danger"
          busy={cancel.isPending || propose.isPending}
          onClick={() =>
            studio
              ? cancel.mutate({ dayId: day.id, reason, proposalId })
              : propose.mutate({ dayId: day.id, proposal: { kind: 'cancel', note: reason } })
          }
        >
          {studio ? 'Yes, cancel the day' : 'Send the proposal'}
        </Button>
        <Button variant="quiet" onClick={() => setAsking(false)}>
          Keep the day
        </Button>
      </div>
    </div>
  );
}
