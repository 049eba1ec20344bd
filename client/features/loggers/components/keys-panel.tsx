import { useMemo, useState } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import { Button } from '../../../components/button.tsx';
import { ConfirmAction } from '../../../components/confirm-action.tsx';
import { ConfirmButton } from '../../../components/confirm-button.tsx';
import { DataTable } from '../../../components/data-table.tsx';
import { Instant } from '../../../components/clock/instant.tsx';
import type { IngestKeyInfo, IssuedKey } from '@shared/contract/loggers.ts';
import { useIssueKey } from '../api/issue-key.ts';
import { useRevokeKey } from '../api/revoke-key.ts';
import type { ExampleChannel } from './ingest-example.ts';
import { IssuedKeyPanel } from './issued-key-panel.tsx';

/** A key as people recognise it on the logger: the public part of `lbk_<prefix>_<secret>`, secret elided. */
const shownKey = (prefix: string) => `lbk_${prefix}_…`;

function RevokeKeyButton({ slug, loggerId, keyInfo }: { slug: string; loggerId: number; keyInfo: IngestKeyInfo }) {
  const revoke = useRevokeKey(slug, loggerId, keyInfo.id);
  return (
    <ConfirmAction
      label="Revoke"
      question={`Revoke ${shownKey(keyInfo.prefix)}? A logger using it is refused from now on.`}
      confirmLabel={`Revoke lbk_${keyInfo.prefix}`}
      pending={revoke.isPending}
      onConfirm={() => revoke.mutate()}
      error={revoke.error}
    />
  );
}

/**
 * A logger's ingest keys (prefix, issued, last used, revoked), with "Issue a new key",
 * "Rotate keys" (a new key, and every other key stops at once — asked first) and "Revoke" per
 * active key. A new key is shown once, with the example command, above the table.
 */
export function KeysPanel({
  slug,
  loggerId,
  keys,
  exampleChannel,
}: {
  slug: string;
  loggerId: number;
  keys: IngestKeyInfo[];
  exampleChannel?: ExampleChannel;
}) {
  const issue = useIssueKey(slug, loggerId);
  const [issued, setIssued] = useState<IssuedKey | null>(null);
  const columns = useMemo<ColumnDef<IngestKeyInfo>[]>(
    () => [
      {
        id: 'prefix',
        meta: { phone: 'title' },
        header: 'Key',
        accessorFn: (k) => k.prefix,
        sortingFn: 'text',
        cell: ({ row }) => <span className="font-mono">{shownKey(row.original.prefix)}</span>,
      },
      {
        id: 'created',
        header: 'Issued',
        accessorFn: (k) => Date.parse(k.createdAt),
        cell: ({ row }) => <Instant at={row.original.createdAt} kind="account" />,
      },
      {
        id: 'lastUsed',
        meta: { phone: 'value' },
        header: 'Last used',
        accessorFn: (k) => (k.lastUsedAt ? Date.parse(k.lastUsedAt) : -1),
        cell: ({ row }) => <Instant at={row.original.lastUsedAt} kind="account" relative />,
      },
      {
        id: 'revoked',
        meta: { phone: 'status' },
        header: 'Revoked',
        accessorFn: (k) => (k.revokedAt ? Date.parse(k.revokedAt) : 0),
        cell: ({ row }) => (row.original.revokedAt ? <Instant at={row.original.revokedAt} kind="account" /> : <span className="text-lichen-dark">active</span>),
      },
      {
        id: 'actions',
        header: 'Actions',
        enableSorting: false,
        cell: ({ row }) => (row.original.revokedAt ? null : <RevokeKeyButton slug={slug} loggerId={loggerId} keyInfo={row.original} />),
      },
    ],
    [slug, loggerId],
  );
  const run = (rotate: boolean) => issue.mutate(rotate, { onSuccess: (r) => setIssued(r.ingestKey) });

  return (
    <div className="grid gap-4">
      {issued && (
        <IssuedKeyPanel issued={issued} channel={exampleChannel} heading="New ingest key">
          <div>
            <Button size="sm" onClick={() => setIssued(null)}>
              I have stored it — hide the key
            </Button>
          </div>
        </IssuedKeyPanel>
      )}
      <div className="flex flex-wrap items-center gap-3">
        <Button size="sm" tone="primary" onClick={() => run(false)} disabled={issue.isPending}>
          Issue a new key
        </Button>
        <ConfirmButton
          label="Rotate keys"
          tone="danger"
          question="Issue a new key and stop every other key of this logger at once?"
          confirmLabel="Rotate now"
          pending={issue.isPending}
          onConfirm={() => run(true)}
        />
      </div>
      {issue.isError && (
        <p role="alert" className="text-sm text-alert">
          {issue.error.message}
        </p>
      )}
      <DataTable
        caption="Ingest keys of the logger"
        columns={columns}
        data={keys}
        getRowId={(k) => String(k.id)}
        initialSorting={[{ id: 'created', desc: true }]}
        empty="No keys: issue one so the logger can send readings."
      />
    </div>
  );
}
