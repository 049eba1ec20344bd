import { Link } from 'react-router-dom';
import { ROLE_LABELS } from '@shared/policies/permissions.ts';
import { paths } from '../../../app/paths.ts';
import { Button, buttonClasses } from '../../../components/button.tsx';
import { Instant } from '../../../components/clock/instant.tsx';
import { LoadingNote, Notice } from '../../../components/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import type { AcceptedInvitation } from '@shared/contract/invitations.ts';
import { useAcceptInvitation } from '../api/accept-invitation.ts';
import { useInvitationByToken } from '../api/get-invitation-by-token.ts';
import { invitationProblem } from '../messages.ts';

function Problem({ error, slug }: { error: Error; slug: string }) {
  const code = error instanceof ApiError ? error.code : 'unknown';
  const problem = invitationProblem(code);
  return (
    <div role="alert">
      <h1 className="text-2xl font-semibold">{problem.title}</h1>
      <p className="mt-2">{error.message}</p>
      <p className="mt-2 text-ink-soft">{problem.advice}</p>
      {code === 'already_member' ? (
        <Link to={paths.lab.href(slug)} className={`mt-5 ${buttonClasses('primary')}`}>
          Open the lab
        </Link>
      ) : (
        <Link to={paths.home.href()} className={`mt-5 ${buttonClasses('secondary')}`}>
          Back to Lagbook
        </Link>
      )}
    </div>
  );
}

function WrongAccount({
  invitedEmail,
  signedInEmail,
  onSwitchAccount,
}: {
  invitedEmail: string;
  signedInEmail: string;
  onSwitchAccount: (invitedEmail: string) => void;
}) {
  return (
    <div className="mt-6">
      <Notice tone="alert">
        This invitation was sent to <strong>{invitedEmail}</strong>, but you are signed in as <strong>{signedInEmail}</strong> (or that address is not verified
        by your identity provider). Only the invited address can accept it.
      </Notice>
      <Button tone="primary" className="mt-4" onClick={() => onSwitchAccount(invitedEmail)}>
        Sign out and use {invitedEmail}
      </Button>
    </div>
  );
}

/**
 * The page an invitation link opens: which lab, which role, who invited you, until when,
 * and an Accept button. A dead link (unknown, expired, used, revoked) says so and what to
 * do; signed in as someone else, it offers to sign out and come back as the invited address.
 */
export function JoinInvitation({
  slug,
  token,
  signedInEmail,
  onAccepted,
  onSwitchAccount,
}: {
  slug: string;
  token: string;
  signedInEmail: string;
  onAccepted: (accepted: AcceptedInvitation) => void;
  onSwitchAccount: (invitedEmail: string) => void;
}) {
  const preview = useInvitationByToken(slug, token);
  const accept = useAcceptInvitation(slug, token);

  if (preview.isPending) return <LoadingNote what="Opening the invitation…" />;
  if (preview.isError) return <Problem error={preview.error} slug={slug} />;

  const { invitation, matchesSignedInUser } = preview.data;
  const acceptError = accept.error instanceof ApiError ? accept.error : null;
  const wrongAccount = !matchesSignedInUser || acceptError?.code === 'invitation_wrong_account';
  if (acceptError && acceptError.code !== 'invitation_wrong_account') return <Problem error={acceptError} slug={slug} />;

  return (
    <div>
      <p className="text-sm font-medium uppercase tracking-wide text-ink-soft">Invitation</p>
      <h1 className="mt-1 text-2xl font-semibold">Join {invitation.lab.name}</h1>
      <dl className="mt-5 grid grid-cols-[auto_1fr] gap-x-6 gap-y-2 text-sm">
        <dt className="text-ink-soft">Role</dt>
        <dd className="font-medium">{ROLE_LABELS[invitation.role]}</dd>
        <dt className="text-ink-soft">Invited by</dt>
        <dd>{invitation.invitedBy?.name ?? 'An admin of the lab'}</dd>
        <dt className="text-ink-soft">Sent to</dt>
        <dd>{invitation.email}</dd>
        <dt className="text-ink-soft">Valid until</dt>
        <dd>
          <Instant at={invitation.expiresAt} kind="account" />
        </dd>
      </dl>
      {wrongAccount ? (
        <WrongAccount invitedEmail={invitation.email} signedInEmail={signedInEmail} onSwitchAccount={onSwitchAccount} />
      ) : (
        <>
          <Button tone="primary" className="mt-6" disabled={accept.isPending} onClick={() => accept.mutate(undefined, { onSuccess: onAccepted })}>
            {accept.isPending ? 'Joining…' : `Accept and join ${invitation.lab.name}`}
          </Button>
          {accept.error && !acceptError && (
            <Notice tone="alert" className="mt-4">
              {accept.error.message}
            </Notice>
          )}
        </>
      )}
    </div>
  );
}
