import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import { InviteForm } from './invite-form.tsx';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const POST = 'POST /api/v1/labs/fernhollow/invitations';
const email = () => screen.getByLabelText('E-mail address') as HTMLInputElement;

describe('InviteForm', () => {
  it('validates with inviteMemberSchema before sending anything', async () => {
    const api = fakeApi({});
    renderWithProviders(<InviteForm slug="fernhollow" />);
    fireEvent.change(email(), { target: { value: 'not-an-address' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send invitation' }));
    // Message from inviteMemberSchema (server/contract/invitations.ts).
    expect(await screen.findByText('must be a valid e-mail address')).toBeTruthy();
    expect(email().getAttribute('aria-invalid')).toBe('true');
    expect(api.requests).toHaveLength(0);
  });

  it('sends the normalised address and the chosen role, confirms, and clears the field', async () => {
    const api = fakeApi({
      [POST]: () => ({ status: 201, body: { invitation: {} } }),
      'GET /api/v1/labs/fernhollow/invitations': () => ({ status: 200, body: { invitations: [] } }),
    });
    renderWithProviders(<InviteForm slug="fernhollow" />);
    fireEvent.change(email(), { target: { value: '  Rowan.Achterberg@Saltmarsh-Survey.example ' } });
    fireEvent.change(screen.getByLabelText('Role'), { target: { value: 'technician' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send invitation' }));
    expect((await screen.findByRole('status')).textContent).toContain('Invitation sent to rowan.achterberg@saltmarsh-survey.example');
    // The schema trims and lower-cases the address (its .trim().toLowerCase()).
    expect(api.requests[0]).toEqual({
      method: 'POST',
      path: '/api/v1/labs/fernhollow/invitations',
      body: { email: 'rowan.achterberg@saltmarsh-survey.example', role: 'technician' },
    });
    await waitFor(() => expect(email().value).toBe(''));
  });

  it('shows a pending invitation conflict on the e-mail field', async () => {
    fakeApi({ [POST]: () => apiError(409, 'invitation_pending', 'email: an invitation to this address is already pending') });
    renderWithProviders(<InviteForm slug="fernhollow" />);
    fireEvent.change(email(), { target: { value: 'maren.olowe@fernhollow.example' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send invitation' }));
    const message = await screen.findByText('an invitation to this address is already pending');
    expect(email().getAttribute('aria-describedby')).toBe(message.id);
  });
});
