import { useState, type ReactNode } from 'react';
import { flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type ColumnDef, type SortDirection, type SortingState } from '@tanstack/react-table';

const ARIA_SORT: Record<SortDirection, 'ascending' | 'descending'> = { asc: 'ascending', desc: 'descending' };

/**
 * A table of records on TanStack Table: a caption for screen readers, sortable column
 * headers as buttons (with `aria-sort`) where a column allows sorting, and a message row
 * when there is nothing to show. Pass `sortable={false}` for data sorted by the server.
 */
export function DataTable<T>({
  caption,
  columns,
  data,
  getRowId,
  initialSorting = [],
  sortable = true,
  empty,
}: {
  caption: string;
  columns: ColumnDef<T>[];
  data: T[];
  getRowId: (row: T) => string;
  initialSorting?: SortingState;
  sortable?: boolean;
  empty: ReactNode;
}) {
  const [sorting, setSorting] = useState<SortingState>(initialSorting);
  const table = useReactTable({
    data,
    columns,
    getRowId,
    state: { sorting },
    onSortingChange: setSorting,
    enableSorting: sortable,
    enableSortingRemoval: false,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });

  return (
    <div className="overflow-x-auto rounded-xl border border-rule bg-card">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="border-b border-rule bg-paper/60 text-xs uppercase tracking-wide text-ink-soft">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => {
                const column = header.column;
                const sorted = column.getIsSorted();
                const label = flexRender(column.columnDef.header, header.getContext());
                return (
                  <th
                    key={header.id}
                    scope="col"
                    className="px-4 py-2.5 font-semibold"
                    aria-sort={column.getCanSort() ? (sorted ? ARIA_SORT[sorted] : 'none') : undefined}
                  >
                    {column.getCanSort() ? (
                      <button
                        type="button"
                        onClick={column.getToggleSortingHandler()}
                        className="inline-flex items-center gap-1 rounded uppercase tracking-wide hover:text-ink"
                      >
                        {label}
                        <span aria-hidden="true" className="font-mono text-amber">
                          {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '◇'}
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
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className="border-b border-rule/70 align-top last:border-b-0">
              {row.getVisibleCells().map((cell) => (
                <td key={cell.id} className="px-4 py-3">
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </td>
              ))}
            </tr>
          ))}
          {data.length === 0 && (
            <tr>
              <td colSpan={columns.length} className="px-4 py-6 text-center text-ink-soft">
                {empty}
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}
