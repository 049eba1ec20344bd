import { describe, expect, it } from 'vitest';
import { invitationMail } from './invitation-mail.ts';

describe('invitationMail', () => {
  const base = {
    to: 'new@field.example',
    labName: 'Fernhollow <Field> Station',
    role: 'technician' as const,
    inviterName: 'Odalys "O" Brennick',
    link: 'http://127.0.0.1:4310/join/fernhollow/abc?x=1&y=2',
    expiresAt: new Date('2026-12-09T10:30:00Z'),
  };

  it('names the inviter, the lab, the role, the link and its expiry in the text part', () => {
    const mail = invitationMail(base);
    expect(mail.subject).toBe('Join Fernhollow <Field> Station on Lagbook');
    expect(mail.text).toContain('Odalys "O" Brennick invites you to join Fernhollow <Field> Station on Lagbook as Technician.');
    expect(mail.text).toContain(`Accept the invitation: ${base.link}`);
    expect(mail.text).toContain('until 2026-12-09 10:30 UTC');
  });

  it('escapes everything it puts into HTML', () => {
    const html = invitationMail(base).html!;
    expect(html).toContain('Fernhollow &lt;Field&gt; Station');
    expect(html).toContain('Odalys &quot;O&quot; Brennick');
    expect(html).toContain('href="http://127.0.0.1:4310/join/fernhollow/abc?x=1&amp;y=2"');
    expect(html).not.toContain('<Field>');
  });
});
