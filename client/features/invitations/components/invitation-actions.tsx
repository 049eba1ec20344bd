import { Button } from '../../../components/button.tsx';
import { ConfirmButton } from '../../../components/confirm-button.tsx';
import { useResendInvitation } from '../api/resend-invitation.ts';
import { useRevokeInvitation } from '../api/revoke-invitation.ts';
import type { PendingInvitation } from '@shared/contract/invitations.ts';
import { revokeInvitationQuestion } from '../messages.ts';

/** Resend and Revoke (asked twice) for one pending invitation, with the outcome beside them. */
export function InvitationActions({ slug, invitation }: { slug: string; invitation: PendingInvitation }) {
  const resend = useResendInvitation(slug, invitation.id);
  const revoke = useRevokeInvitation(slug, invitation.id);
  const error = resend.error ?? revoke.error;
  return (
    <div>
      <div className="flex flex-wrap items-center gap-2">
        <Button
          size="sm"
          disabled={resend.isPending}
          onClick={() => {
            revoke.reset();
            resend.mutate();
          }}
          aria-label={`Resend the invitation to ${invitation.email}`}
        >
          {resend.isPending ? 'Sending…' : 'Resend'}
        </Button>
        <ConfirmButton
          label="Revoke"
          question={revokeInvitationQuestion(invitation.email)}
          confirmLabel="Revoke invitation"
          pending={revoke.isPending}
          onConfirm={() => {
            resend.reset();
            revoke.mutate();
          }}
        />
      </div>
      {resend.isSuccess && (
        <p role="status" className="mt-1 text-sm text-lichen-dark">
          Sent again with a new link; the previous link no longer works.
        </p>
      )}
      {error && (
        <p role="alert" className="mt-1 text-sm text-alert">
          {error.message}
        </p>
      )}
    </div>
  );
}
