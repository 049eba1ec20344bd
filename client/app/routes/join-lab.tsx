import { useNavigate, useOutletContext, useParams } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import type { Me } from '@shared/contract/me.ts';
import { meQueryOptions } from '../../features/auth/api/get-me.ts';
import { signOut } from '../../features/auth/api/sign-out.ts';
import { JoinInvitation } from '../../features/invitations/components/join-invitation.tsx';
import { paths, serverSignInUrl } from '../paths.ts';

/**
 * `/join/:lab/:token`, the link in an invitation e-mail. Signed-out visitors never get here:
 * the signed-in layout sends them to sign-in and back to this address.
 */
export default function JoinLabRoute() {
  const me = useOutletContext<Me>();
  const { lab: slug = '', token = '' } = useParams();
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  return (
    <section className="mx-auto max-w-xl rounded-2xl border border-rule bg-card p-8">
      <JoinInvitation
        slug={slug}
        token={token}
        signedInEmail={me.user.email}
        onAccepted={async (accepted) => {
          await queryClient.invalidateQueries({ queryKey: meQueryOptions().queryKey });
          navigate(paths.lab.href(accepted.lab.slug), { replace: true });
        }}
        onSwitchAccount={async (invitedEmail) => {
          await signOut().catch(() => undefined);
          queryClient.clear();
          window.location.assign(serverSignInUrl(paths.joinLab.href(slug, token), invitedEmail));
        }}
      />
    </section>
  );
}
