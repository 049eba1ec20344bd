import { useNavigate } from 'react-router-dom';
import { useMembers } from '../../features/members/api/get-members.ts';
import { MembersTable } from '../../features/members/components/members-table.tsx';
import { LeaveLabButton } from '../../features/members/components/leave-lab-button.tsx';
import { useInvitations } from '../../features/invitations/api/get-invitations.ts';
import { InviteForm } from '../../features/invitations/components/invite-form.tsx';
import { PendingInvitationsTable } from '../../features/invitations/components/pending-invitations-table.tsx';
import { MissingPermission } from '../../features/labs/components/lab-not-found.tsx';
import { LoadingNote, Notice } from '../../components/notice.tsx';
import { paths } from '../paths.ts';
import { useLabContext, useRefreshMembership } from './lab-context.ts';

function MemberList({ slug, currentUserId, canManage, onChanged }: { slug: string; currentUserId: number; canManage: boolean; onChanged: () => void }) {
  const members = useMembers(slug);
  if (members.isPending) return <LoadingNote what="Loading members…" />;
  if (members.isError) return <Notice tone="alert">{members.error.message}</Notice>;
  return <MembersTable slug={slug} members={members.data.members} currentUserId={currentUserId} canManage={canManage} onChanged={onChanged} />;
}

function PendingInvitations({ slug }: { slug: string }) {
  const invitations = useInvitations(slug);
  if (invitations.isPending) return <LoadingNote what="Loading invitations…" />;
  if (invitations.isError) return <Notice tone="alert">{invitations.error.message}</Notice>;
  return <PendingInvitationsTable slug={slug} invitations={invitations.data.invitations} />;
}

/**
 * `/labs/:lab/members`: the member table (with role changes and removal for admins), the
 * invite form and pending invitations (admins), and "Leave this lab" (everyone).
 */
export default function LabMembersRoute() {
  const { me, detail } = useLabContext();
  const slug = detail.lab.slug;
  const refresh = useRefreshMembership(slug);
  const navigate = useNavigate();
  const can = (p: (typeof detail.permissions)[number]) => detail.permissions.includes(p);

  return (
    <div className="grid gap-10">
      <section aria-labelledby="members-heading">
        <h2 id="members-heading" className="mb-3 text-xl font-semibold">
          Members
        </h2>
        {can('members.read') ? (
          <MemberList slug={slug} currentUserId={me.user.id} canManage={can('members.manage')} onChanged={refresh} />
        ) : (
          <MissingPermission what="the member list" />
        )}
      </section>

      {can('invitations.manage') && (
        <section aria-labelledby="invite-heading" className="grid gap-4">
          <h2 id="invite-heading" className="text-xl font-semibold">
            Invite someone
          </h2>
          <p className="-mt-2 text-sm text-ink-soft">They receive an e-mail with a link that works once, for 7 days, for that address only.</p>
          <InviteForm slug={slug} />
          <h3 className="mt-4 text-lg font-semibold">Pending invitations</h3>
          <PendingInvitations slug={slug} />
        </section>
      )}

      <section aria-labelledby="leave-heading" className="border-t border-rule pt-6">
        <h2 id="leave-heading" className="mb-3 text-lg font-semibold">
          Your membership
        </h2>
        <LeaveLabButton
          slug={slug}
          labName={detail.lab.name}
          onLeft={() => {
            refresh();
            navigate(paths.home.href());
          }}
        />
      </section>
    </div>
  );
}
