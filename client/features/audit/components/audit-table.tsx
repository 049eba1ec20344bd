import type { ColumnDef } from '@tanstack/react-table';
import { DataTable } from '../../../components/data-table.tsx';
import { Instant } from '../../../components/clock/instant.tsx';
import type { AuditEntry } from '@shared/contract/audit.ts';
import { auditActionLabel } from './audit-action-labels.ts';

function Details({ details }: { details: AuditEntry['details'] }) {
  const pairs = Object.entries(details ?? {});
  if (pairs.length === 0) return null;
  return (
    <details className="mt-1 text-xs text-ink-soft">
      <summary className="cursor-pointer">Details</summary>
      <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-3 font-mono">
        {pairs.map(([key, value]) => (
          <div key={key} className="contents">
            <dt>{key}</dt>
            <dd className="break-all">{typeof value === 'string' ? value : JSON.stringify(value)}</dd>
          </div>
        ))}
      </dl>
    </details>
  );
}

const COLUMNS: ColumnDef<AuditEntry>[] = [
  { id: 'at', header: 'When', cell: ({ row }) => <Instant at={row.original.at} kind="account" /> },
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
    header: 'What happened',
    cell: ({ row }) => (
      <>
        {row.original.summary}
        <Details details={row.original.details} />
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
