import { useMemo } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import { ROLES, ROLE_LABELS } from '@shared/policies/permissions.ts';
import { DataTable } from '../../../components/data-table.tsx';
import { Instant } from '../../../components/clock/instant.tsx';
import type { PendingInvitation } from '@shared/contract/invitations.ts';
import { InvitationActions } from './invitation-actions.tsx';

function columnsFor(slug: string): ColumnDef<PendingInvitation>[] {
  return [
    { id: 'email', meta: { phone: 'title' }, header: 'E-mail', accessorFn: (i) => i.email, sortingFn: 'text' },
    {
      id: 'role',
      meta: { phone: 'status' },
      header: 'Role',
      accessorFn: (i) => ROLES.indexOf(i.role),
      sortDescFirst: false,
      cell: ({ row }) => ROLE_LABELS[row.original.role],
    },
    { id: 'invitedBy', header: 'Invited by', accessorFn: (i) => i.invitedBy?.name ?? '—', sortingFn: 'text' },
    {
      id: 'lastSentAt',
      meta: { phone: 'value' },
      header: 'Last sent',
      accessorFn: (i) => Date.parse(i.lastSentAt),
      cell: ({ row }) => <Instant at={row.original.lastSentAt} kind="account" />,
    },
    {
      id: 'expiresAt',
      header: 'Expires',
      accessorFn: (i) => Date.parse(i.expiresAt),
      cell: ({ row }) => <Instant at={row.original.expiresAt} kind="account" />,
    },
    {
      id: 'actions',
      header: 'Actions',
      enableSorting: false,
      cell: ({ row }) => <InvitationActions slug={slug} invitation={row.original} />,
    },
  ];
}

/** The lab's pending invitations, newest first, each with Resend and Revoke. */
export function PendingInvitationsTable({ slug, invitations }: { slug: string; invitations: PendingInvitation[] }) {
  const columns = useMemo(() => columnsFor(slug), [slug]);
  return (
    <DataTable
      caption="Pending invitations"
      columns={columns}
      data={invitations}
      getRowId={(i) => String(i.id)}
      initialSorting={[{ id: 'lastSentAt', desc: true }]}
      empty="No invitations are waiting for an answer."
    />
  );
}
