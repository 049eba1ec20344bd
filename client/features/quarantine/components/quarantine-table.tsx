import { useMemo, useState } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import { Button } from '../../../components/button.tsx';
import { DataTable } from '../../../components/data-table.tsx';
import { Instant } from '../../../components/clock/instant.tsx';
import type { QuarantinedRow, ResubmitRow } from '@shared/contract/quarantine.ts';
import { FixRowForm } from './fix-row-form.tsx';
import { isReasonCode, REASON_LABELS } from './reason-labels.ts';
import { OTHER_REASON, plainReason, readingName, UNLISTED_LOGGER } from '../messages.ts';

const mono = (text: string | null) => (text === null ? <span className="text-ink-soft">—</span> : <span className="break-all font-mono text-xs">{text}</span>);

/** The "Fix" button of one row, turning into its fix form. */
function FixCell({ row, pending, onResubmit }: { row: QuarantinedRow; pending: boolean; onResubmit: (rows: ResubmitRow[]) => void }) {
  const [open, setOpen] = useState(false);
  if (!open) {
    return (
      <Button size="sm" onClick={() => setOpen(true)} aria-label={`Fix ${readingName(row)}`}>
        Fix
      </Button>
    );
  }
  return <FixRowForm row={row} pending={pending} onResubmit={(fixed) => onResubmit([fixed])} onCancel={() => setOpen(false)} />;
}

/**
 * One page of quarantined rows (newest first, as the server sorts them): a checkbox per row
 * (and one for the page), the reason, logger, channel, time, value and raw line as they
 * arrived, when it was received, and "Fix" to correct and re-submit a single row.
 */
export function QuarantineTable({
  rows,
  loggerNames,
  loggerZones,
  selected,
  onSelect,
  pending,
  onResubmit,
}: {
  rows: QuarantinedRow[];
  loggerNames: Map<number, string>;
  /** Each logger's IANA zone, so a row's received time shows on its logger's clock (by default). */
  loggerZones?: ReadonlyMap<number, string>;
  selected: ReadonlySet<number>;
  onSelect: (next: Set<number>) => void;
  pending: boolean;
  onResubmit: (rows: ResubmitRow[]) => void;
}) {
  const columns = useMemo<ColumnDef<QuarantinedRow>[]>(() => {
    const all = rows.length > 0 && rows.every((r) => selected.has(r.id));
    const toggle = (id: number, on: boolean) => {
      const next = new Set(selected);
      if (on) next.add(id);
      else next.delete(id);
      onSelect(next);
    };
    return [
      {
        id: 'select',
        meta: { phone: 'status' },
        // each checkbox inside a label: on a phone the label is the 44 px touch target (client/styles.css)
        header: () => (
          <label className="justify-center">
            <input
              type="checkbox"
              aria-label="Select every row on this page"
              checked={all}
              onChange={(e) => onSelect(e.target.checked ? new Set(rows.map((r) => r.id)) : new Set())}
              className="h-4 w-4 accent-lichen"
            />
          </label>
        ),
        cell: ({ row }) => (
          <label className="justify-center">
            <input
              type="checkbox"
              aria-label={`Select ${readingName(row.original)}`}
              checked={selected.has(row.original.id)}
              onChange={(e) => toggle(row.original.id, e.target.checked)}
              className="h-4 w-4 accent-lichen"
            />
          </label>
        ),
      },
      {
        id: 'reason',
        meta: { phone: 'title' },
        header: 'Reason',
        cell: ({ row }) => (
          <span className="grid gap-0.5">
            <span className="font-medium">{isReasonCode(row.original.reasonCode) ? REASON_LABELS[row.original.reasonCode] : OTHER_REASON}</span>
            <span className="text-xs text-ink-soft">{plainReason(row.original.reason)}</span>
          </span>
        ),
      },
      {
        id: 'logger',
        header: 'Logger',
        cell: ({ row }) => (row.original.loggerId === null ? '—' : (loggerNames.get(row.original.loggerId) ?? UNLISTED_LOGGER)),
      },
      { id: 'channel', header: 'Channel', cell: ({ row }) => mono(row.original.channel) },
      { id: 'ts', meta: { phone: 'value' }, header: 'Time', cell: ({ row }) => mono(row.original.ts) },
      { id: 'value', meta: { phone: 'value' }, header: 'Value', cell: ({ row }) => mono(row.original.value) },
      { id: 'raw', header: 'As received', cell: ({ row }) => mono(row.original.raw) },
      {
        id: 'received',
        header: 'Received',
        cell: ({ row }) => (
          <Instant at={row.original.receivedAt} kind="readings" loggerZone={row.original.loggerId === null ? null : loggerZones?.get(row.original.loggerId)} />
        ),
      },
      { id: 'fix', header: 'Fix', cell: ({ row }) => <FixCell row={row.original} pending={pending} onResubmit={onResubmit} /> },
    ];
  }, [rows, loggerNames, loggerZones, selected, onSelect, pending, onResubmit]);

  return (
    <DataTable
      caption="Quarantined rows, newest first"
      columns={columns}
      data={rows}
      getRowId={(r) => String(r.id)}
      sortable={false}
      empty="Nothing in quarantine here."
    />
  );
}
