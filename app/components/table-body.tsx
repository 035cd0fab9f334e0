import { flexRender, type Row } from "@tanstack/react-table";

/** The body of a TanStack table: one row per record, each cell rendered by its column. */
export function TableBody<T>({ rows, rowClassName }: { rows: Row<T>[]; rowClassName: string }) {
  return (
    <tbody>
      {rows.map((row) => (
        <tr key={row.id} className={rowClassName}>
          {row.getVisibleCells().map((cell) => (
            <td key={cell.id} className="px-2 py-1">
              {flexRender(cell.column.columnDef.cell, cell.getContext())}
            </td>
          ))}
        </tr>
      ))}
    </tbody>
  );
}
