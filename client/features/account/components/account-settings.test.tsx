import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import type { ClockChoice, Me } from '@shared/contract/me.ts';
import { browserTimeZone } from '../../../components/clock/policy.ts';
import { AccountSettings } from './account-settings.tsx';

afterEach(cleanup);

// A person invented for the test; the JSON shape is the API contract (me.presenter.ts).
const me = (timeZone: string | null, clock: ClockChoice = 'logger'): Me => ({
  user: { id: 7, email: 'maren.olowe@fernhollow.example', name: 'Maren Olowe', timeZone, clock },
  labs: [],
});
const patches = (api: ReturnType<typeof fakeApi>) => api.requests.filter((r) => r.method === 'PATCH').map((r) => r.body);
const echo = (req: { body: unknown }) => {
  const b = req.body as { timeZone: string | null; clock: ClockChoice };
  return { status: 200, body: me(b.timeZone, b.clock) };
};

describe('account settings', () => {
  it('shows the saved zone and clock, sends the chosen ones, and "Not set" as null', async () => {
    const api = fakeApi({ 'PATCH /api/v1/me': echo });
    renderWithProviders(<AccountSettings me={me('Europe/Berlin')} />);
    const select = screen.getByLabelText('Your time zone') as HTMLSelectElement;
    expect(select.value).toBe('Europe/Berlin');
    expect((screen.getByRole('radio', { name: /The logger's clock/ }) as HTMLInputElement).checked).toBe(true);
    expect(screen.getByRole('radio', { name: /My clock \(Europe\/Berlin\)/ })).toBeTruthy();
    expect(screen.getByText('maren.olowe@fernhollow.example')).toBeTruthy();
    fireEvent.change(select, { target: { value: 'Asia/Tokyo' } });
    // the "my clock" choice names the zone it will use
    expect(screen.getByRole('radio', { name: /My clock \(Asia\/Tokyo\)/ })).toBeTruthy();
    fireEvent.click(screen.getByRole('radio', { name: /^UTC/ }));
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText('Saved.')).toBeTruthy();
    fireEvent.change(select, { target: { value: '' } });
    fireEvent.click(screen.getByRole('radio', { name: /The logger's clock/ }));
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(patches(api)).toHaveLength(2));
    expect(patches(api)).toEqual([
      { timeZone: 'Asia/Tokyo', clock: 'utc' },
      { timeZone: null, clock: 'logger' },
    ]);
  });

  it('"my clock" with no zone set saves the browser’s zone, so mails use the same clock', async () => {
    const api = fakeApi({ 'PATCH /api/v1/me': echo });
    renderWithProviders(<AccountSettings me={me(null)} />);
    const guess = browserTimeZone();
    fireEvent.click(screen.getByRole('radio', { name: new RegExp(`My clock \\(${guess.replaceAll('_', ' ')}\\)`) }));
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(patches(api)).toEqual([{ timeZone: guess, clock: 'mine' }]));
  });

  it("shows the server's refusal", async () => {
    fakeApi({ 'PATCH /api/v1/me': () => apiError(400, 'validation_failed', 'Your time zone: must be a time zone such as Europe/Berlin or UTC') });
    renderWithProviders(<AccountSettings me={me(null)} />);
    expect((screen.getByLabelText('Your time zone') as HTMLSelectElement).value).toBe('');
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText('Your time zone: must be a time zone such as Europe/Berlin or UTC')).toBeTruthy();
  });
});
