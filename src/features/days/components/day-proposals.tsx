import type { DayChangeProposal } from '../../../../server/schemas/day-changes';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { useDeclineDayProposal } from '../api/decline-day-proposal';
import { useDayProposals } from '../api/list-day-proposals';

const statusLabel = { waiting: 'Waiting for the studio', applied: 'Applied', declined: 'Declined' };

/** Changes coordinators proposed; the studio opens one in the form (to check and save) or declines it. */
export function DayProposals({
  dayId,
  studio,
  onOpen,
}: {
  dayId: string;
  studio: boolean;
  onOpen: (proposal: DayChangeProposal) => void;
}) {
  const proposals = useDayProposals(dayId);
  const decline = useDeclineDayProposal();
  const list = proposals.data?.proposals ?? [];
  if (list.length === 0) return <p className="text-ink-muted">No changes proposed.</p>;
  return (
    <div className="flex flex-col gap-3">
      {decline.isError ? <Notice tone="danger">{decline.error.message}</Notice> : null}
      <ul aria-label="Proposed changes" className="flex flex-col gap-2">
        {list.map((proposal) => (
          <li key={proposal.id} className="rounded-control border border-line p-3">
            <p className="font-medium">
              {proposal.kind === 'cancel'
                ? 'Cancel the day'
                : `Hours ${proposal.changes?.opensAt}–${proposal.changes?.closesAt}, ${proposal.changes?.stations.length} station(s), ${proposal.changes?.date}`}
            </p>
            <p className="text-sm text-ink-muted">
              {proposal.proposedBy ?? 'A coordinator'} · {statusLabel[proposal.status]}
              {proposal.note ? ` · “${proposal.note}”` : ''}
            </p>
            {studio && proposal.status === 'waiting' ? (
              <div className="mt-2 flex flex-wrap gap-2">
                <Button variant="secondary" onClick={() => onOpen(proposal)}>
                  {proposal.kind === 'cancel' ? 'Review the cancellation' : 'Open in the form'}
                </Button>
                <Button
                  variant="quiet"
                  busy={decline.isPending && decline.variables?.proposalId === proposal.id}
                  onClick={() => decline.mutate({ dayId, proposalId: proposal.id })}
                >
                  Decline
                </Button>
              </div>
            ) : null}
          </li>
        ))}
      </ul>
    </div>
  );
}
