import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import type { DayChangeProposal } from '../../../../server/schemas/day-changes';
import type { Day } from '../../../../server/schemas/days';
import { Card } from '../../../components/ui/card';
import { teamQueryOptions } from '../../team/api/list-team';
import { CancelDayPanel } from './cancel-day-panel';
import { DayProposals } from './day-proposals';
import { EditDayForm } from './edit-day-form';

/** The day page's change cards: proposals, the edit form and cancelling the day. */
export function DayChangesPanel({ day, studio }: { day: Day; studio: boolean }) {
  const team = useQuery({ ...teamQueryOptions(), enabled: studio });
  const [opened, setOpened] = useState<DayChangeProposal | null>(null);
  const photographers = studio
    ? (team.data?.users ?? []).filter((user) => user.role === 'photographer' && user.active)
    : null;
  const editing = opened?.kind === 'edit' && opened.changes ? opened : null;
  return (
    <>
      <Card title={studio ? 'Change this day' : 'Propose a change'} className="lg:col-span-2">
        {studio && team.isPending ? (
          <p role="status">Loading the team…</p>
        ) : (
          <EditDayForm
            key={editing?.id ?? 'as-it-is'}
            day={day}
            photographers={photographers}
            proposal={editing?.changes ? { id: editing.id, changes: editing.changes } : undefined}
          />
        )}
      </Card>
      <Card title="Proposed changes">
        <DayProposals dayId={day.id} studio={studio} onOpen={setOpened} />
      </Card>
      <Card title={studio ? 'Cancel the day' : 'Propose cancelling the day'}>
        <CancelDayPanel
          key={opened?.kind === 'cancel' ? opened.id : 'none'}
          day={day}
          studio={studio}
          proposalId={opened?.kind === 'cancel' ? opened.id : undefined}
        />
      </Card>
    </>
  );
}
