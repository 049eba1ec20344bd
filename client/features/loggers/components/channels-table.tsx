import { useMemo, useState } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import { Button } from '../../../components/button.tsx';
import { ConfirmAction } from '../../../components/confirm-action.tsx';
import { DataTable } from '../../../components/data-table.tsx';
import { useRetireChannel } from '../api/retire-channel.ts';
import type { Channel } from '@shared/contract/loggers.ts';
import { AddChannelForm, EditChannelForm } from './channel-form.tsx';
import { formatInterval } from './format-interval.ts';

function RetireChannelButton({ slug, channel }: { slug: string; channel: Channel }) {
  const retire = useRetireChannel(slug, channel.loggerId, channel.id);
  return (
    <ConfirmAction
      label="Retire"
      question={`Retire ${channel.key}? Its readings are kept; new ones for it go to quarantine.`}
      confirmLabel={`Retire ${channel.key}`}
      pending={retire.isPending}
      onConfirm={() => retire.mutate()}
      error={retire.error}
    />
  );
}

const range = (c: Channel) => (c.validMin === null && c.validMax === null ? '—' : `${c.validMin ?? '−∞'} … ${c.validMax ?? '+∞'}${c.unit ? ` ${c.unit}` : ''}`);

/**
 * A logger's channels: key, label, unit, quantity, valid range, expected interval, seasonal
 * period hint and whether it is retired. With `canManage`, each active channel can be edited
 * or retired (asked first) and new channels added; the form opens below the table.
 */
export function ChannelsTable({ slug, loggerId, channels, canManage }: { slug: string; loggerId: number; channels: Channel[]; canManage: boolean }) {
  const [editing, setEditing] = useState<Channel | 'new' | null>(null);
  const columns = useMemo<ColumnDef<Channel>[]>(() => {
    const base: ColumnDef<Channel>[] = [
      { id: 'key', header: 'Key', accessorFn: (c) => c.key, sortingFn: 'text', cell: ({ row }) => <span className="font-mono">{row.original.key}</span> },
      { id: 'label', meta: { phone: 'title' }, header: 'Label', accessorFn: (c) => c.label, sortingFn: 'text' },
      { id: 'unit', meta: { phone: 'value' }, header: 'Unit', accessorFn: (c) => c.unit ?? '', cell: ({ row }) => row.original.unit || '—' },
      { id: 'quantity', header: 'Quantity', accessorFn: (c) => c.quantity ?? '', cell: ({ row }) => row.original.quantity || '—' },
      { id: 'range', header: 'Valid range', enableSorting: false, cell: ({ row }) => <span className="font-mono">{range(row.original)}</span> },
      {
        id: 'interval',
        header: 'Interval',
        accessorFn: (c) => c.expectedIntervalS ?? 0,
        cell: ({ row }) => (row.original.expectedIntervalS ? formatInterval(row.original.expectedIntervalS) : 'logger’s'),
      },
      { id: 'season', header: 'Period hint', accessorFn: (c) => c.seasonalPeriodHint ?? 0, cell: ({ row }) => row.original.seasonalPeriodHint ?? '—' },
      {
        id: 'status',
        meta: { phone: 'status' },
        header: 'Status',
        accessorFn: (c) => (c.retiredAt ? 1 : 0),
        cell: ({ row }) => (row.original.retiredAt ? 'retired' : 'active'),
      },
    ];
    if (!canManage) return base;
    return [
      ...base,
      {
        id: 'actions',
        header: 'Actions',
        enableSorting: false,
        cell: ({ row }) =>
          row.original.retiredAt ? null : (
            <span className="flex flex-wrap gap-2">
              <Button size="sm" onClick={() => setEditing(row.original)} aria-label={`Edit ${row.original.key}`}>
                Edit
              </Button>
              <RetireChannelButton slug={slug} channel={row.original} />
            </span>
          ),
      },
    ];
  }, [slug, canManage]);

  return (
    <div className="grid gap-4">
      <DataTable
        caption="Channels of the logger"
        columns={columns}
        data={channels}
        getRowId={(c) => String(c.id)}
        initialSorting={[{ id: 'key', desc: false }]}
        empty="No channels."
      />
      {canManage && editing === null && (
        <div>
          <Button size="sm" onClick={() => setEditing('new')}>
            + Add a channel
          </Button>
        </div>
      )}
      {editing === 'new' && <AddChannelForm slug={slug} loggerId={loggerId} onDone={() => setEditing(null)} />}
      {editing !== null && editing !== 'new' && <EditChannelForm key={editing.id} slug={slug} channel={editing} onDone={() => setEditing(null)} />}
    </div>
  );
}
