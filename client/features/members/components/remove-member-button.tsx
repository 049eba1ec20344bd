import { ConfirmButton } from '../../../components/confirm-button.tsx';
import { useRemoveMember } from '../api/remove-member.ts';
import type { Member } from '@shared/contract/members.ts';
import { removeMemberQuestion } from '../messages.ts';

/** An admin's "Remove" for one member, asked twice; the server's refusal is shown beside it. */
export function RemoveMemberButton({ slug, member, onRemoved }: { slug: string; member: Member; onRemoved?: () => void }) {
  const remove = useRemoveMember(slug, member.userId);
  return (
    <div>
      <ConfirmButton
        label="Remove"
        question={removeMemberQuestion(member.name)}
        confirmLabel={`Remove ${member.name}`}
        pending={remove.isPending}
        onConfirm={() => remove.mutate(undefined, { onSuccess: () => onRemoved?.() })}
      />
      {remove.isError && (
        <p role="alert" className="mt-1 text-sm text-alert">
          {remove.error.message}
        </p>
      )}
    </div>
  );
}
