import type { ColumnDef } from '@tanstack/react-table';
import { useMemo } from 'react';
import type { StaffUser } from '../../../../server/schemas/users';
import { roleLabels } from '../../../../server/schemas/common';
import { Button } from '../../../components/ui/button';
import { DataTable } from '../../../components/ui/data-table';
import { Notice } from '../../../components/ui/notice';
import { formatDateTime } from '../../../lib/format';
import { useResendInvitation } from '../api/resend-invitation';
import { useSetMemberActive } from '../api/set-member-active';

export function TeamTable({ members, viewerId }: { members: StaffUser[]; viewerId: string }) {
  const setActive = useSetMemberActive();
  const resend = useResendInvitation();

  const columns = useMemo<ColumnDef<StaffUser, unknown>[]>(
    () => [
      {
        header: 'Name',
        accessorKey: 'displayName',
        cell: ({ row }) => (
          <div>
            <p className="font-medium">{row.original.displayName}</p>
            <p className="text-ink-muted">{row.original.email}</p>
          </div>
        ),
      },
      {
        header: 'Role',
        accessorKey: 'role',
        cell: ({ row }) =>
          `${roleLabels[row.original.role]}${row.original.clientName ? ` · ${row.original.clientName}` : ''}`,
      },
      {
        header: 'Status',
        id: 'status',
        cell: ({ row }) =>
          !row.original.active ? (
            <span className="text-danger-700">Deactivated</span>
          ) : row.original.hasPassword ? (
            <span>
              {row.original.lastSignedInAt
                ? `Last sign-in ${formatDateTime(row.original.lastSignedInAt)}`
                : 'Not signed in yet'}
            </span>
          ) : (
            <span className="text-caution-600">Invitation not yet accepted</span>
          ),
      },
      {
        header: 'Actions',
        id: 'actions',
        cell: ({ row }) => {
          const member = row.original;
          if (member.id === viewerId) return <span className="text-ink-muted">You</span>;
          return (
            <div className="flex flex-wrap gap-2">
              {member.active && !member.hasPassword ? (
                <Button variant="secondary" onClick={() => resend.mutate(member.id)}>
                  Resend invitation
                </Button>
              ) : null}
              <Button
                variant={member.active ? 'secondary' : 'primary'}
                onClick={() => setActive.mutate({ id: member.id, active: !member.active })}
                aria-label={`${member.active ? 'Deactivate' : 'Reactivate'} ${member.displayName}`}
              >
                {member.active ? 'Deactivate' : 'Reactivate'}
              </Button>
            </div>
          );
        },
      },
    ],
    [resend, setActive, viewerId],
  );

  return (
    <div className="flex flex-col gap-3">
      {setActive.isError ? <Notice tone="danger">{setActive.error.message}</Notice> : null}
      {resend.isSuccess ? <Notice tone="success">{resend.data.message}</Notice> : null}
      <DataTable columns={columns} data={members} caption="Studio team and client coordinators" />
    </div>
  );
}
