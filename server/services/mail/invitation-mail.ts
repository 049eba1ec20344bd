import type { OutgoingMail } from '../../integrations/mail/create-mailer.ts';
import { ROLE_LABELS, type Role } from '../../policies/permissions.ts';

/** Escapes text for HTML mail bodies. */
function esc(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** The invitation e-mail: who invites, to which lab, as what, the link and its expiry. */
export function invitationMail(input: { to: string; labName: string; role: Role; inviterName: string; link: string; expiresAt: Date }): OutgoingMail {
  const role = ROLE_LABELS[input.role];
  const until = input.expiresAt.toISOString().slice(0, 16).replace('T', ' ') + ' UTC';
  const text = [
    `${input.inviterName} invites you to join ${input.labName} on Lagbook as ${role}.`,
    '',
    `Accept the invitation: ${input.link}`,
    '',
    `The link works once and until ${until}. Sign in with this address (${input.to}) to accept.`,
    'If you did not expect this invitation, you can ignore this message.',
  ].join('\n');
  const html = `<p>${esc(input.inviterName)} invites you to join <strong>${esc(input.labName)}</strong> on Lagbook as <strong>${esc(role)}</strong>.</p>
<p><a href="${esc(input.link)}">Accept the invitation</a></p>
<p>The link works once and until ${esc(until)}. Sign in with this address (${esc(input.to)}) to accept.<br>If you did not expect this invitation, you can ignore this message.</p>`;
  return { to: input.to, subject: `Join ${input.labName} on Lagbook`, text, html };
}
