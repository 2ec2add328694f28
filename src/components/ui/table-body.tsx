import { flexRender, type Table } from '@tanstack/react-table';

/** The rows of a TanStack table, shared by the plain and the server-paged table. */
export function TableBody<Row>({
  table,
  rowClassName,
  cellClassName,
}: {
  table: Table<Row>;
  rowClassName: string;
  cellClassName: string;
}) {
  return (
    <tbody>
      {table.getRowModel().rows.map((row) => (
        <tr key={row.id} className={rowClassName}>
          {row.getVisibleCells().map((cell) => (
            <td key={cell.id} className={cellClassName}>
              {flexRender(cell.column.columnDef.cell, cell.getContext())}
            </td>
          ))}
        </tr>
      ))}
    </tbody>
  );
}
