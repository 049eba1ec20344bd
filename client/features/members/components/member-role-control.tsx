import { useState } from 'react';
import { changeRoleSchema, type Member } from '@shared/contract/members.ts';
import { ROLES, ROLE_LABELS, type Role } from '@shared/policies/permissions.ts';
import { Button } from '../../../components/button.tsx';
import { useChangeMemberRole } from '../api/change-member-role.ts';

/**
 * An admin's role picker for one member. Choosing a role only stages it; "Save role" sends
 * it, so moving through the list with the keyboard never changes anyone's role by accident.
 * The server's refusal (e.g. the lab's last admin) is shown right under the picker.
 */
export function MemberRoleControl({ slug, member, onChanged }: { slug: string; member: Member; onChanged?: () => void }) {
  // A staged choice, until it is saved or undone; otherwise the picker shows the member's role.
  const [staged, setStaged] = useState<Role | null>(null);
  const change = useChangeMemberRole(slug, member.userId);
  const choice = staged ?? member.role;

  function save() {
    const parsed = changeRoleSchema.safeParse({ role: choice });
    if (!parsed.success) return;
    change.mutate(parsed.data, {
      onSuccess: () => {
        setStaged(null);
        onChanged?.();
      },
    });
  }

  return (
    <div>
      <div className="flex flex-wrap items-center gap-2">
        <select
          aria-label={`Role of ${member.name}`}
          value={choice}
          onChange={(e) => {
            change.reset();
            const next = e.target.value as Role;
            setStaged(next === member.role ? null : next);
          }}
          className="rounded-lg border border-rule bg-card px-2 py-1"
        >
          {ROLES.map((role) => (
            <option key={role} value={role}>
              {ROLE_LABELS[role]}
            </option>
          ))}
        </select>
        {staged !== null && (
          <>
            <Button tone="primary" size="sm" onClick={save} disabled={change.isPending}>
              {change.isPending ? 'Saving…' : 'Save role'}
            </Button>
            <Button
              tone="quiet"
              size="sm"
              onClick={() => {
                change.reset();
                setStaged(null);
              }}
            >
              Undo
            </Button>
          </>
        )}
      </div>
      {change.isError && (
        <p role="alert" className="mt-1 text-sm text-alert">
          {change.error.message}
        </p>
      )}
    </div>
  );
}
