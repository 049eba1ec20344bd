import { useMemo } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import { ConfirmAction } from '../../../components/confirm-action.tsx';
import { DataTable } from '../../../components/data-table.tsx';
import { Instant } from '../../../components/clock/instant.tsx';
import type { PersonalToken } from '@shared/contract/tokens.ts';
import { useRevokeToken } from '../api/revoke-token.ts';
import { revokeTokenQuestion, TOKENS_MESSAGES } from '../messages.ts';

/** A token as people recognise it: the public part of `lbt_<prefix>_<secret>`, secret elided. */
const shownToken = (prefix: string) => `lbt_${prefix}_…`;

/** Where a token stands now: revoked, expired or usable. */
export function tokenState(t: PersonalToken, now = Date.now()): 'revoked' | 'expired' | 'active' {
  if (t.revokedAt) return 'revoked';
  return Date.parse(t.expiresAt) <= now ? 'expired' : 'active';
}

function RevokeTokenButton({ slug, token }: { slug: string; token: PersonalToken }) {
  const revoke = useRevokeToken(slug, token.id);
  return (
    <ConfirmAction
      label="Revoke"
      question={revokeTokenQuestion(token.name)}
      confirmLabel={`Revoke ${shownToken(token.prefix)}`}
      pending={revoke.isPending}
      onConfirm={() => revoke.mutate()}
      error={revoke.error}
    />
  );
}

/** The member's personal tokens: name, prefix, made, expires, last used, state, and "Revoke" for usable ones. */
export function TokensTable({ slug, tokens }: { slug: string; tokens: PersonalToken[] }) {
  const columns = useMemo<ColumnDef<PersonalToken>[]>(
    () => [
      { id: 'name', meta: { phone: 'title' }, header: 'Name', accessorFn: (t) => t.name, sortingFn: 'text' },
      {
        id: 'prefix',
        header: 'Token',
        accessorFn: (t) => t.prefix,
        enableSorting: false,
        cell: ({ row }) => <span className="font-mono">{shownToken(row.original.prefix)}</span>,
      },
      { id: 'created', header: 'Made', accessorFn: (t) => Date.parse(t.createdAt), cell: ({ row }) => <Instant at={row.original.createdAt} kind="account" /> },
      {
        id: 'expires',
        header: 'Expires',
        accessorFn: (t) => Date.parse(t.expiresAt),
        cell: ({ row }) => <Instant at={row.original.expiresAt} kind="account" part="date" />,
      },
      {
        id: 'lastUsed',
        meta: { phone: 'value' },
        header: 'Last used',
        accessorFn: (t) => (t.lastUsedAt ? Date.parse(t.lastUsedAt) : -1),
        cell: ({ row }) => <Instant at={row.original.lastUsedAt} kind="account" relative />,
      },
      {
        id: 'state',
        meta: { phone: 'status' },
        header: 'State',
        accessorFn: (t) => tokenState(t),
        cell: ({ row }) => {
          const state = tokenState(row.original);
          if (state === 'revoked')
            return (
              <span>
                revoked <Instant at={row.original.revokedAt!} kind="account" part="date" />
              </span>
            );
          return <span className={state === 'active' ? 'text-lichen-dark' : 'text-ink-soft'}>{state}</span>;
        },
      },
      {
        id: 'actions',
        header: 'Actions',
        enableSorting: false,
        cell: ({ row }) => (tokenState(row.original) === 'active' ? <RevokeTokenButton slug={slug} token={row.original} /> : null),
      },
    ],
    [slug],
  );
  return (
    <DataTable
      caption="Your personal API tokens in this lab"
      columns={columns}
      data={tokens}
      getRowId={(t) => String(t.id)}
      initialSorting={[{ id: 'created', desc: true }]}
      empty={TOKENS_MESSAGES.none}
    />
  );
}
