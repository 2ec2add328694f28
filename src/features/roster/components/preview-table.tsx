import type { ColumnDef, SortingState } from '@tanstack/react-table';
import { useState, type ReactNode } from 'react';
import {
  rosterFieldLabels,
  type PreviewKind,
  type PreviewRow,
  type RosterField,
} from '../../../../server/schemas/roster';
import { EmptyState } from '../../../components/ui/empty-state';
import { PagedTable } from '../../../components/ui/paged-table';
import { TextField } from '../../../components/ui/field';
import { usePreviewRows } from '../api/list-preview-rows';

export const kindLabels: Record<PreviewKind, string> = {
  add: 'To add',
  update: 'To update',
  conflict: 'Same e-mail, other id',
  unchanged: 'Unchanged',
  error: 'In error',
  missing: 'Not in the file',
};

const labelOf = (field: string) =>
  field === 'extras'
    ? 'Extra columns'
    : field === 'active'
      ? 'Status'
      : (rosterFieldLabels[field as RosterField] ?? field);

const show = (value: unknown) =>
  value === null || value === undefined || value === ''
    ? '(empty)'
    : typeof value === 'object'
      ? Object.entries(value as Record<string, string>)
          .map(([key, item]) => `${key}: ${item}`)
          .join(', ') || '(none)'
      : typeof value === 'boolean'
        ? value
          ? 'active'
          : 'inactive'
        : String(value);

function Messages({
  messages,
  className,
}: {
  messages: Record<string, string>;
  className: string;
}) {
  const entries = Object.entries(messages);
  if (entries.length === 0) return null;
  return (
    <ul className={className}>
      {entries.map(([field, message]) => (
        <li key={field}>
          <span className="font-medium">{labelOf(field)}</span>: {message}
        </li>
      ))}
    </ul>
  );
}

function Changes({ row }: { row: PreviewRow }) {
  if (!row.before || row.changedFields.length === 0) return null;
  const before = row.before as Record<string, unknown>;
  const after = row.values as Record<string, unknown>;
  return (
    <ul>
      {row.changedFields.map((field) => (
        <li key={field}>
          <span className="font-medium">{labelOf(field)}</span>:{' '}
          <del className="text-ink-muted">{show(before[field])}</del> →{' '}
          <ins className="no-underline">{show(after[field])}</ins>
        </li>
      ))}
    </ul>
  );
}

/** A cell that wraps anywhere: a value with no spaces must not stretch the table off screen. */
function Long({ children, wide = false }: { children: ReactNode; wide?: boolean }) {
  return (
    <div className={`${wide ? 'max-w-md' : 'max-w-56'} [overflow-wrap:anywhere]`}>{children}</div>
  );
}

function Details({ row }: { row: PreviewRow }) {
  const warnings = <Messages messages={row.warnings} className="text-caution-600" />;
  if (row.kind === 'error' || row.kind === 'conflict') {
    return (
      <>
        <Messages messages={row.errors} className="text-danger-700" />
        {row.kind === 'conflict' ? <Changes row={row} /> : null}
        {warnings}
      </>
    );
  }
  if (row.kind === 'missing')
    return <span>Marked inactive only if you choose so (the box under the table)</span>;
  return (
    <>
      {row.kind === 'update' ? (
        <Changes row={row} />
      ) : (
        <span className="text-ink-muted">{row.values.office ?? ''}</span>
      )}
      {warnings}
    </>
  );
}

// Each sortable column has an accessor: TanStack Table offers sorting only on those. The
// server sorts (by row, kind, family then given name, e-mail); the accessors are not used.
const columns: ColumnDef<PreviewRow, unknown>[] = [
  {
    id: 'position',
    header: 'Row',
    accessorFn: (row) => row.position,
    cell: ({ row }) => row.original.rowNumber ?? '—',
  },
  {
    id: 'kind',
    header: 'What happens',
    accessorFn: (row) => row.kind,
    cell: ({ row }) => kindLabels[row.original.kind],
  },
  {
    id: 'name',
    header: 'Name',
    accessorFn: (row) => `${row.values.familyName ?? ''} ${row.values.givenName ?? ''}`,
    cell: ({ row }) => (
      <Long>
        {`${row.original.values.givenName ?? ''} ${row.original.values.familyName ?? ''}`.trim() ||
          '(no name)'}
      </Long>
    ),
  },
  {
    id: 'email',
    header: 'E-mail',
    accessorFn: (row) => row.values.email,
    cell: ({ row }) => <Long>{row.original.values.email || '(none)'}</Long>,
  },
  {
    id: 'details',
    header: 'Details',
    enableSorting: false,
    cell: ({ row }) => (
      <Long wide>
        <Details row={row.original} />
      </Long>
    ),
  },
];

const captionOf = (kind: PreviewKind | 'all' | 'warned') =>
  kind === 'all' ? 'all rows' : kind === 'warned' ? 'rows with a warning' : kindLabels[kind];

/** The previewed rows of one kind, paged, sorted and searched on the server. */
export function PreviewTable({
  clientId,
  draftId,
  kind,
  caption,
}: {
  clientId: string;
  draftId: string;
  kind: PreviewKind | 'all' | 'warned';
  caption?: string;
}) {
  const [page, setPage] = useState({ page: 1, pageSize: 25 });
  const [sorting, setSorting] = useState<SortingState>([]);
  const [search, setSearch] = useState('');
  const sort = sorting[0];
  const rows = usePreviewRows(clientId, draftId, {
    kind,
    page: page.page,
    pageSize: page.pageSize,
    q: search,
    sort: (sort?.id as 'position' | 'name' | 'email' | 'kind' | undefined) ?? 'position',
    direction: sort?.desc ? 'desc' : 'asc',
  });

  return (
    <div className="flex flex-col gap-3">
      <div className="max-w-sm">
        <TextField
          label={caption ? `Search: ${caption}` : 'Search the preview'}
          type="search"
          value={search}
          onChange={(value) => {
            setSearch(value);
            setPage((current) => ({ ...current, page: 1 }));
          }}
        />
      </div>
      {rows.data && rows.data.total === 0 && !search ? (
        <EmptyState title="Nothing here">No rows of this kind in the file.</EmptyState>
      ) : (
        <PagedTable
          caption={caption ?? `Preview: ${captionOf(kind)}`}
          columns={columns}
          rows={rows.data?.rows ?? []}
          total={rows.data?.total ?? 0}
          page={page}
          onPageChange={setPage}
          sorting={sorting}
          onSortingChange={(next) => {
            setSorting(next);
            setPage((current) => ({ ...current, page: 1 }));
          }}
          busy={rows.isFetching}
          rowKey={(row) => String(row.position)}
        />
      )}
    </div>
  );
}
