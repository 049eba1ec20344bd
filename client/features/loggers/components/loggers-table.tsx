import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import type { ColumnDef } from '@tanstack/react-table';
import { paths } from '../../../app/paths.ts';
import { DataTable } from '../../../components/data-table.tsx';
import { Instant } from '../../../components/clock/instant.tsx';
import type { LoggerSummary } from '@shared/contract/loggers.ts';
import { formatInterval } from './format-interval.ts';
import { LOGGER_STATUS_ORDER, LoggerStatusBadge, loggerStatus } from './logger-status.tsx';

/**
 * The lab's loggers: name (a link to the logger's page), site, time zone, expected interval,
 * number of channels, when it was last heard from (relative and exact) and its status. Retired loggers,
 * when listed, are marked as such. Sortable by every column; never-seen loggers sort first
 * when sorting by last seen ascending, so silent ones are easy to find.
 */
export function LoggersTable({ slug, loggers }: { slug: string; loggers: LoggerSummary[] }) {
  // the moment the list is drawn, for "silent"
  const now = Date.now();
  const columns = useMemo<ColumnDef<LoggerSummary>[]>(
    () => [
      {
        id: 'name',
        header: 'Name',
        accessorFn: (l) => l.name,
        sortingFn: 'text',
        meta: { phone: 'title' },
        cell: ({ row }) => (
          <span className="inline-flex flex-wrap items-center gap-2">
            <Link to={paths.labLogger.href(slug, row.original.id)} className="font-medium text-lichen-dark underline-offset-2 hover:underline">
              {row.original.name}
            </Link>
            {row.original.retiredAt && <span className="rounded-full border border-rule px-2 text-xs text-ink-soft">retired</span>}
          </span>
        ),
      },
      { id: 'site', header: 'Site', accessorFn: (l) => l.site ?? '', sortingFn: 'text', cell: ({ row }) => row.original.site ?? '—' },
      { id: 'timezone', header: 'Time zone', accessorFn: (l) => l.timezone, sortingFn: 'text' },
      {
        id: 'interval',
        header: 'Expected interval',
        accessorFn: (l) => l.expectedIntervalS,
        cell: ({ row }) => formatInterval(row.original.expectedIntervalS),
      },
      {
        id: 'channels',
        header: 'Channels',
        accessorFn: (l) => l.channelCount,
        cell: ({ row }) => <span className="font-mono">{row.original.channelCount}</span>,
      },
      {
        id: 'lastSeen',
        header: 'Last seen',
        accessorFn: (l) => (l.lastSeenAt ? Date.parse(l.lastSeenAt) : -1),
        meta: { phone: 'value' },
        cell: ({ row }) => <Instant at={row.original.lastSeenAt} kind="readings" loggerZone={row.original.timezone} relative />,
      },
      {
        id: 'status',
        header: 'Status',
        accessorFn: (l) => LOGGER_STATUS_ORDER.indexOf(loggerStatus(l, now)),
        meta: { phone: 'status' },
        cell: ({ row }) => <LoggerStatusBadge status={loggerStatus(row.original, now)} />,
      },
    ],
    [slug, now],
  );
  return (
    <DataTable
      caption="Loggers of the lab"
      columns={columns}
      data={loggers}
      getRowId={(l) => String(l.id)}
      initialSorting={[{ id: 'name', desc: false }]}
      empty="No loggers yet."
    />
  );
}
