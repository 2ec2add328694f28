import {
  flexRender,
  getCoreRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
} from '@tanstack/react-table';
import { Button } from './button';
import { TableBody } from './table-body';

export interface PageState {
  page: number;
  pageSize: number;
}

/**
 * A table whose paging and sorting happen on the server (TanStack Table in manual mode). The
 * caller keeps the previous page on screen while the next loads (keepPreviousData).
 */
export function PagedTable<Row>({
  columns,
  rows,
  total,
  page,
  onPageChange,
  sorting,
  onSortingChange,
  caption,
  busy,
  rowKey,
  dense = false,
}: {
  columns: ColumnDef<Row, unknown>[];
  rows: Row[];
  total: number;
  page: PageState;
  onPageChange: (page: PageState) => void;
  sorting: SortingState;
  onSortingChange: (sorting: SortingState) => void;
  caption: string;
  busy?: boolean;
  rowKey: (row: Row) => string;
  /** One line per row, vertically centred: for long lists read row by row (the people directory). */
  dense?: boolean;
}) {
  const pageCount = Math.max(1, Math.ceil(total / page.pageSize));
  const table = useReactTable({
    data: rows,
    columns,
    getCoreRowModel: getCoreRowModel(),
    getRowId: rowKey,
    manualPagination: true,
    manualSorting: true,
    enableMultiSort: false,
    // Every column's first click sorts ascending (TanStack starts numbers and booleans descending).
    sortDescFirst: false,
    pageCount,
    state: { sorting, pagination: { pageIndex: page.page - 1, pageSize: page.pageSize } },
    onSortingChange: (updater) =>
      onSortingChange(typeof updater === 'function' ? updater(sorting) : updater),
  });
  const first = total === 0 ? 0 : (page.page - 1) * page.pageSize + 1;
  const last = Math.min(total, page.page * page.pageSize);

  return (
    <div className="flex flex-col gap-3">
      <div
        className="overflow-x-auto rounded-card border border-line bg-paper-raised"
        aria-busy={busy || undefined}
      >
        <table className={`w-full border-collapse text-left text-sm ${busy ? 'opacity-70' : ''}`}>
          <caption className="sr-only">{caption}</caption>
          <thead className="bg-paper-sunk text-ink-muted">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  const label = flexRender(header.column.columnDef.header, header.getContext());
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      className="px-3 py-2 font-semibold"
                      aria-sort={
                        sorted === 'asc'
                          ? 'ascending'
                          : sorted === 'desc'
                            ? 'descending'
                            : undefined
                      }
                    >
                      {header.column.getCanSort() ? (
                        <button
                          type="button"
                          // The whole heading cell is the button: a click beside the words sorts too.
                          className="inline-flex min-h-touch w-full items-center gap-1 text-left font-semibold hover:text-ink"
                          onClick={header.column.getToggleSortingHandler()}
                        >
                          {label}
                          <span aria-hidden>
                            {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                          </span>
                        </button>
                      ) : (
                        label
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <TableBody
            table={table}
            rowClassName={`border-t border-line ${dense ? 'align-middle' : 'align-top'}`}
            cellClassName={dense ? 'whitespace-nowrap px-3 py-0.5' : 'px-3 py-2'}
          />
        </table>
      </div>
      <nav aria-label={`${caption}: pages`} className="flex flex-wrap items-center gap-3 text-sm">
        <span aria-live="polite">
          {total === 0
            ? 'No rows'
            : `Rows ${first.toLocaleString()}–${last.toLocaleString()} of ${total.toLocaleString()}`}
        </span>
        <Button
          variant="secondary"
          disabled={page.page <= 1}
          onClick={() => onPageChange({ ...page, page: page.page - 1 })}
        >
          Previous page
        </Button>
        <Button
          variant="secondary"
          disabled={page.page >= pageCount}
          onClick={() => onPageChange({ ...page, page: page.page + 1 })}
        >
          Next page
        </Button>
        <label className="flex items-center gap-2">
          Rows per page
          <select
            className="min-h-touch rounded-control border border-line-strong bg-paper-raised px-2"
            value={page.pageSize}
            onChange={(event) => onPageChange({ page: 1, pageSize: Number(event.target.value) })}
          >
            {[25, 50, 100].map((size) => (
              <option key={size} value={size}>
                {size}
              </option>
            ))}
          </select>
        </label>
      </nav>
    </div>
  );
}
