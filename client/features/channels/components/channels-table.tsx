import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import {
  getCoreRowModel,
  getPaginationRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type PaginationState,
  type SortingState,
} from '@tanstack/react-table';
import { paths } from '../../../app/paths.ts';
import { Pager } from '../../../components/pager.tsx';
import { TableView } from '../../../components/data-table.tsx';
import type { ChannelOverviewRow, ChannelStatus } from '@shared/contract/channels.ts';
import { ChannelValue } from './channel-value.tsx';
import { LastReadingTime } from './last-reading-time.tsx';
import { Sparkline } from './sparkline.tsx';
import { StatusBadge } from './status-badge.tsx';

// Sorting by status puts the channels that need a look first.
const STATUS_ORDER: Record<ChannelStatus, number> = { 'out-of-range': 0, silent: 1, 'no-data': 2, live: 3 };
export const CHANNELS_PAGE_SIZE = 25;

/** Ticking channels to open them together: which are ticked, and what a tick or untick asks for. */
export interface ChannelChoice {
  chosen: readonly number[];
  onChoose: (row: ChannelOverviewRow, choose: boolean) => void;
}

/**
 * Every channel of the lab as a sortable, paged table (sorting runs over all rows, then the
 * page is cut): label and key (a link to the channel's page), logger, site, unit, last value,
 * last reading time, status and the last 24 hours as a sparkline. With `choice`, a checkbox
 * before each label picks channels to open together.
 */
export function ChannelsTable({ slug, rows, now, choice }: { slug: string; rows: ChannelOverviewRow[]; now: number; choice?: ChannelChoice }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'logger', desc: false }]);
  const [pagination, setPagination] = useState<PaginationState>({ pageIndex: 0, pageSize: CHANNELS_PAGE_SIZE });
  const columns = useMemo<ColumnDef<ChannelOverviewRow>[]>(
    () => [
      {
        id: 'label',
        header: 'Channel',
        accessorFn: (c) => c.label,
        sortingFn: 'text',
        meta: { phone: 'title' },
        cell: ({ row }) => (
          <span className="inline-flex items-start gap-2">
            {choice && (
              // the label is the checkbox's 44 px touch target on a phone (client/styles.css)
              <label className="shrink-0 justify-center max-sm:-my-3">
                <input
                  type="checkbox"
                  className="mt-1 size-4 shrink-0 accent-lichen max-sm:mt-0"
                  checked={choice.chosen.includes(row.original.id)}
                  onChange={(e) => choice.onChoose(row.original, e.target.checked)}
                  aria-label={`Choose ${row.original.logger.name} · ${row.original.label}`}
                />
              </label>
            )}
            <span className="inline-flex flex-col">
              <Link to={paths.labChannel.href(slug, row.original.id)} className="font-medium text-lichen-dark underline-offset-2 hover:underline">
                {row.original.label}
              </Link>
              <span className="font-mono text-xs text-ink-soft">{row.original.key}</span>
            </span>
          </span>
        ),
      },
      { id: 'logger', header: 'Logger', accessorFn: (c) => `${c.logger.name}\u0000${c.label}`, sortingFn: 'text', cell: ({ row }) => row.original.logger.name },
      { id: 'site', header: 'Site', accessorFn: (c) => c.logger.site ?? '', sortingFn: 'text', cell: ({ row }) => row.original.logger.site ?? '—' },
      { id: 'unit', header: 'Unit', accessorFn: (c) => c.unit ?? '', sortingFn: 'text', cell: ({ row }) => row.original.unit ?? '—' },
      {
        id: 'value',
        header: 'Last value',
        accessorFn: (c) => c.lastReading?.value ?? -Infinity,
        meta: { phone: 'value' },
        cell: ({ row }) => <ChannelValue value={row.original.lastReading?.value} unit={row.original.unit} />,
      },
      {
        id: 'lastReading',
        header: 'Last reading',
        accessorFn: (c) => c.lastReading?.ts ?? -1,
        meta: { phone: 'value' },
        cell: ({ row }) => <LastReadingTime reading={row.original.lastReading} timezone={row.original.logger.timezone} now={now} />,
      },
      {
        id: 'status',
        header: 'Status',
        accessorFn: (c) => STATUS_ORDER[c.status],
        sortDescFirst: false,
        meta: { phone: 'status' },
        cell: ({ row }) => <StatusBadge status={row.original.status} />,
      },
      {
        id: 'spark',
        header: 'Last 24 h',
        enableSorting: false,
        meta: { phone: 'hidden' },
        cell: ({ row }) => <Sparkline means={row.original.sparkline.means} unit={row.original.unit} />,
      },
    ],
    [slug, now, choice],
  );
  const table = useReactTable({
    data: rows,
    columns,
    getRowId: (c) => String(c.id),
    state: { sorting, pagination },
    onSortingChange: setSorting,
    onPaginationChange: setPagination,
    enableSortingRemoval: false,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
  });

  return (
    <div className="grid gap-3">
      <TableView table={table} caption="Channels of the lab" empty="No channel matches." rowAttributes={(row) => ({ 'data-status': row.original.status })} />
      {rows.length > CHANNELS_PAGE_SIZE && (
        <Pager
          label="Channel pages"
          noun="Channels"
          page={pagination.pageIndex + 1}
          pageSize={pagination.pageSize}
          total={rows.length}
          onPage={(p) => setPagination((s) => ({ ...s, pageIndex: p - 1 }))}
        />
      )}
    </div>
  );
}
