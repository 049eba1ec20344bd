import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import type { Me } from '@shared/contract/me.ts';
import { AccountSettings } from './account-settings.tsx';

afterEach(cleanup);

// A person invented for the test; the JSON shape is the API contract (me.presenter.ts).
const me = (timeZone: string | null): Me => ({ user: { id: 7, email: 'maren.olowe@fernhollow.example', name: 'Maren Olowe', timeZone }, labs: [] });

describe('account settings', () => {
  it('shows the saved zone, sends the chosen one, and "Not set" as null', async () => {
    const api = fakeApi({ 'PATCH /api/v1/me': (req) => ({ status: 200, body: me((req.body as { timeZone: string | null }).timeZone) }) });
    renderWithProviders(<AccountSettings me={me('Europe/Berlin')} />);
    const select = screen.getByLabelText('Your time zone') as HTMLSelectElement;
    expect(select.value).toBe('Europe/Berlin');
    expect(screen.getByText('maren.olowe@fernhollow.example')).toBeTruthy();
    fireEvent.change(select, { target: { value: 'Asia/Tokyo' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText('Saved.')).toBeTruthy();
    fireEvent.change(select, { target: { value: '' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(api.requests.filter((r) => r.method === 'PATCH')).toHaveLength(2));
    expect(api.requests.filter((r) => r.method === 'PATCH').map((r) => r.body)).toEqual([{ timeZone: 'Asia/Tokyo' }, { timeZone: null }]);
  });

  it("shows the server's refusal", async () => {
    fakeApi({ 'PATCH /api/v1/me': () => apiError(400, 'validation_failed', 'timeZone: must be an IANA time zone such as Europe/Berlin or UTC') });
    renderWithProviders(<AccountSettings me={me(null)} />);
    expect((screen.getByLabelText('Your time zone') as HTMLSelectElement).value).toBe('');
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText('timeZone: must be an IANA time zone such as Europe/Berlin or UTC')).toBeTruthy();
  });
});
