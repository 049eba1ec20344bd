import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import { JoinInvitation } from './join-invitation.tsx';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const GET = 'GET /api/v1/invitations/fernhollow/tok123';
const ACCEPT = 'POST /api/v1/invitations/fernhollow/tok123/accept';
const preview = (matchesSignedInUser: boolean) => ({
  status: 200,
  body: {
    invitation: {
      lab: { slug: 'fernhollow', name: 'Fernhollow Field Station' },
      role: 'technician',
      email: 'rowan.achterberg@saltmarsh-survey.example',
      invitedBy: { name: 'Odalys Brennick' },
      expiresAt: '2026-02-01T12:00:00Z',
    },
    matchesSignedInUser,
  },
});

function renderJoin(handlers: Parameters<typeof fakeApi>[0], signedInEmail = 'rowan.achterberg@saltmarsh-survey.example') {
  const api = fakeApi(handlers);
  const onAccepted = vi.fn();
  const onSwitchAccount = vi.fn();
  renderWithProviders(
    <JoinInvitation slug="fernhollow" token="tok123" signedInEmail={signedInEmail} onAccepted={onAccepted} onSwitchAccount={onSwitchAccount} />,
  );
  return { api, onAccepted, onSwitchAccount };
}

describe('JoinInvitation', () => {
  it('shows the lab, role and inviter, and accepts', async () => {
    const { api, onAccepted } = renderJoin({
      [GET]: () => preview(true),
      [ACCEPT]: () => ({ status: 200, body: { lab: { slug: 'fernhollow', name: 'Fernhollow Field Station' }, role: 'technician' } }),
    });
    expect((await screen.findByRole('heading')).textContent).toBe('Join Fernhollow Field Station');
    expect(screen.getByText('Technician')).toBeTruthy();
    expect(screen.getByText('Odalys Brennick')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Accept and join Fernhollow Field Station' }));
    await vi.waitFor(() => expect(onAccepted).toHaveBeenCalledTimes(1));
    expect(onAccepted.mock.calls[0][0]).toEqual({ lab: { slug: 'fernhollow', name: 'Fernhollow Field Station' }, role: 'technician' });
    expect(api.requests.map((r) => `${r.method} ${r.path}`)).toEqual([GET, ACCEPT]);
  });

  it('offers to switch account instead of Accept when signed in as someone else', async () => {
    const { onSwitchAccount } = renderJoin({ [GET]: () => preview(false) }, 'odalys.brennick@fernhollow.example');
    const button = await screen.findByRole('button', { name: 'Sign out and use rowan.achterberg@saltmarsh-survey.example' });
    expect(screen.queryByRole('button', { name: /Accept/ })).toBeNull();
    expect(screen.getByRole('alert').textContent).toContain('you are signed in as odalys.brennick@fernhollow.example');
    fireEvent.click(button);
    expect(onSwitchAccount).toHaveBeenCalledWith('rowan.achterberg@saltmarsh-survey.example');
  });

  it('turns a wrong-account refusal at accept time into the same offer', async () => {
    renderJoin({
      [GET]: () => preview(true),
      // Message as written by server/services/invitations.service.ts.
      [ACCEPT]: () =>
        apiError(403, 'invitation_wrong_account', 'This invitation is for rowan.achterberg@saltmarsh-survey.example. Sign in with that address to accept it.'),
    });
    fireEvent.click(await screen.findByRole('button', { name: /Accept/ }));
    expect(await screen.findByRole('button', { name: 'Sign out and use rowan.achterberg@saltmarsh-survey.example' })).toBeTruthy();
  });

  it.each([
    [410, 'invitation_expired', 'This invitation has expired. Ask the lab admin to send it again.', 'This invitation has expired'],
    [410, 'invitation_used', 'This invitation has already been used.', 'This invitation has already been used'],
    [410, 'invitation_revoked', 'This invitation was withdrawn by the lab admin.', 'This invitation was withdrawn'],
    [404, 'invitation_not_found', 'This invitation link is not valid. Ask the lab admin for a new one.', 'This invitation link does not work'],
  ])('explains a dead link (%s %s) and offers no Accept', async (status, code, message, title) => {
    renderJoin({ [GET]: () => apiError(status, code, message) });
    const alert = await screen.findByRole('alert');
    expect(screen.getByRole('heading').textContent).toBe(title);
    expect(alert.textContent).toContain(message);
    expect(screen.queryByRole('button', { name: /Accept/ })).toBeNull();
  });

  it('sends an existing member to the lab', async () => {
    renderJoin({ [GET]: () => preview(true), [ACCEPT]: () => apiError(409, 'already_member', 'You are already a member of this lab.') });
    fireEvent.click(await screen.findByRole('button', { name: /Accept/ }));
    expect((await screen.findByRole('link', { name: 'Open the lab' })).getAttribute('href')).toBe('/labs/fernhollow');
  });
});
