import { useId, useState, type ReactNode } from 'react';
import {
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type Column,
  type ColumnDef,
  type Row,
  type RowData,
  type SortDirection,
  type SortingState,
  type Table,
} from '@tanstack/react-table';

/**
 * Where a column's cell goes when a table is shown as stacked rows on a narrow screen (below
 * Tailwind's `sm`, 640 px): `title` (the row's name, top left), `status` (top right), `value`
 * (the reading or time people look for, right under the name), `detail` (a "label value" line
 * below; the default) or `hidden` (left out on phones, e.g. a sparkline or a wide preview).
 */
export type PhoneRole = 'title' | 'status' | 'value' | 'detail' | 'hidden';

declare module '@tanstack/react-table' {
  // TanStack's documented way to type column meta (module augmentation); the type parameters are the library's own.
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  interface ColumnMeta<TData extends RowData, TValue> {
    /** How the column shows on a phone; see {@link PhoneRole}. */
    phone?: PhoneRole;
  }
}

/**
 * The column's label before a value or detail cell on a phone, drawn from `data-label` as
 * generated content: it is not part of the cell's text (the column header, read by screen
 * readers, already names it) and appears only below 640 px.
 */
const PHONE_LABEL =
  'max-sm:before:mr-2 max-sm:before:text-xs max-sm:before:font-semibold max-sm:before:uppercase max-sm:before:tracking-wide max-sm:before:text-ink-soft max-sm:before:content-[attr(data-label)]';

const ARIA_SORT: Record<SortDirection, 'ascending' | 'descending'> = { asc: 'ascending', desc: 'descending' };

/**
 * Per phone role: the cell's place in the stacked row (a two-column grid: name and status on
 * the first line, the value under them, details below) and whether it carries its column's
 * label there. From `sm` up every cell is an ordinary table cell.
 */
const PHONE_CELL: Record<PhoneRole, { className: string; labelled: boolean }> = {
  title: { className: 'max-sm:order-1 max-sm:col-start-1 max-sm:min-w-0 max-sm:font-medium max-sm:break-words', labelled: false },
  status: { className: 'max-sm:order-2 max-sm:col-start-2 max-sm:justify-self-end', labelled: false },
  value: { className: 'max-sm:order-3 max-sm:col-span-2 max-sm:min-w-0 max-sm:break-words', labelled: true },
  detail: { className: 'max-sm:order-4 max-sm:col-span-2 max-sm:min-w-0 max-sm:break-words', labelled: true },
  hidden: { className: 'max-sm:hidden', labelled: false },
};

/** A column's phone role (`detail` unless the column says otherwise). */
export function phoneRole<T>(column: Column<T, unknown>): PhoneRole {
  return column.columnDef.meta?.phone ?? 'detail';
}

/** A column's header as plain text, for the phone's sort menu and cell labels (the column id when the header is not text). */
function headerText<T>(column: Column<T, unknown>): string {
  const header = column.columnDef.header;
  return typeof header === 'string' ? header : column.id;
}

/**
 * The sort menu shown instead of the column headers on a phone: one choice per sortable
 * column and direction, bound to the same TanStack sorting state as the header buttons.
 */
function PhoneSortMenu<T>({ table }: { table: Table<T> }) {
  const id = useId();
  const sortable = table.getAllLeafColumns().filter((c) => c.getCanSort());
  if (sortable.length === 0) return null;
  const current = table.getState().sorting[0];
  const value = current ? `${current.id}:${current.desc ? 'desc' : 'asc'}` : '';
  return (
    <div className="flex items-center gap-2 border-b border-rule px-3 py-2 text-sm sm:hidden">
      <label htmlFor={id} className="font-medium text-ink-soft">
        Sort by
      </label>
      <select
        id={id}
        value={value}
        onChange={(e) => {
          const [columnId, direction] = e.target.value.split(':');
          table.setSorting([{ id: columnId, desc: direction === 'desc' }]);
        }}
        className="min-h-11 min-w-0 flex-1 rounded-lg border border-rule bg-card px-2 text-ink"
      >
        {!current && <option value="">as listed</option>}
        {sortable.flatMap((c) => [
          <option key={`${c.id}:asc`} value={`${c.id}:asc`}>
            {headerText(c)}, ascending
          </option>,
          <option key={`${c.id}:desc`} value={`${c.id}:desc`}>
            {headerText(c)}, descending
          </option>,
        ])}
      </select>
    </div>
  );
}

/**
 * Renders a TanStack table built by the caller: a caption for screen readers, sortable column
 * headers as buttons (with `aria-sort`), a message row when there are no rows. From 640 px up
 * it is an ordinary table (scrolling sideways inside its own box if it must); below that each
 * row becomes a stacked block laid out by its columns' phone roles (see {@link PhoneRole}),
 * the text headers give way to a "Sort by" menu (a control in a header, such as "select
 * all", stays visible), and nothing scrolls sideways. For tables that
 * need their own row model (paging); {@link DataTable} builds the usual one.
 */
export function TableView<T>({
  table,
  caption,
  empty,
  rowAttributes,
}: {
  table: Table<T>;
  caption: string;
  empty: ReactNode;
  /** Extra attributes for a row's `<tr>` (e.g. `data-status` for tests and styling). */
  rowAttributes?: (row: Row<T>) => Record<`data-${string}`, string>;
}) {
  const rows = table.getRowModel().rows;
  const columnCount = table.getAllLeafColumns().length;
  return (
    <div className="rounded-xl border border-rule bg-card sm:overflow-x-auto">
      <PhoneSortMenu table={table} />
      <table className="w-full border-collapse text-left text-sm max-sm:block">
        <caption className="sr-only">{caption}</caption>
        <thead className="border-b border-rule bg-paper/60 text-xs uppercase tracking-wide text-ink-soft max-sm:block max-sm:border-0">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id} className="max-sm:flex max-sm:px-3">
              {group.headers.map((header) => {
                const column = header.column;
                const sorted = column.getIsSorted();
                const label = flexRender(column.columnDef.header, header.getContext());
                return (
                  <th
                    key={header.id}
                    scope="col"
                    // on a phone a text header gives way to the sort menu; a control in a header (select all) stays
                    className={`px-4 py-2.5 font-semibold ${typeof column.columnDef.header === 'string' ? 'max-sm:hidden' : 'max-sm:block max-sm:p-0'}`}
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
        <tbody className="max-sm:block">
          {rows.map((row) => (
            <tr
              key={row.id}
              {...rowAttributes?.(row)}
              className="border-b border-rule/70 align-top last:border-b-0 max-sm:grid max-sm:grid-cols-[minmax(0,1fr)_auto] max-sm:gap-x-3 max-sm:gap-y-1 max-sm:px-3 max-sm:py-3"
            >
              {row.getVisibleCells().map((cell) => {
                const role = phoneRole(cell.column);
                const look = PHONE_CELL[role];
                return (
                  <td
                    key={cell.id}
                    data-phone={role}
                    data-label={look.labelled ? headerText(cell.column) : undefined}
                    className={`px-4 py-3 max-sm:block max-sm:p-0 ${look.labelled ? PHONE_LABEL : ''} ${look.className}`}
                  >
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                );
              })}
            </tr>
          ))}
          {rows.length === 0 && (
            <tr className="max-sm:block">
              <td colSpan={columnCount} className="px-4 py-6 text-center text-ink-soft max-sm:block">
                {empty}
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}

/**
 * A table of records on TanStack Table, shown by {@link TableView}: sortable headers where a
 * column allows sorting, stacked rows on phones (columns declare their place with
 * `meta: { phone: … }`). Pass `sortable={false}` for data sorted by the server.
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
  return <TableView table={table} caption={caption} empty={empty} />;
}
