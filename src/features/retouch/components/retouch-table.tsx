import type { ColumnDef, SortingState } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import {
  retouchStatusLabels,
  retouchStatuses,
  type RetouchRow,
  type RetouchStatusName,
} from '../../../../server/schemas/proofs';
import { Button } from '../../../components/ui/button';
import { SelectField, TextField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { PagedTable } from '../../../components/ui/paged-table';
import { useRetouchQueue, useUpdatePick, type RetouchParams } from '../api/retouch';
import { NO_FLASH_WORDING } from '../../../../server/schemas/sitter-wording';

const chooserWords = {
  sitter: 'the sitter',
  coordinator: 'HR',
  studio: 'the studio',
  fallback: 'first after the slate',
};

/** The day's picks to retouch: filtered, sorted and paged on the server. */
export function RetouchTable({
  dayId,
  stations,
}: {
  dayId: string;
  stations: Array<{ id: string; name: string }>;
}) {
  const [page, setPage] = useState({ page: 1, pageSize: 25 });
  const [sorting, setSorting] = useState<SortingState>([{ id: 'sitter', desc: false }]);
  const [status, setStatus] = useState<RetouchStatusName | ''>('');
  const [stationId, setStationId] = useState('');
  const [search, setSearch] = useState('');
  const sort = sorting[0];
  const params: RetouchParams = {
    page: page.page,
    pageSize: page.pageSize,
    sort: (sort?.id as RetouchParams['sort'] | undefined) ?? 'sitter',
    dir: sort?.desc ? 'desc' : 'asc',
    ...(status ? { status } : {}),
    ...(stationId ? { stationId } : {}),
    ...(search.trim() ? { q: search.trim() } : {}),
  };
  const queue = useRetouchQueue(dayId, params);
  const update = useUpdatePick(dayId);

  const columns = useMemo<ColumnDef<RetouchRow, unknown>[]>(
    () => [
      {
        id: 'sitter',
        header: 'Sitter',
        cell: ({ row }) => (
          <div className="flex flex-col">
            <span className="font-medium">{row.original.sitterName}</span>
            <span className="text-ink-muted">{row.original.employeeId}</span>
          </div>
        ),
      },
      { id: 'station', header: 'Station', cell: ({ row }) => row.original.stationName },
      {
        id: 'frame',
        header: 'Pick',
        enableSorting: false,
        cell: ({ row }) => (
          <div className="flex items-center gap-2">
            <img
              src={`/api/frames/${row.original.frameId}/thumbnail`}
              alt=""
              loading="lazy"
              className="h-12 w-16 rounded-control bg-paper-sunk object-cover"
            />
            <div className="flex flex-col">
              <a
                className="font-mono text-spruce-700 underline"
                href={`/api/frames/${row.original.frameId}/original`}
                download
              >
                {row.original.fileName}
              </a>
              <span className="text-ink-muted">
                chosen by {chooserWords[row.original.chosenBy]}
              </span>
            </div>
          </div>
        ),
      },
      {
        id: 'note',
        header: 'Note and flags',
        enableSorting: false,
        cell: ({ row }) => (
          <div className="flex max-w-64 flex-col gap-1">
            {row.original.note ? <span>“{row.original.note}”</span> : null}
            {row.original.noteChangedSinceFinal ? (
              // The final may not do what the note now asks: say so, with what it was made for.
              <span className="font-medium text-caution-600">
                The note changed after the final was sent; the final was made{' '}
                {row.original.noteAtFinal ? `for “${row.original.noteAtFinal}”` : 'with no note'}.
              </span>
            ) : null}
            {row.original.glasses ? <span className="text-ink-muted">Wears glasses</span> : null}
            {row.original.flashSensitive ? (
              <span className="font-medium text-danger-700">{NO_FLASH_WORDING}</span>
            ) : null}
          </div>
        ),
      },
      {
        id: 'status',
        header: 'Status',
        cell: ({ row }) => (
          <div className="flex flex-col">
            <span>{retouchStatusLabels[row.original.status]}</span>
            <span className="text-ink-muted">
              {row.original.takenBy
                ? `with ${row.original.takenByMe ? 'you' : row.original.takenBy}`
                : 'nobody has it'}
            </span>
            {row.original.hasFinal ? (
              <a
                className="text-spruce-700 underline"
                href={`/api/picks/${row.original.pickId}/final`}
                download
              >
                Final: {row.original.finalFileName}
              </a>
            ) : null}
          </div>
        ),
      },
      {
        id: 'actions',
        header: 'Change',
        enableSorting: false,
        cell: ({ row }) => {
          const pick = row.original;
          const done = pick.status === 'done';
          // A done pick is finished, unless its note changed after the final: then it can be
          // taken again for another look.
          if (done && !pick.noteChangedSinceFinal) return null;
          if (pick.takenByMe && !done) {
            return (
              <Button
                variant="secondary"
                onClick={() =>
                  update.mutate({ pickId: pick.pickId, takenByMe: false, status: 'to_do' })
                }
              >
                Let it go
              </Button>
            );
          }
          return (
            <Button
              variant="secondary"
              onClick={() =>
                update.mutate({ pickId: pick.pickId, status: 'in_progress', takenByMe: true })
              }
            >
              {done ? 'Take it again' : 'Take it'}
            </Button>
          );
        },
      },
    ],
    [update],
  );

  const counts = queue.data?.counts;
  return (
    <div className="flex flex-col gap-3">
      {/* A refused change (taken by someone else meanwhile, say) says why. */}
      {update.isError ? <Notice tone="danger">{update.error.message}</Notice> : null}
      {counts ? (
        <p>
          {counts.to_do} to do · {counts.in_progress} in progress · {counts.done} done
          {queue.data?.picksCloseAt && new Date(queue.data.picksCloseAt) > new Date()
            ? ` · sitters may still change their choice until ${new Date(queue.data.picksCloseAt).toLocaleString('en-GB')}`
            : ''}
        </p>
      ) : null}
      <div className="flex flex-wrap gap-3">
        <div className="w-48">
          <SelectField
            label="Status"
            value={status}
            onChange={(value) => {
              setStatus(value as RetouchStatusName | '');
              setPage((current) => ({ ...current, page: 1 }));
            }}
            options={[
              { value: '', label: 'Any status' },
              ...retouchStatuses.map((value) => ({ value, label: retouchStatusLabels[value] })),
            ]}
          />
        </div>
        <div className="w-48">
          <SelectField
            label="Station"
            value={stationId}
            onChange={(value) => {
              setStationId(value);
              setPage((current) => ({ ...current, page: 1 }));
            }}
            options={[
              { value: '', label: 'All stations' },
              ...stations.map((station) => ({ value: station.id, label: station.name })),
            ]}
          />
        </div>
        <div className="w-64">
          <TextField
            label="Find a sitter or file"
            type="search"
            value={search}
            onChange={(value) => {
              setSearch(value);
              setPage((current) => ({ ...current, page: 1 }));
            }}
          />
        </div>
      </div>
      <PagedTable
        caption="Picks to retouch"
        columns={columns}
        rows={queue.data?.rows ?? []}
        total={queue.data?.total ?? 0}
        page={page}
        onPageChange={setPage}
        sorting={sorting}
        onSortingChange={(next) => {
          setSorting(next);
          setPage((current) => ({ ...current, page: 1 }));
        }}
        busy={queue.isFetching}
        rowKey={(row) => row.pickId}
      />
    </div>
  );
}
