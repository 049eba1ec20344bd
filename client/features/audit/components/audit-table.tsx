import type { ColumnDef } from '@tanstack/react-table';
import { DataTable } from '../../../components/data-table.tsx';
import { Instant } from '../../../components/clock/instant.tsx';
import type { AuditEntry } from '@shared/contract/audit.ts';
import { auditActionLabel } from './audit-action-labels.ts';

/**
 * The entry as it was recorded, on demand: the raw action name, the summary written at the time
 * (older entries may name the payment service's events) and the recorded details as JSON.
 */
function RecordedEvent({ entry }: { entry: AuditEntry }) {
  return (
    <details className="mt-1 text-xs text-ink-soft">
      <summary className="cursor-pointer py-1">Show the recorded event</summary>
      <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-3">
        <dt>Action</dt>
        <dd className="break-all font-mono">{entry.action}</dd>
        <dt>Recorded as</dt>
        <dd className="break-words">{entry.summary}</dd>
        {entry.details && Object.keys(entry.details).length > 0 ? (
          <>
            <dt>Details</dt>
            <dd>
              <pre className="whitespace-pre-wrap break-all font-mono">{JSON.stringify(entry.details, null, 2)}</pre>
            </dd>
          </>
        ) : null}
      </dl>
    </details>
  );
}

const COLUMNS: ColumnDef<AuditEntry>[] = [
  { id: 'at', meta: { phone: 'value' }, header: 'When', cell: ({ row }) => <Instant at={row.original.at} kind="account" /> },
  {
    id: 'actor',
    header: 'Done by',
    cell: ({ row }) =>
      row.original.actor ? (
        <span>
          {row.original.actor.name}
          <span className="block text-xs text-ink-soft">{row.original.actor.email}</span>
        </span>
      ) : (
        <span className="text-ink-soft">Lagbook</span>
      ),
  },
  {
    id: 'action',
    header: 'Action',
    cell: ({ row }) => (
      <span className="whitespace-nowrap rounded-full border border-amber/60 bg-amber/10 px-2 py-0.5 text-xs font-medium">
        {auditActionLabel(row.original.action)}
      </span>
    ),
  },
  {
    id: 'summary',
    meta: { phone: 'title' },
    header: 'What happened',
    cell: ({ row }) => (
      <>
        {row.original.sentence}
        <RecordedEvent entry={row.original} />
      </>
    ),
  },
];

/** One page of audit entries in the server's order (newest first). */
export function AuditTable({ entries }: { entries: AuditEntry[] }) {
  return (
    <DataTable
      caption="Audit log entries, newest first"
      columns={COLUMNS}
      data={entries}
      getRowId={(e) => String(e.id)}
      sortable={false}
      empty="No entries match these filters."
    />
  );
}
