import { flexRender, getCoreRowModel, useReactTable, type ColumnDef } from '@tanstack/react-table';
import { TableBody } from './table-body';

/** A plain accessible table over TanStack Table's model. */
export function DataTable<Row>({
  columns,
  data,
  caption,
}: {
  columns: ColumnDef<Row, unknown>[];
  data: Row[];
  caption: string;
}) {
  const table = useReactTable({ data, columns, getCoreRowModel: getCoreRowModel() });
  return (
    <div className="overflow-x-auto rounded-card border border-line bg-paper-raised">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-paper-sunk text-ink-muted">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => (
                <th key={header.id} scope="col" className="px-4 py-3 font-semibold">
                  {header.isPlaceholder
                    ? null
                    : flexRender(header.column.columnDef.header, header.getContext())}
                </th>
              ))}
            </tr>
          ))}
        </thead>
        <TableBody
          table={table}
          rowClassName="border-t border-line"
          cellClassName="px-4 py-3 align-middle"
        />
      </table>
    </div>
  );
}
