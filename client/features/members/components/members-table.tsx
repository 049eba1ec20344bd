import { useMemo } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import { ROLES, ROLE_LABELS } from '../../../../server/policies/permissions.ts';
import { DataTable } from '../../../components/data-table.tsx';
import { Instant } from '../../../components/clock/instant.tsx';
import type { Member } from '@shared/contract/members.ts';
import { MemberRoleControl } from './member-role-control.tsx';
import { RemoveMemberButton } from './remove-member-button.tsx';

/**
 * The lab's members, sortable by name, e-mail, role (in order of reach, admin first) and
 * joining date. Admins (`canManage`) get a role picker per row and a Remove button on
 * everyone but themselves (they use "Leave this lab").
 */
export function MembersTable({
  slug,
  members,
  currentUserId,
  canManage,
  onChanged,
}: {
  slug: string;
  members: Member[];
  currentUserId: number;
  canManage: boolean;
  onChanged?: () => void;
}) {
  const columns = useMemo<ColumnDef<Member>[]>(() => {
    const base: ColumnDef<Member>[] = [
      {
        id: 'name',
        meta: { phone: 'title' },
        header: 'Name',
        accessorFn: (m) => m.name,
        sortingFn: 'text',
        cell: ({ row }) => (
          <span className="font-medium">
            {row.original.name}
            {row.original.userId === currentUserId && <span className="ml-2 text-xs font-normal text-ink-soft">(you)</span>}
          </span>
        ),
      },
      { id: 'email', header: 'E-mail', accessorFn: (m) => m.email, sortingFn: 'text' },
      {
        id: 'role',
        meta: { phone: 'status' },
        header: 'Role',
        accessorFn: (m) => ROLES.indexOf(m.role),
        sortDescFirst: false,
        cell: ({ row }) => (canManage ? <MemberRoleControl slug={slug} member={row.original} onChanged={onChanged} /> : ROLE_LABELS[row.original.role]),
      },
      {
        id: 'joined',
        header: 'Joined',
        accessorFn: (m) => Date.parse(m.joinedAt),
        cell: ({ row }) => <Instant at={row.original.joinedAt} kind="account" part="date" />,
      },
    ];
    if (!canManage) return base;
    return [
      ...base,
      {
        id: 'actions',
        header: 'Actions',
        enableSorting: false,
        cell: ({ row }) => (row.original.userId === currentUserId ? null : <RemoveMemberButton slug={slug} member={row.original} onRemoved={onChanged} />),
      },
    ];
  }, [slug, currentUserId, canManage, onChanged]);

  return (
    <DataTable
      caption="Members of the lab"
      columns={columns}
      data={members}
      getRowId={(m) => String(m.userId)}
      initialSorting={[{ id: 'name', desc: false }]}
      empty="No members."
    />
  );
}
