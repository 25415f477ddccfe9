// The strip grid's table markup: a sticky plot column, and a heavier line where a block starts.
import { flexRender, type Table } from '@tanstack/react-table';
import { cn } from '../../../lib/cn';
import type { GridRow } from './grid-cell';

export function GridTable({ table }: { table: Table<GridRow> }) {
  return (
    <table className="border-collapse text-body" data-testid="strip-grid">
      <thead className="bg-sunken">
        {table.getHeaderGroups().map((group) => (
          <tr key={group.id}>
            {group.headers.map((header, i) => (
              <th
                key={header.id}
                scope="col"
                className={cn(
                  'border-b border-line px-2 py-2 text-left text-caption font-semibold text-ink-muted',
                  i === 0 && 'sticky left-0 z-10 bg-sunken',
                )}
              >
                {flexRender(header.column.columnDef.header, header.getContext())}
              </th>
            ))}
          </tr>
        ))}
      </thead>
      <tbody>
        {table.getRowModel().rows.map((row) => (
          <tr
            key={row.id}
            className={cn(
              row.original.strip.position === 1 && row.index > 0 && 'border-t-2 border-line-strong',
            )}
          >
            {row.getVisibleCells().map((cell, i) => (
              <td
                key={cell.id}
                className={cn(
                  'border-b border-r border-line p-0',
                  i === 0 && 'sticky left-0 z-10 bg-surface',
                )}
              >
                {flexRender(cell.column.columnDef.cell, cell.getContext())}
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
